"""Reference runs and estimates from Debian's python3-emcee, for tests/sampler/emcee.test.ts.

  emcee_reference.py run NDIM NWALKERS NSTEPS SEED [SEED ...]
      emcee's stretch move (a = 2) on the isotropic Gaussian N(0, I_ndim), walkers started with exact draws
      from the target. Prints JSON: per run, the acceptance fraction (mean over walkers) and the integrated
      autocorrelation time of each parameter from emcee.autocorr.integrated_time (c = 5).
  emcee_reference.py tau FILE NROWS NWALKERS NDIM
      emcee.autocorr.integrated_time of a chain stored as little-endian float64, shape (NROWS, NWALKERS, NDIM).
"""
import json
import sys

import numpy as np
import emcee


def log_prob(x):
    # Vectorised over walkers: x has shape (n, ndim).
    return -0.5 * np.sum(x * x, axis=1)


def run(ndim, nwalkers, nsteps, seeds):
    out = []
    for seed in seeds:
        np.random.seed(seed)
        p0 = np.random.randn(nwalkers, ndim)
        sampler = emcee.EnsembleSampler(nwalkers, ndim, log_prob, moves=emcee.moves.StretchMove(a=2.0), vectorize=True)
        sampler.run_mcmc(p0, nsteps, progress=False)
        tau = emcee.autocorr.integrated_time(sampler.get_chain(), c=5, tol=0, quiet=True)
        out.append({"acceptance": float(np.mean(sampler.acceptance_fraction)), "tau": [float(t) for t in tau]})
    return out


def tau(path, nrows, nwalkers, ndim):
    chain = np.fromfile(path, dtype="<f8").reshape(nrows, nwalkers, ndim)
    return [float(t) for t in emcee.autocorr.integrated_time(chain, c=5, tol=0, quiet=True)]


if __name__ == "__main__":
    if sys.argv[1] == "run":
        ndim, nwalkers, nsteps = (int(a) for a in sys.argv[2:5])
        print(json.dumps(run(ndim, nwalkers, nsteps, [int(s) for s in sys.argv[5:]])))
    elif sys.argv[1] == "tau":
        print(json.dumps(tau(sys.argv[2], *(int(a) for a in sys.argv[3:6]))))
    else:
        sys.exit("usage: emcee_reference.py run|tau ...")
