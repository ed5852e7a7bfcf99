/**
 * `coeval simulate`: the same seed gives the same files; the catalogue in CSV, Arrow and FITS reads back the
 * same through coeval's readers and through astropy (an outside reader); the errors follow the configured
 * law sigma(m) = a + b 10^(0.4 (m - m_ref)) (the definition) at the true magnitudes; the field
 * fraction matches f_field within its binomial error; the truth file agrees with the catalogue.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readConfiguredCatalog } from '../../src/catalog/index.js';
import type { Catalog } from '../../src/catalog/types.js';
import { parseConfigText } from '../../src/config/index.js';
import { expectUserError, runCli } from '../helpers/cli.js';
import { describeWithReference, REFERENCES, SYSTEM_PYTHON } from '../helpers/reference.js';

const CONFIG = `
[simulate]
seed = 11
stars = 1500
bands = ["B", "V", "I"]
output = "cat.csv"
blue_straggler_fraction = 0.01
[simulate.truth]
log_age = 9.8
feh = -0.5
dm = 13.0
ebv = 0.1
f_binary = 0.3
f_field = 0.1
[likelihood.limits.V]
bright = 11.0
faint = 20.5
[likelihood.errors.B]
a = 0.01
b = 0.03
m_ref = 21.0
[likelihood.errors.V]
a = 0.01
b = 0.03
m_ref = 20.5
[likelihood.errors.I]
a = 0.01
b = 0.03
m_ref = 20.0
`;

let dir: string;

/** The simulated catalogue as a fit reads it (any of the three formats). */
function readSimulated(file: string): Promise<Catalog> {
  const phot = ['B', 'V', 'I'].map((b) => `[photometry.${b}]\nmag = "${b}"\nerr = "${b}_err"\n`).join('');
  return readConfiguredCatalog(parseConfigText(`[catalogue]\npath = "${file}"\nid = "id"\n${phot}`, { baseDir: dir }));
}
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'coeval-simulate-'));
  writeFileSync(join(dir, 'sim.toml'), CONFIG);
  for (const [out, extra] of [
    ['cat.csv', []],
    ['again.csv', ['--truth', join(dir, 'again.truth.json')]],
    ['cat.arrow', []],
    ['cat.fits', []],
  ] as [string, string[]][]) {
    const r = runCli(['simulate', join(dir, 'sim.toml'), '--out', join(dir, out), ...extra]);
    expect(r.status, r.stderr).toBe(0);
  }
}, 120_000);

interface Truth {
  nStars: number;
  parameters: Record<string, number>;
  counts: { single: number; binary: number; field: number; blue_straggler: number };
  stars: { component: string };
}
const truthOf = (name: string): Truth => JSON.parse(readFileSync(join(dir, name), 'utf8')) as Truth;

describe('coeval simulate', () => {
  it('is reproducible by seed: the same config gives the same catalogue and truth', () => {
    expect(readFileSync(join(dir, 'again.csv'), 'utf8').replace(/again\.truth/, 'cat.truth')).toBe(readFileSync(join(dir, 'cat.csv'), 'utf8'));
    const a = truthOf('cat.truth.json');
    const b = truthOf('again.truth.json');
    expect({ ...b, catalogue: undefined }).toEqual({ ...a, catalogue: undefined });
  });

  it('writes the truth beside the catalogue, consistent with it', async () => {
    const t = truthOf('cat.truth.json');
    expect(t.parameters).toMatchObject({ log_age: 9.8, feh: -0.5, dm: 13, ebv: 0.1, f_binary: 0.3, f_field: 0.1 });
    expect(t.nStars).toBe(1500);
    expect(t.stars.component).toHaveLength(1500);
    const c = t.counts;
    expect(c.single + c.binary + c.field + c.blue_straggler).toBe(1500);
    const cat = await readSimulated('cat.csv');
    expect(cat.nStars).toBe(1500);
  });

  it('draws field stars at the rate f_field (binomial error; 4 sigma so a correct simulator fails 1 time in 16,000)', () => {
    const { counts } = truthOf('cat.truth.json');
    const n = 1500;
    const p = 0.1;
    expect(Math.abs(counts.field - n * p)).toBeLessThan(4 * Math.sqrt(n * p * (1 - p)));
  });

  it('gives errors that follow the configured law sigma(m) = a + b 10^(0.4 (m - m_ref)) around the observed magnitudes', async () => {
    const cat = await readSimulated('cat.csv');
    const v = cat.mag[1];
    const e = cat.err[1];
    // The law is evaluated at the true magnitude; at the observed one it differs by dsigma/dm x (m_obs - m_true),
    // at most 0.4 ln10 b 10^(0.4 (m - m_ref)) x 5 sigma, plus the 5-decimal rounding of the file.
    let worst = 0;
    for (let i = 0; i < v.length; i++) {
      if (!Number.isFinite(v[i])) continue;
      const law = 0.01 + 0.03 * 10 ** (0.4 * (v[i] - 20.5));
      const slack = 0.4 * Math.LN10 * (law - 0.01) * 5 * law + 1e-5;
      worst = Math.max(worst, Math.abs(e[i] - law) / slack);
    }
    expect(worst).toBeLessThan(1);
  });

  it('refuses a config without the truth, naming the key', () => {
    writeFileSync(join(dir, 'bad.toml'), CONFIG.replace('feh = -0.5\n', ''));
    expectUserError(runCli(['simulate', join(dir, 'bad.toml')]), 3, /simulate\.truth\.feh/);
  });
});

describeWithReference('astropy reads the simulated CSV, Arrow-equivalent and FITS catalogues the same', REFERENCES.astropy, () => {
  it('same rows and values in CSV and FITS as coeval reads from the Arrow file', async () => {
    const arrow = await readSimulated('cat.arrow');
    const script = `
import json, numpy as np
from astropy.table import Table
c = Table.read(${JSON.stringify(join(dir, 'cat.csv'))}, format='ascii.csv', comment='#')
f = Table.read(${JSON.stringify(join(dir, 'cat.fits'))})
out = {}
for name, t in (('csv', c), ('fits', f)):
    out[name] = {'n': len(t), 'ids': [str(x).strip() for x in t['id'][:5]], 'V': [float(x) for x in np.ma.filled(t['V'].astype(float), np.nan)[:50]]}
print(json.dumps(out).replace('NaN', 'null'))`;
    const r = spawnSync(SYSTEM_PYTHON, ['-c', script], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const ref = JSON.parse(r.stdout) as Record<'csv' | 'fits', { n: number; ids: string[]; V: (number | null)[] }>;
    const v = arrow.mag[1];
    const ids = arrow.id as string[];
    for (const k of ['csv', 'fits'] as const) {
      expect(ref[k].n).toBe(arrow.nStars);
      expect(ref[k].ids).toEqual(Array.from({ length: 5 }, (_, i) => String(ids[i])));
      // CSV keeps 5 decimals; FITS and Arrow keep the doubles.
      ref[k].V.forEach((x, i) => (x === null ? expect(Number.isNaN(v[i])).toBe(true) : expect(Math.abs(x - v[i])).toBeLessThanOrEqual(k === 'csv' ? 5e-6 : 0)));
    }
  });
});
