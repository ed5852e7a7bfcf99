/**
 * `coeval check` and `coeval demo`: the summary of the demo catalogue, checked against astropy's reading
 * of the same file and numpy's percentiles (numpy.percentile's default "linear" method is Hyndman & Fan
 * type 7, as core/quantile.ts implements).
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../src/config/index.js';
import { quantileSorted } from '../../src/core/quantile.js';
import { checkConfig, type CatalogueSummary } from '../../src/pipeline/index.js';
import { REPO_ROOT, runCli } from '../helpers/cli.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../helpers/reference.js';

const DEMO = resolve(REPO_ROOT, 'configs/demo.toml');

describe('quantileSorted', () => {
  it('interpolates between order statistics (Hyndman & Fan 1996, definition 7)', () => {
    // Worked by hand from the definition: h = (n - 1) p + 1 (1-based); x = [1, 2, 4, 8].
    const x = [1, 2, 4, 8];
    expect(quantileSorted(x, 0)).toBe(1);
    expect(quantileSorted(x, 0.5)).toBe(3); // h = 2.5: 2 + 0.5 (4 - 2)
    expect(quantileSorted(x, 0.95)).toBeCloseTo(7.4, 12); // h = 3.85: 4 + 0.85 (8 - 4)
    expect(Number.isNaN(quantileSorted([], 0.5))).toBe(true);
  });
});

describeWithReference('the check summary agrees with astropy and numpy on the demo catalogue', REFERENCES.astropy, () => {
  it('stars, magnitude ranges, error percentiles and missing counts', async () => {
    const report = await checkConfig(loadConfig(DEMO));
    const cat = report.sections.find((s) => s.id === 'catalogue')?.data as CatalogueSummary;
    const script = `
import json, numpy as np
from astropy.table import Table
t = Table.read(${JSON.stringify(resolve(REPO_ROOT, 'demo-data/tessaly7.csv'))}, format='ascii.csv', comment='#')
out = {'n': len(t)}
for b in 'BVI':
    m = np.ma.filled(t[b].astype(float), np.nan); e = np.ma.filled(t[b + '_err'].astype(float), np.nan)
    ok = np.isfinite(m) & np.isfinite(e)
    out[b] = {'min': float(m[ok].min()), 'max': float(m[ok].max()), 'missing': int((~ok).sum()),
              'p': [float(v) for v in np.percentile(e[ok], [5, 50, 95])]}
print(json.dumps(out))`;
    const r = spawnSync(SYSTEM_PYTHON, ['-c', script], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const ref = JSON.parse(r.stdout) as Record<string, { min: number; max: number; missing: number; p: number[] }> & { n: number };
    expect(cat.nStars).toBe(ref.n);
    for (const b of cat.bands) {
      const want = ref[b.band];
      expect([b.magMin, b.magMax, b.missing]).toEqual([want.min, want.max, want.missing]);
      // Same interpolation on the same doubles: agreement to rounding (1e-15 relative).
      [b.errP05, b.errP50, b.errP95].forEach((v, k) => expect(Math.abs(v - want.p[k]) / want.p[k]).toBeLessThan(1e-14));
    }
  });
});

describe('coeval check and coeval demo through the CLI', () => {
  it('check --json gives the same summary for machines', () => {
    const r = runCli(['check', DEMO, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const report = JSON.parse(r.stdout) as { sections: { id: string; data: CatalogueSummary }[]; model: string };
    const cat = report.sections.find((s) => s.id === 'catalogue')?.data as CatalogueSummary;
    expect(cat.bands.map((b) => b.band)).toEqual(['B', 'V', 'I']);
    expect(cat.membership.present).toBe(false);
    expect(cat.parallax.present).toBe(false);
    expect(cat.filters).toEqual([{ rule: 'no magnitude in any band', dropped: 0 }]);
    expect(report.model).toMatch(/^none/);
  });

  it('the demo config and its two prior variants pass the check and differ only in their priors', () => {
    for (const name of ['demo', 'demo-flat-age', 'demo-feh-spectroscopy']) {
      const r = runCli(['check', resolve(REPO_ROOT, `configs/${name}.toml`)]);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout).toMatch(/catalogue\s+demo-data\/tessaly7\.csv/);
    }
    const base = loadConfig(DEMO).config;
    const flat = loadConfig(resolve(REPO_ROOT, 'configs/demo-flat-age.toml')).config;
    const feh = loadConfig(resolve(REPO_ROOT, 'configs/demo-feh-spectroscopy.toml')).config;
    expect(flat.priors?.age_gyr).toEqual({ kind: 'uniform', min: 1, max: 14.1 });
    expect(feh.priors?.feh).toEqual({ kind: 'truncated_normal', mean: -1.55, sd: 0.1, min: -2.3, max: 0.2 });
    expect({ ...flat, priors: { ...flat.priors, age_gyr: undefined, log_age: base.priors?.log_age } }).toEqual(base);
    expect({ ...feh, priors: { ...feh.priors, feh: base.priors?.feh } }).toEqual(base);
  });

  it('--quiet silences the messages but not the result', () => {
    const r = runCli(['check', DEMO, '--quiet']);
    expect(r.stderr).toBe('');
    expect(r.stdout).toMatch(/after filters/);
  });
});
