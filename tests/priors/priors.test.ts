import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseConfigText } from '../../src/config/index.js';
import { ConfigError } from '../../src/core/errors.js';
import { ageGyrPrior, buildParameterSpace, priorFromSpec, uniformPrior, type PriorSpec } from '../../src/priors/index.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../helpers/reference.js';

type Continuous = Exclude<PriorSpec, { kind: 'fixed' }>;

const CASES: (Continuous & { x: number[]; u: number[] })[] = [
  { kind: 'uniform', min: 9.8, max: 10.2, x: [9.81, 10.0, 10.19], u: [0.01, 0.5, 0.99] },
  { kind: 'normal', mean: -1.5, sd: 0.1, x: [-1.9, -1.5, -1.2], u: [1e-6, 0.16, 0.5, 0.975] },
  // Cut near the mean, in the far upper tail, and in the far lower tail: the mass computation must not cancel.
  { kind: 'truncated_normal', mean: 0.05, sd: 0.02, min: 0, max: 0.5, x: [0.001, 0.05, 0.2], u: [0.01, 0.5, 0.99] },
  // Far tails: scipy checks the log density here; the quantiles are checked against mpmath below.
  { kind: 'truncated_normal', mean: 0, sd: 1, min: 6, max: 8, x: [6.0, 6.5, 7.9], u: [] },
  { kind: 'truncated_normal', mean: 0, sd: 1, min: -9, max: -7, x: [-8.9, -7.5, -7.01], u: [] },
  { kind: 'log_uniform', min: 0.001, max: 0.1, x: [0.002, 0.01, 0.09], u: [0.1, 0.5, 0.9] },
];

function relDiff(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);
}

describeWithReference('priors against scipy.stats', REFERENCES.scipy, () => {
  it('log densities and quantiles agree with scipy to 1e-9 relative', () => {
    const script = fileURLToPath(new URL('./scipy_reference.py', import.meta.url));
    const r = spawnSync(SYSTEM_PYTHON, [script], { input: JSON.stringify(CASES), encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const ref = JSON.parse(r.stdout) as { results: { logpdf: number[]; ppf: number[] }[] };
    CASES.forEach((c, i) => {
      const p = priorFromSpec(c, 'test');
      c.x.forEach((x, k) => {
        // 1e-9: both sides evaluate the same closed forms in double precision; the normal CDF/quantile
        // implementations (stdlib vs scipy's cephes) differ at the 1e-15 level, far below this.
        expect(relDiff(p.logDensity(x), ref.results[i].logpdf[k]), `${c.kind} logpdf at ${x}`).toBeLessThan(1e-9);
      });
      c.u.forEach((u, k) => {
        expect(relDiff(p.fromUnit(u), ref.results[i].ppf[k]), `${c.kind} ppf at ${u}`).toBeLessThan(1e-9);
      });
    });
  });
});

describe('priors', () => {
  it('truncated normals far in the tails keep their quantiles (mpmath, 50 digits)', () => {
    // Fixture from tests/priors/make_tail_fixture.py (mpmath); scipy 1.10 is only ~1e-8 accurate there.
    const fixture = JSON.parse(readFileSync(fileURLToPath(new URL('./tail_quantiles.json', import.meta.url)), 'utf8')) as {
      cases: { min: number; max: number; u: number; quantile: number }[];
    };
    for (const c of fixture.cases) {
      const p = priorFromSpec({ kind: 'truncated_normal', mean: 0, sd: 1, min: c.min, max: c.max }, 'k');
      // 1e-12: a few hundred ulps, the accuracy of a double-precision quantile after the tail subtraction.
      expect(relDiff(p.fromUnit(c.u), c.quantile), `[${c.min}, ${c.max}] at u=${c.u}`).toBeLessThan(1e-12);
    }
  });

  it('are zero outside their support', () => {
    expect(uniformPrior(0, 1).logDensity(1.5)).toBe(-Infinity);
    expect(priorFromSpec({ kind: 'log_uniform', min: 0.01, max: 1 }, 'k').logDensity(0.001)).toBe(-Infinity);
    expect(priorFromSpec({ kind: 'truncated_normal', mean: 0, sd: 1, min: 0, max: 1 }, 'k').logDensity(-0.1)).toBe(-Infinity);
  });

  it('a flat prior in age integrates to one over log age and weights old ages by their age', () => {
    const p = ageGyrPrior(uniformPrior(8, 14));
    const [lo, hi] = p.support;
    expect(lo).toBeCloseTo(Math.log10(8e9), 12);
    expect(hi).toBeCloseTo(Math.log10(14e9), 12);
    // Change of variables: p(l) = p(age) * age * ln 10, so the ratio of densities is the ratio of ages.
    expect(Math.exp(p.logDensity(Math.log10(12e9)) - p.logDensity(Math.log10(9e9)))).toBeCloseTo(12 / 9, 12);
    // Midpoint rule on 10^4 intervals (no evaluation on the support's edges): the error is
    // h^2/24 times the second derivative's integral, about 1e-10 here.
    const n = 10_000;
    const h = (hi - lo) / n;
    let s = 0;
    for (let i = 0; i < n; i++) s += Math.exp(p.logDensity(lo + (i + 0.5) * h));
    expect(s * h).toBeCloseTo(1, 8);
  });

  it('rejects a truncated normal with no mass between its bounds', () => {
    expect(() => priorFromSpec({ kind: 'truncated_normal', mean: 0, sd: 1, min: 50, max: 60 }, 'priors.ebv')).toThrow(ConfigError);
  });
});

const PRIORS = `
[catalogue]
path = "x.csv"
[photometry.V]
mag = "V"
err = "eV"
[photometry.I]
mag = "I"
err = "eI"
[priors]
log_age = { kind = "uniform", min = 9.8, max = 10.2 }
feh = { kind = "normal", mean = -1.5, sd = 0.1 }
dm = { kind = "uniform", min = 14, max = 16 }
ebv = 0.05
`;

describe('parameter space from a config', () => {
  it('samples the free parameters and fixes the rest, in canonical order', () => {
    const { config } = parseConfigText(PRIORS);
    const space = buildParameterSpace(config.priors);
    expect(space.free.map((p) => p.name)).toEqual(['log_age', 'feh', 'dm', 'f_binary', 'f_field', 'sigma_extra']);
    const full = space.expand([10, -1.5, 15, 0.3, 0.1, 0.02], new Float64Array(7));
    expect(Array.from(full)).toEqual([10, -1.5, 15, 0.05, 0.3, 0.1, 0.02]);
    expect(space.describe()).toContain('ebv = 0.05 (fixed)');
  });

  it('drops f_field when the catalogue gives membership probabilities', () => {
    const { config } = parseConfigText(PRIORS);
    const space = buildParameterSpace(config.priors, { membershipGiven: true });
    expect(space.free.map((p) => p.name)).not.toContain('f_field');
  });

  it('draws from the prior inside the support', () => {
    const { config } = parseConfigText(PRIORS);
    const space = buildParameterSpace(config.priors);
    let state = 12345;
    const lcg = (): number => ((state = (state * 1103515245 + 12345) % 2147483648) + 0.5) / 2147483648;
    const out = new Float64Array(space.free.length);
    for (let i = 0; i < 100; i++) {
      space.drawFromPrior(lcg, out);
      expect(Number.isFinite(space.logPrior(out))).toBe(true);
    }
  });

  it('names the key of a missing prior', () => {
    const { config } = parseConfigText(PRIORS.replace(/^dm = .*$/m, ''));
    try {
      buildParameterSpace(config.priors);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ConfigError);
      expect((e as ConfigError).where?.key).toBe('priors.dm');
    }
  });

  it('refuses the age given twice, and inverted bounds', () => {
    expect(() => parseConfigText(PRIORS.replace('[priors]', '[priors]\nage_gyr = { kind = "uniform", min = 8, max = 14 }'))).toThrow(/age prior once/);
    expect(() => parseConfigText(PRIORS.replace('min = 14, max = 16', 'min = 16, max = 14'))).toThrow(/inverted/);
  });
});
