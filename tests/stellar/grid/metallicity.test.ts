/**
 * Metallicity scales, with the solar Z stated in every check.
 * Sources: [M/H] = log10(Z / Zsun) (common practice for tables that give Z); Salaris, Chieffi & Straniero
 * 1993, ApJ 414, 580: [M/H] = [Fe/H] + log10(0.638 f + 0.362), f = 10^[alpha/Fe] (references.md). The
 * decimal check values were evaluated with numpy (python3-numpy) from those formulas:
 *   log10(0.638 * 10**0.4 + 0.362) = 0.2932705017780523
 *   log10(0.638 * 10**0.3 + 0.362) = 0.2135117424276812
 *   log10(0.004 / 0.0152)          = -0.5797835966168101
 *   log10(0.0001 / 0.0134)         = -2.1271047983648077
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fehToMh, importGrid, mhToFeh, mhToZ, zToMh } from '../../../src/stellar/grid/index.js';

describe('Z and [M/H]', () => {
  it('[M/H] = log10(Z / Zsun) with the solar Z stated', () => {
    expect(zToMh(0.0152, 0.0152)).toBe(0); // Zsun = 0.0152
    expect(zToMh(0.00152, 0.0152)).toBeCloseTo(-1, 15); // a tenth of solar, Zsun = 0.0152
    expect(zToMh(0.004, 0.0152)).toBeCloseTo(-0.5797835966168101, 15); // Zsun = 0.0152
    expect(zToMh(0.0001, 0.0134)).toBeCloseTo(-2.1271047983648077, 15); // Zsun = 0.0134
    // The same Z is a different [M/H] for a different solar Z: why the map must state it.
    expect(zToMh(0.004, 0.02)).toBeCloseTo(Math.log10(0.2), 15); // Zsun = 0.02
  });

  it('round-trips Z -> [M/H] -> Z', () => {
    for (const z of [1e-4, 0.0006, 0.004, 0.0152, 0.03]) expect(mhToZ(zToMh(z, 0.0152), 0.0152)).toBeCloseTo(z, 15);
  });

  it('[M/H] and [Fe/H] for alpha-enhanced mixtures (Salaris et al. 1993)', () => {
    expect(fehToMh(-1.5, 0.4)).toBeCloseTo(-1.5 + 0.2932705017780523, 14);
    expect(mhToFeh(-1.0, 0.3)).toBeCloseTo(-1.0 - 0.2135117424276812, 14);
    expect(fehToMh(-0.7, 0)).toBe(-0.7);
    // Common practice: [alpha/Fe] = +0.4 raises [M/H] by about 0.3 dex.
    expect(fehToMh(0, 0.4)).toBeGreaterThan(0.28);
    expect(fehToMh(0, 0.4)).toBeLessThan(0.31);
  });

  it('an imported grid given in Z, and in [M/H] with [alpha/Fe] = 0.4, lands on the right [Fe/H]', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-met-'));
    const path = join(dir, 'g.dat');
    const rows = (met: number) => [0.5, 0.7, 0.9].map((m, k) => `9.5 ${met} ${m} ${3.6 + 0.1 * k} ${-1 + k} ${5 - k}`).join('\n');
    writeFileSync(path, `# logt met mini logte logl v\n${rows(0.004)}\n#\n${rows(0.0152)}\n`);
    const base = {
      files: [{ path }],
      format: 'text' as const,
      comment: '#',
      columns: { age: 'logt', metallicity: 'met', massInitial: 'mini', logTeff: 'logte', logL: 'logl' },
      bands: [['V', 'v']] as [['V', string]],
      ageUnit: 'log_yr' as const,
      name: 't',
      citation: '',
      dropNanRows: false,
      keyPrefix: 'grid',
    };
    const z = (await importGrid({ ...base, metallicityScale: 'z', solarZ: 0.0152, alphaFe: 0 })).grid;
    expect(z.isochrones.map((i) => i.feh)).toEqual([zToMh(0.004, 0.0152), 0]);
    expect(z.isochrones[0].feh).toBeCloseTo(-0.5797835966168101, 15);
    const mh = (await importGrid({ ...base, metallicityScale: 'm_h', alphaFe: 0.4 })).grid;
    expect(mh.isochrones[0].feh).toBeCloseTo(0.004 - 0.2932705017780523, 14);
    expect(mh.meta.notes.join(' ')).toMatch(/Salaris et al\. 1993/);
    // Without a log g column, log g comes from M, Teff and L (IAU 2015 B3: log g_sun = 4.4381, Teff_sun = 5772 K).
    const g0 = z.logg[0];
    expect(g0).toBeCloseTo(Math.log10(1.3271244e26 / 6.957e10 ** 2) + Math.log10(0.5) + 4 * (3.6 - Math.log10(5772)) - -1, 12);
  });

  it('refuses Z without a solar Z', async () => {
    await expect(
      importGrid({
        files: [{ path: 'x' }],
        format: 'text',
        comment: '#',
        columns: { massInitial: 'm', logTeff: 't', logL: 'l', age: 'a', metallicity: 'z' },
        bands: [['V', 'v']],
        ageUnit: 'log_yr',
        metallicityScale: 'z',
        alphaFe: 0,
        name: 't',
        citation: '',
        dropNanRows: false,
        keyPrefix: 'grid',
      }),
    ).rejects.toThrow(/solar Z/);
  });
});
