/**
 * The likelihood's tabulated erfc (src/likelihood/fastErfc.ts) against two outside implementations:
 * @stdlib's erfc and erfcx (the fdlibm algorithm and the Faddeeva-package method; the table is built from
 * @stdlib's erfcx, so this checks the interpolation), and SciPy's scipy.special.erfc and erfcx (Debian's
 * python3-scipy, the Cephes library), which is independent of both.
 *
 * Tolerance 1e-13 relative: the likelihood needs far less (its per-star check is 1e-3 in log L), and it is
 * what the construction promises: the interpolant's own error is near 1e-15, and exp(-x^2) adds the
 * rounding of x^2, at most x^2 * 1.1e-16 (7e-14 at x = 25). Beyond x = 26 erfc is subnormal and only
 * checked to be tiny.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import erfc from '@stdlib/math-base-special-erfc';
import erfcx from '@stdlib/math-base-special-erfcx';
import { erfcxNonNegative, fastErfc } from '../../src/likelihood/fastErfc.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../helpers/reference.js';

const REL = 1e-13;

function rel(a: number, b: number): number {
  return a === b ? 0 : Math.abs(a - b) / Math.abs(b);
}

describe('tabulated erfc against @stdlib', () => {
  it(`erfc on [-7, 26] (10^5 points, including every piece boundary) within ${REL} relative`, () => {
    let worst = 0;
    let at = 0;
    const xs: number[] = [];
    for (let i = 0; i <= 100000; i++) xs.push(-7 + (33 * i) / 100000);
    for (let p = 0; p <= 64; p++) xs.push(p / 8, -p / 8, p / 8 - 1e-12, p / 8 + 1e-12);
    for (const x of xs) {
      const r = rel(fastErfc(x), erfc(x));
      if (r > worst) {
        worst = r;
        at = x;
      }
    }
    expect(worst, `worst at x = ${at}`).toBeLessThanOrEqual(REL);
  });

  it('erfcx on [0, 40] within 1e-14 relative (the interpolant alone, no exp)', () => {
    let worst = 0;
    for (let i = 0; i <= 100000; i++) {
      const x = (40 * i) / 100000;
      worst = Math.max(worst, rel(erfcxNonNegative(x), erfcx(x)));
    }
    expect(worst).toBeLessThanOrEqual(1e-14);
  });

  it('limits and special values: erfc(0) = 1 (to 1e-15), erfc(-inf) = 2, erfc(+inf) = 0, NaN stays NaN', () => {
    expect(Math.abs(fastErfc(0) - 1)).toBeLessThanOrEqual(1e-15);
    expect(fastErfc(-Infinity)).toBe(2);
    expect(fastErfc(Infinity)).toBe(0);
    expect(fastErfc(Number.NaN)).toBeNaN();
    expect(fastErfc(27)).toBeLessThan(1e-300);
  });
});

describeWithReference('tabulated erfc against SciPy (python3-scipy)', REFERENCES.scipy, () => {
  it(`erfc and erfcx at 2,001 points on [-6, 26] within ${REL} relative`, () => {
    const xs = Array.from({ length: 2001 }, (_, i) => -6 + (32 * i) / 2000);
    const script = [
      'import json, sys',
      'from scipy.special import erfc, erfcx',
      'xs = json.load(sys.stdin)',
      'print(json.dumps([[float(erfc(x)) for x in xs], [float(erfcx(x)) for x in xs if x >= 0]]))',
    ].join('\n');
    const r = spawnSync(SYSTEM_PYTHON, ['-c', script], { input: JSON.stringify(xs), encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const [refErfc, refErfcx] = JSON.parse(r.stdout) as [number[], number[]];
    let worst = 0;
    xs.forEach((x, i) => {
      worst = Math.max(worst, rel(fastErfc(x), refErfc[i]));
    });
    expect(worst).toBeLessThanOrEqual(REL);
    const pos = xs.filter((x) => x >= 0);
    let worstX = 0;
    pos.forEach((x, i) => {
      worstX = Math.max(worstX, rel(erfcxNonNegative(x), refErfcx[i]));
    });
    expect(worstX).toBeLessThanOrEqual(REL);
  });
});
