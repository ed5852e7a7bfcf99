/**
 * Checks against outside reference libraries (Debian's python3-astropy, python3-emcee, python3-extinction,
 * r-cran-posterior). In CI (COEVAL_REQUIRE_REFERENCES=1, set by .ci/run) a missing reference is a failure,
 * never a skip. Locally a missing reference skips its suite, with a message saying what to install.
 */
import { spawnSync } from 'node:child_process';
import { describe, it } from 'vitest';

export interface Reference {
  /** Debian package name, for the message. */
  debianPackage: string;
  /** Command and arguments that exit 0 when the reference works. */
  probe: [string, ...string[]];
}

/** Debian's Python modules load only under the system interpreter, not the first python3 on PATH. */
export const SYSTEM_PYTHON = '/usr/bin/python3';

export const REFERENCES = {
  astropy: { debianPackage: 'python3-astropy', probe: [SYSTEM_PYTHON, '-c', 'import astropy'] },
  emcee: { debianPackage: 'python3-emcee', probe: [SYSTEM_PYTHON, '-c', 'import emcee'] },
  extinction: { debianPackage: 'python3-extinction', probe: [SYSTEM_PYTHON, '-c', 'import extinction'] },
  scipy: { debianPackage: 'python3-scipy', probe: [SYSTEM_PYTHON, '-c', 'import scipy.stats'] },
  posterior: { debianPackage: 'r-cran-posterior', probe: ['Rscript', '-e', 'library(posterior)'] },
} satisfies Record<string, Reference>;

export const REFERENCES_REQUIRED = process.env.COEVAL_REQUIRE_REFERENCES === '1';

const cache = new Map<string, boolean>();
export function referenceAvailable(ref: Reference): boolean {
  const key = ref.probe.join(' ');
  let ok = cache.get(key);
  if (ok === undefined) {
    const r = spawnSync(ref.probe[0], ref.probe.slice(1), { stdio: 'ignore' });
    ok = r.status === 0;
    cache.set(key, ok);
  }
  return ok;
}

/**
 * A describe block that needs a reference library. When the library is missing: in CI, one failing test
 * names the package to install; locally, the block is skipped with a note on stderr.
 */
export function describeWithReference(name: string, ref: Reference, body: () => void): void {
  if (referenceAvailable(ref)) {
    describe(name, body);
    return;
  }
  if (REFERENCES_REQUIRED) {
    describe(name, () => {
      it(`needs ${ref.debianPackage}`, () => {
        throw new Error(`reference library missing: install Debian's ${ref.debianPackage} (apt-get install ${ref.debianPackage}); CI requires it`);
      });
    });
    return;
  }
  process.stderr.write(`[reference] skipping "${name}": ${ref.debianPackage} is not installed (CI requires it)\n`);
  describe.skipIf(true)(name, body);
}
