/**
 * The one-file HTML report: inline CSS and inline SVG figures, no scripts, no network. It opens anywhere,
 * can be mailed to a co-author, and prints. Content is assembled by the caller; this module only lays it
 * out and escapes it.
 */

export interface ReportFigure {
  id: string;
  title: string;
  caption: string;
  svg: string;
}

export interface ReportContent {
  title: string;
  subtitle?: string;
  /** The verdict: its headline (which names the status) and the findings behind it. */
  verdict: { status: 'converged' | 'run-longer' | 'problems'; headline: string; findings: string[] };
  summary: { header: string[]; rows: string[][] };
  /** Lines under the summary table: which draws, how numbers are rounded. */
  summaryNotes?: string[];
  /** The convergence statistics per parameter, with notes on the conventions. */
  diagnostics?: { header: string[]; rows: string[][]; notes: string[] };
  latex?: string[];
  figures: ReportFigure[];
  /** Label/value pairs: stellar model, calibrations, extinction law, sampler, versions. */
  provenance: [string, string][];
  /** Where the stellar model and its calibrations are approximate. */
  modelCaveats?: string[];
  priors: string[];
  cautions: string[];
  /** The resolved config, shown verbatim at the end. */
  config?: string;
}

const STATUS_TEXT: Record<ReportContent['verdict']['status'], string> = {
  converged: 'Converged',
  'run-longer': 'Run longer',
  problems: 'Problems found',
};

export function renderReportHtml(c: ReportContent): string {
  const fig = (f: ReportFigure): string =>
    `<figure id="${esc(f.id)}"><h3>${esc(f.title)}</h3><div class="plot">${scopeSvgIds(stripXmlProlog(f.svg), f.id)}</div><figcaption>${esc(f.caption)}</figcaption></figure>`;
  const table = (t: { header: string[]; rows: string[][] }): string =>
    `<table><thead><tr>${t.header.map((h) => `<th>${esc(h)}</th>`).join('')}</tr></thead>\n<tbody>${t.rows.map((r) => `<tr>${r.map((v) => `<td>${esc(v)}</td>`).join('')}</tr>`).join('\n')}</tbody></table>`;
  const notes = (lines: string[] | undefined): string => (lines && lines.length ? `<ul class="notes">${lines.map((l) => `<li>${esc(l)}</li>`).join('')}</ul>` : '');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(c.title)}</title>
<style>
body { font-family: "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; color: #1d1d1d; margin: 0 auto; max-width: 1200px; padding: 1.5rem 2rem 4rem; line-height: 1.45; }
h1 { font-size: 1.6rem; margin-bottom: 0.2rem; }
h2 { font-size: 1.2rem; border-bottom: 1px solid #ccc; padding-bottom: 0.2rem; margin-top: 2.2rem; }
h3 { font-size: 1rem; margin: 1.2rem 0 0.4rem; }
.subtitle { color: #555; margin-top: 0; }
.verdict { border-left: 6px solid #888; padding: 0.6rem 1rem; background: #f4f4f4; margin: 1rem 0; }
.verdict ul { margin: 0.4rem 0 0; }
.verdict.converged { border-color: #1a7f37; }
.verdict.run-longer { border-color: #b58100; }
.verdict.problems { border-color: #b42318; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; font-size: 0.9rem; }
th, td { padding: 0.25rem 0.5rem; border-bottom: 1px solid #e2e2e2; text-align: right; }
th:first-child, td:first-child { text-align: left; }
th { background: #f0f0f0; font-weight: 600; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 0.3rem 1.2rem; }
dt { font-weight: 600; }
dd { margin: 0; }
.cautions { background: #fff8e6; border: 1px solid #e8c872; padding: 0.6rem 1.2rem; }
pre { background: #f6f6f6; padding: 0.8rem; white-space: pre-wrap; overflow-wrap: anywhere; font-size: 0.85rem; }
figure { margin: 0 0 1.5rem; }
figcaption { color: #444; font-size: 0.9rem; max-width: 60rem; }
.plot svg { max-width: 100%; height: auto; }
.wide { overflow-x: auto; }
.notes { color: #444; font-size: 0.9rem; }
@media print { figure { break-inside: avoid; } }
</style>
</head>
<body>
<h1>${esc(c.title)}</h1>
${c.subtitle ? `<p class="subtitle">${esc(c.subtitle)}</p>` : ''}
<div class="cautions"><strong>Read before quoting these numbers.</strong><ul>${c.cautions.map((t) => `<li>${esc(t)}</li>`).join('')}</ul></div>
<h2>Verdict</h2>
<div class="verdict ${c.verdict.status}" title="${STATUS_TEXT[c.verdict.status]}"><strong>${esc(c.verdict.headline)}</strong>${notes(c.verdict.findings)}</div>
<h2>Posterior summary</h2>
<div class="wide">${table(c.summary)}</div>
${notes(c.summaryNotes)}
${c.latex && c.latex.length ? `<h3>LaTeX</h3><pre>${esc(c.latex.join('\n'))}</pre>` : ''}
${c.diagnostics ? `<h2>Convergence</h2><div class="wide">${table(c.diagnostics)}</div>${notes(c.diagnostics.notes)}` : ''}
<h2>Figures</h2>
${c.figures.map(fig).join('\n')}
<h2>Provenance</h2>
<dl>${c.provenance.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join('')}</dl>
${c.modelCaveats && c.modelCaveats.length ? `<h3>Where the model is approximate</h3><ul>${c.modelCaveats.map((t) => `<li>${esc(t)}</li>`).join('')}</ul>` : ''}
<h3>Priors</h3>
<ul>${c.priors.map((p) => `<li><code>${esc(p)}</code></li>`).join('')}</ul>
${c.config ? `<h3>Resolved configuration</h3><pre>${esc(c.config)}</pre>` : ''}
</body>
</html>
`;
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * Prefix the ids inside one SVG (clip paths, gradients) and the references to them with the figure's id.
 * Every vega SVG names its first clip path "clip1"; inlined side by side, the browser would resolve every
 * figure's url(#clip1) to the first figure's and clip later figures wrongly.
 */
export function scopeSvgIds(svg: string, scope: string): string {
  const p = scope.replace(/[^A-Za-z0-9_-]/g, '_');
  return svg
    .replace(/\bid="([^"]+)"/g, (_m, id: string) => `id="${p}-${id}"`)
    .replace(/url\(#([^)]+)\)/g, (_m, id: string) => `url(#${p}-${id})`)
    .replace(/\b(xlink:)?href="#([^"]+)"/g, (_m, x: string | undefined, id: string) => `${x ?? ''}href="#${p}-${id}"`);
}

function stripXmlProlog(svg: string): string {
  return svg.replace(/^<\?xml[^>]*>\s*/, '');
}
