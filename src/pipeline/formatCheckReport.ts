import { relative } from 'node:path';
import type { CatalogueSummary } from './catalogueSummary.js';
import type { CheckReport, CheckSection } from './check.js';
import type { GridCheck } from './gridCheck.js';

/** The check report as text for a terminal: one block per section, then the warnings. */
export function formatCheckReport(report: CheckReport, cwd = process.cwd()): string {
  const out: string[] = [];
  for (const s of report.sections) out.push(...formatSection(s, cwd), '');
  out.push(`stellar model: ${report.model}`);
  const warnings = report.sections.flatMap((s) => s.warnings.map((w) => `${s.title}: ${w}`));
  out.push(warnings.length === 0 ? 'result: OK, no warnings' : `result: OK, with ${warnings.length} warning${warnings.length === 1 ? '' : 's'}:`);
  for (const w of warnings) out.push(`  - ${w}`);
  return out.join('\n');
}

function formatSection(s: CheckSection, cwd: string): string[] {
  if (s.id === 'config') {
    const d = s.data as { file?: string; bands: string[]; overrides: string[] };
    return [
      `config      ${d.file ? shortPath(d.file, cwd) : '(in memory)'}: valid`,
      `            bands ${d.bands.join(', ')}; overrides: ${d.overrides.length ? d.overrides.join(' ') : 'none'}`,
    ];
  }
  if (s.id === 'catalogue') return formatCatalogue(s.data as CatalogueSummary, cwd);
  if (s.id === 'grid') return formatGrid(s.data as GridCheck);
  // Sections added by later stages print their data as JSON until they bring a formatter.
  return [`${s.title.padEnd(11)} ${JSON.stringify(s.data)}`];
}

function formatCatalogue(c: CatalogueSummary, cwd: string): string[] {
  const lines: string[] = [];
  lines.push(`catalogue   ${shortPath(c.path, cwd)}`);
  lines.push(`            ${FORMAT_NAMES[c.format] ?? c.format}${c.detail ? `, ${c.detail}` : ''}; ${c.rowsRead} rows read`);
  lines.push(`stars       ${c.nStars} after filters; bands ${c.bands.map((b) => b.band).join(', ')}`);
  if (c.filters.length === 0) lines.push('filters     none');
  c.filters.forEach((f, k) => lines.push(`${k === 0 ? 'filters' : ''}`.padEnd(12) + `${f.rule}: ${f.dropped} dropped`));
  const rows = [['band', 'from', 'magnitude range', 'error p5 / p50 / p95 (mag)', 'missing']];
  for (const b of c.bands) {
    rows.push([
      b.band,
      b.from,
      `${b.magMin.toFixed(3)} .. ${b.magMax.toFixed(3)}`,
      `${err(b.errP05)} / ${err(b.errP50)} / ${err(b.errP95)}`,
      String(b.missing),
    ]);
  }
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  for (const r of rows) lines.push(`  ${r.map((cell, j) => (j === r.length - 1 ? cell.padStart(widths[j]) : cell.padEnd(widths[j]))).join('  ')}`);
  const m = c.membership;
  lines.push(
    m.present
      ? `membership  column "${m.column}": ${m.withValue} stars with a value${m.min !== undefined ? `, range ${m.min} .. ${m.max}` : ''}`
      : 'membership  none mapped (catalogue.membership)',
  );
  const p = c.parallax;
  lines.push(
    p.present
      ? `parallax    column "${p.column}"${p.errorColumn ? ` ± "${p.errorColumn}"` : ' (no error column)'}: ${p.withValue} stars with a value${p.medianMas !== undefined ? `, median ${p.medianMas.toFixed(4)} mas` : ''}`
      : 'parallax    none mapped (catalogue.parallax, catalogue.parallax_error)',
  );
  lines.push(c.ids.present ? `ids         column "${c.ids.column}"` : 'ids         none mapped (catalogue.id); stars are numbered by row');
  return lines;
}

function formatGrid(g: GridCheck): string[] {
  const lines = [
    `grid        ${g.name}: ${g.nIsochrones} isochrones, bands ${g.bands.join(', ')}`,
    `            log age ${g.logAge[0].toFixed(4)} .. ${g.logAge[1].toFixed(4)}, [Fe/H] ${g.feh[0].toFixed(3)} .. ${g.feh[1].toFixed(3)}; from ${g.origin}`,
    `            citation: ${g.citation || '(none given)'}`,
  ];
  for (const p of g.priors) lines.push(`            prior on ${p.parameter} ${p.support[0]} .. ${p.support[1]}: inside the grid`);
  return lines;
}

const FORMAT_NAMES: Record<string, string> = {
  csv: 'CSV', tsv: 'TSV', whitespace: 'text table', ecsv: 'ECSV', fits: 'FITS', votable: 'VOTable', arrow: 'Arrow', parquet: 'Parquet',
};

function err(x: number): string {
  return Number.isFinite(x) ? x.toFixed(4) : '-';
}

function shortPath(p: string, cwd: string): string {
  const r = relative(cwd, p);
  return r.startsWith('..') || r === '' ? p : r;
}
