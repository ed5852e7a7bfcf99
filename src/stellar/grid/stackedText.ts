/**
 * Our exporter for the stacked-text layout that stellar-model groups use: a header of `#` comments, then
 * each isochrone under its own comment block (a line stating its age and metallicity, then the column
 * names), rows whitespace-aligned. Numbers are written in their shortest exact form, so that importing
 * the file gives back the same doubles. `stackedTextSpec` gives the column map that reads it back.
 */
import { writeFileAtomic } from '../../core/atomicWrite.js';
import type { GridTable } from './gridTable.js';
import type { GridImportSpec } from './importSpec.js';

export function stackedTextColumns(g: GridTable): string[] {
  const cols = ['log_age', 'feh', 'mass_initial'];
  if (g.hasMassCurrent) cols.push('mass_current');
  if (g.phaseValue) cols.push(g.meta.phaseKind === 'stage' ? 'stage' : 'eep');
  cols.push('log_teff', 'log_g', 'log_l', ...g.bands.map((b) => `mag_${b}`));
  return cols;
}

export function stackedText(g: GridTable): string {
  const cols = stackedTextColumns(g);
  const lines: string[] = [];
  lines.push(`# ${g.meta.name}`);
  lines.push(`# source: ${g.meta.citation}`);
  lines.push(`# written by ${g.meta.createdBy}; ${g.isochrones.length} isochrones; log_age = log10(age / yr); feh = [Fe/H]`);
  if (g.meta.solarZ !== undefined) lines.push(`# solar Z of the model: ${g.meta.solarZ}; [alpha/Fe] = ${g.meta.alphaFe}`);
  const order = g.isochrones.map((_, k) => k);
  order.forEach((k, j) => {
    const iso = g.isochrones[k];
    lines.push('#');
    lines.push(`# isochrone ${j + 1} of ${order.length}: log_age = ${iso.logAgeYr}, feh = ${iso.feh}, rows = ${iso.count}`);
    lines.push(`# ${cols.join(' ')}`);
    for (let r = iso.start; r < iso.start + iso.count; r++) {
      const v: (number | string)[] = [iso.logAgeYr, iso.feh, g.massInitial[r]];
      if (g.hasMassCurrent) v.push(g.massCurrent[r]);
      if (g.phaseValue) v.push(g.meta.phaseKind === 'stage' ? (g.meta.stageLabels?.[g.phaseValue[r]] ?? String(g.phaseValue[r])) : g.phaseValue[r]);
      v.push(g.logTeff[r], g.logg[r], g.logL[r]);
      for (const m of g.mag) v.push(m[r]);
      lines.push(v.map(String).join(' '));
    }
  });
  return `${lines.join('\n')}\n`;
}

export function writeStackedText(g: GridTable, path: string): void {
  writeFileAtomic(path, stackedText(g));
}

/** The column map that imports a file written by `writeStackedText`. */
export function stackedTextSpec(g: GridTable, path: string): GridImportSpec {
  return {
    files: [{ path }],
    format: 'text',
    comment: '#',
    columns: {
      age: 'log_age',
      metallicity: 'feh',
      massInitial: 'mass_initial',
      massCurrent: g.hasMassCurrent ? 'mass_current' : undefined,
      phase: g.phaseValue ? (g.meta.phaseKind === 'stage' ? 'stage' : 'eep') : undefined,
      logTeff: 'log_teff',
      logg: 'log_g',
      logL: 'log_l',
    },
    bands: g.bands.map((b) => [b, `mag_${b}`]),
    ageUnit: 'log_yr',
    metallicityScale: 'fe_h',
    solarZ: g.meta.solarZ,
    alphaFe: g.meta.alphaFe,
    phaseKind: g.phaseValue ? g.meta.phaseKind : undefined,
    name: g.meta.name,
    citation: g.meta.citation,
    dropNanRows: false,
    keyPrefix: 'grid',
  };
}
