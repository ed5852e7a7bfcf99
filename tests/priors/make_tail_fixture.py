"""High-precision quantiles of far-tail truncated normals, for tests/priors/priors.test.ts.

scipy 1.10's truncnorm.ppf is accurate only to about 1e-8 relative this far in the tails, so these
values come from mpmath at 50 significant digits. Run: python3 make_tail_fixture.py > tail_quantiles.json
(any Python with mpmath; the version is recorded in the output).
"""
import json

import mpmath as m

m.mp.dps = 50
cases = []
for a, b in [(6, 8), (-9, -7)]:
    mass = m.ncdf(b) - m.ncdf(a)
    for u in ["0.01", "0.5", "0.99"]:
        t = m.ncdf(a) + m.mpf(u) * mass
        z = m.sqrt(2) * m.erfinv(2 * t - 1)
        cases.append({"min": a, "max": b, "u": float(u), "quantile": float(z)})
print(json.dumps({"mpmath": m.__version__, "dps": 50, "cases": cases}, indent=1))
