import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { tableFromIPC } from 'apache-arrow';
import { describe, expect, it } from 'vitest';
import { expectUserError, runCli } from '../helpers/cli.js';

describe('coeval isochrone', () => {
  it('prints a CSV table with the model provenance, and writes a CMD plot', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-iso-'));
    const plot = join(dir, 'cmd.svg');
    const r = runCli(['isochrone', '--age', '12', '--feh', '-1.5', '--bands', 'B,V,I', '--plot', plot]);
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines.some((l) => l.startsWith('# model: coeval built-in'))).toBe(true);
    expect(lines.some((l) => l.startsWith('# solar Z of the model: 0.02'))).toBe(true);
    expect(lines.some((l) => l.startsWith('# band V:'))).toBe(true);
    const header = lines.find((l) => !l.startsWith('#')) as string;
    expect(header).toBe('mass_initial,mass_current,phase,phase_coord,log_l,log_teff,log_g,B,V,I');
    const rows = lines.filter((l) => !l.startsWith('#')).slice(1).map((l) => l.split(','));
    expect(rows.length).toBeGreaterThan(100);
    // Initial mass never decreases along the isochrone, and the phases run from the main sequence onwards.
    for (let k = 1; k < rows.length; k++) expect(Number(rows[k][0])).toBeGreaterThanOrEqual(Number(rows[k - 1][0]));
    expect(rows[0][2]).toBe('main_sequence');
    const svg = readFileSync(plot, 'utf8');
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('B − V (intrinsic)');
  });

  it('adds the distance modulus and the extinction when asked, and says so', () => {
    const abs = runCli(['isochrone', '--age', '12', '--feh', '-1.5', '--bands', 'V,I', '--format', 'json']);
    const app = runCli(['isochrone', '--age', '12', '--feh', '-1.5', '--bands', 'V,I', '--format', 'json', '--dm', '15', '--ebv', '0.1']);
    const a = JSON.parse(abs.stdout) as { columns: Record<string, number[]> };
    const b = JSON.parse(app.stdout) as { apparent: boolean; columns: Record<string, number[]> };
    expect(b.apparent).toBe(true);
    // V: A_V = R_V E(B-V) = 3.1 * 0.1 (the law's value at V is exactly 1 by definition of A_V).
    expect(b.columns.V[0] - a.columns.V[0]).toBeCloseTo(15 + 0.31, 3);
  });

  it('writes Arrow that apache-arrow reads back', () => {
    const dir = mkdtempSync(join(tmpdir(), 'coeval-iso-'));
    const out = join(dir, 'iso.arrow');
    const r = runCli(['isochrone', '--log-age', '9.5', '--feh', '0', '--bands', 'G,BP,RP', '--format', 'arrow', '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    const t = tableFromIPC(readFileSync(out));
    expect(t.schema.fields.map((f) => f.name)).toEqual(['mass_initial', 'mass_current', 'phase', 'phase_coord', 'log_l', 'log_teff', 'log_g', 'G', 'BP', 'RP']);
    expect(JSON.parse(t.schema.metadata.get('coeval.provenance') as string).solarZ).toBe(0.02);
  });

  it('refuses ages outside the model, unknown bands and a missing age, with exit codes', () => {
    expectUserError(runCli(['isochrone', '--age', '0.01', '--feh', '0']), 5, /no isochrone at log age 7/, /log age in \[8, 10.15\]/);
    expectUserError(runCli(['isochrone', '--age', '1', '--feh', '0', '--bands', 'V,Q']), 2, /unknown band "Q"/);
    expectUserError(runCli(['isochrone', '--feh', '0']), 2, /give the age once/);
  });
});
