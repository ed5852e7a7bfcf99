"""Reference values for coeval's prior densities, from scipy.stats (Debian python3-scipy).

Reads a JSON list of cases on stdin: {"kind", params..., "x": [...], "u": [...]}, and writes the
log densities at x and the quantiles at u, as JSON on stdout. Run with /usr/bin/python3.
"""
import json
import sys

import numpy as np
import scipy
from scipy import stats


def frozen(case):
    k = case["kind"]
    if k == "uniform":
        return stats.uniform(loc=case["min"], scale=case["max"] - case["min"])
    if k == "normal":
        return stats.norm(loc=case["mean"], scale=case["sd"])
    if k == "truncated_normal":
        a = (case["min"] - case["mean"]) / case["sd"]
        b = (case["max"] - case["mean"]) / case["sd"]
        return stats.truncnorm(a, b, loc=case["mean"], scale=case["sd"])
    if k == "log_uniform":
        return stats.loguniform(case["min"], case["max"])
    raise ValueError(k)


out = []
for case in json.load(sys.stdin):
    d = frozen(case)
    out.append({
        "logpdf": [float(v) for v in d.logpdf(np.array(case["x"]))],
        "ppf": [float(v) for v in d.ppf(np.array(case["u"]))],
    })
json.dump({"scipy": scipy.__version__, "results": out}, sys.stdout)
