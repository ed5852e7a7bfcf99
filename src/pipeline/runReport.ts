/**
 * `coeval report`: one self-contained HTML file for a run (report.html in the run directory): cautions,
 * verdict, summary and convergence tables, LaTeX row, every figure inline as SVG, and the provenance of
 * the numbers (stellar model and calibrations, extinction, priors, sampler, versions, timings).
 */
import { statSync } from 'node:fs';
import { basename, join } from 'node:path';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { coevalVersion } from '../core/version.js';
import { RUN_LAYOUT } from '../io/index.js';
import { reportCautions } from '../report/cautions.js';
import { diagnosisNotes, diagnosisTable } from '../report/diagnosisText.js';
import { renderReportHtml, type ReportContent } from '../report/html.js';
import { formatSummary, summaryNotes, summaryTable } from '../report/summaryFormats.js';
import { reportProvenance } from './reportProvenance.js';
import { buildRunFigures, type RunFigureOptions, type RunFigures } from './runPlots.js';

export interface ReportResult {
  path: string;
  bytes: number;
  figures: string[];
  skipped: RunFigures['skipped'];
}

/** The report's content for a run whose figures are built (exported for tests). */
export function reportContent(r: RunFigures): ReportContent {
  const p = r.posterior;
  const { run, fit } = p;
  const d = run.diagnosis;
  const ctx = { runId: run.manifest.runId, drawsLine: run.drawsLine };
  const latex = formatSummary(run.summary, 'latex', ctx).split('\n');
  const name = fit ? basename(fit.catalogue.path) : `run ${run.manifest.runId}`;
  const prov = reportProvenance(p);
  return {
    title: `coeval fit report: ${name}`,
    subtitle: `run ${run.manifest.runId}; ${run.drawsLine}. Written by coeval ${coevalVersion()} on ${new Date().toISOString().slice(0, 10)}.`,
    cautions: reportCautions({
      modelName: fit?.model.name ?? run.provenance,
      builtin: fit ? fit.config.grid === undefined : false,
      verdictStatus: d.verdict.status,
      runStatus: run.manifest.status,
      simulated: fit?.truth !== undefined && Object.keys(fit.truth).length > 0,
    }),
    verdict: { status: d.verdict.status, headline: d.verdict.headline, findings: d.verdict.findings },
    summary: summaryTable(run.summary),
    summaryNotes: [run.drawsLine, ...summaryNotes(run.summary), `provenance: ${run.provenance}`],
    diagnostics: { ...diagnosisTable(d), notes: diagnosisNotes(d) },
    latex,
    figures: [
      ...r.figures.map((f) => ({ id: `fig-${f.name}`, title: f.title, caption: f.caption, svg: f.svg })),
    ],
    provenance: prov.items,
    modelCaveats: prov.caveats,
    priors: prov.priors,
    config: prov.configToml,
  };
}

/** Build every figure the run has data for (or those asked for) and write report.html. */
export async function reportRun(runDir: string, o: RunFigureOptions = {}): Promise<ReportResult> {
  const r = await buildRunFigures(runDir, o);
  const html = renderReportHtml(reportContent(r));
  const path = join(r.posterior.run.runDir, RUN_LAYOUT.report);
  writeFileAtomic(path, html);
  return { path, bytes: statSync(path).size, figures: r.figures.map((f) => f.name), skipped: r.skipped };
}
