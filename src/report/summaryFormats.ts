/**
 * The summary as a text table, CSV, JSON and a LaTeX row. Text and LaTeX round to the decimals the Monte
 * Carlo error allows (significantDigits.ts); CSV and JSON keep full precision and give those decimals in a
 * column, so that programs can round the same way. Every form states the provenance (stellar model and
 * calibration) of the posterior.
 */
import { DIGITS_RULE, fixed } from './significantDigits.js';
import type { ParameterSummary, Summary } from './summary.js';

export type SummaryFormat = 'text' | 'csv' | 'json' | 'latex';
export const SUMMARY_FORMATS: readonly SummaryFormat[] = ['text', 'csv', 'json', 'latex'];

export interface SummaryContext {
  runId: string;
  /** One line describing the draws: ensembles, walkers, steps, burn-in. */
  drawsLine: string;
}

/** The summary as a table of strings (header and rows), as the text output and the HTML report show it. */
export function summaryTable(s: Summary): { header: string[]; rows: string[][] } {
  const header = ['parameter', 'unit', 'median', '-1 sigma', '+1 sigma', '2.5%', '97.5%', 'mean', 'sd', 'MAP', 'ESS bulk', 'ESS tail', 'R-hat'];
  const rows = s.parameters.map((p) => {
    const f = (x: number): string => fixed(x, p.decimals);
    return [
      p.info.label || p.info.name,
      p.info.unit,
      f(p.median),
      f(p.median - p.p16),
      f(p.p84 - p.median),
      f(p.p2_5),
      f(p.p97_5),
      f(p.mean),
      f(p.sd),
      f(p.map),
      Number.isFinite(p.essBulk) ? Math.round(p.essBulk).toString() : 'NaN',
      Number.isFinite(p.essTail) ? Math.round(p.essTail).toString() : 'NaN',
      Number.isFinite(p.rhat) ? p.rhat.toFixed(3) : 'NaN',
    ];
  });
  return { header, rows };
}

/** Columns padded to line up; numbers right-aligned. */
export function alignTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]): string => cells.map((c, i) => (i < 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ').trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

function csvCell(v: string | number): string {
  const s = String(v);
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

const CSV_COLUMNS: [string, (p: ParameterSummary) => string | number][] = [
  ['name', (p) => p.info.name],
  ['label', (p) => p.info.label],
  ['unit', (p) => p.info.unit],
  ['median', (p) => p.median],
  ['p16', (p) => p.p16],
  ['p84', (p) => p.p84],
  ['p2_5', (p) => p.p2_5],
  ['p97_5', (p) => p.p97_5],
  ['mean', (p) => p.mean],
  ['sd', (p) => p.sd],
  ['map', (p) => p.map],
  ['ess_bulk', (p) => p.essBulk],
  ['ess_tail', (p) => p.essTail],
  ['rhat', (p) => p.rhat],
  ['mcse_median', (p) => p.mcseMedian],
  ['mcse_mean', (p) => p.mcseMean],
  ['decimals', (p) => p.decimals],
];

/** LaTeX for one parameter: $median^{+err}_{-err}$. */
export function latexValue(p: ParameterSummary): string {
  const f = (x: number): string => fixed(x, p.decimals);
  return `$${f(p.median)}^{+${f(p.p84 - p.median)}}_{-${f(p.median - p.p16)}}$`;
}

/** What the summary table's columns mean and how its numbers are rounded. */
export function summaryNotes(s: Summary): string[] {
  return [
    `median and 16/84% (the sigma columns), 2.5/97.5% percentiles; MAP = the draw with the highest log posterior (${fixedOrNaN(s.map.logPosterior)}).`,
    `${DIGITS_RULE}.`,
  ];
}

export function formatSummary(s: Summary, format: SummaryFormat, ctx: SummaryContext): string {
  switch (format) {
    case 'text': {
      const t = summaryTable(s);
      return [`posterior summary, run ${ctx.runId}`, ctx.drawsLine, `provenance: ${s.provenance}`, '', alignTable(t.header, t.rows), '', ...summaryNotes(s)].join('\n');
    }
    case 'csv': {
      const lines = [
        `# coeval posterior summary, run ${ctx.runId}`,
        `# ${ctx.drawsLine}`,
        `# provenance: ${s.provenance}`,
        `# full precision; ${DIGITS_RULE} (column "decimals")`,
        CSV_COLUMNS.map(([h]) => h).join(','),
        ...s.parameters.map((p) => CSV_COLUMNS.map(([, get]) => csvCell(get(p))).join(',')),
      ];
      return lines.join('\n');
    }
    case 'json':
      return JSON.stringify(
        {
          runId: ctx.runId,
          draws: ctx.drawsLine,
          provenance: s.provenance,
          digitsRule: DIGITS_RULE,
          map: s.map,
          parameters: s.parameters.map((p) => ({
            name: p.info.name,
            label: p.info.label,
            unit: p.info.unit,
            median: p.median,
            p16: p.p16,
            p84: p.p84,
            p2_5: p.p2_5,
            p97_5: p.p97_5,
            mean: p.mean,
            sd: p.sd,
            map: p.map,
            essBulk: p.essBulk,
            essTail: p.essTail,
            rhat: p.rhat,
            mcseMedian: p.mcseMedian,
            mcseMean: p.mcseMean,
            decimals: p.decimals,
            latex: latexValue(p),
          })),
        },
        (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v),
        2,
      );
    case 'latex':
      return [
        `% coeval posterior summary, run ${ctx.runId}; ${ctx.drawsLine}`,
        `% provenance: ${s.provenance}`,
        `% median with 16th and 84th percentiles; ${DIGITS_RULE}`,
        `% columns: ${s.parameters.map((p) => `${p.info.label || p.info.name}${p.info.unit ? ` [${p.info.unit}]` : ''}`).join(' & ')}`,
        `${s.parameters.map(latexValue).join(' & ')} \\\\`,
      ].join('\n');
  }
}

function fixedOrNaN(x: number): string {
  return Number.isFinite(x) ? x.toFixed(2) : String(x);
}
