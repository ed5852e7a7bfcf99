/**
 * What `coeval fit` prints when it ends: the verdict, the summary table (with the provenance line), the
 * truth against the 95% intervals when the catalogue was simulated, where the time went, and the files.
 */
import type { ClusterParameterName } from '../core/parameters.js';
import { diagnosisJson } from '../report/diagnosisText.js';
import { formatSummary } from '../report/summaryFormats.js';
import type { FitResult } from './fit.js';

export interface TruthCheck {
  name: string;
  truth: number;
  p2_5: number;
  p97_5: number;
  inside95: boolean;
}

/** Each sampled parameter with a known true value: is it inside the 2.5-97.5% interval? */
export function truthChecks(r: Pick<FitResult, 'diagnosis' | 'manifest'>): TruthCheck[] {
  const truth = r.manifest.fit.truth;
  if (!truth) return [];
  const out: TruthCheck[] = [];
  for (const p of r.diagnosis.summary.parameters) {
    const t = truth[p.info.name as ClusterParameterName];
    if (t === undefined) continue;
    out.push({ name: p.info.name, truth: t, p2_5: p.p2_5, p97_5: p.p97_5, inside95: t >= p.p2_5 && t <= p.p97_5 });
  }
  return out;
}

const sec = (x: number | undefined): string => (x === undefined ? '-' : `${x.toFixed(1)} s`);

export function formatFitResult(r: FitResult): string {
  const d = r.diagnosis;
  const v = d.diagnosis.verdict;
  const t = r.manifest.fit.timings;
  const lines = [v.headline, ...v.findings.map((f) => `  - ${f}`), '', formatSummary(d.summary, 'text', { runId: d.manifest.runId, drawsLine: d.drawsLine }), ''];
  const tc = truthChecks(r);
  if (tc.length > 0) {
    lines.push(`truth (simulated catalogue): ${tc.map((c) => `${c.name} ${Number(c.truth.toPrecision(6))} ${c.inside95 ? 'inside' : 'OUTSIDE'} [${Number(c.p2_5.toPrecision(5))}, ${Number(c.p97_5.toPrecision(5))}]`).join('; ')}`);
  }
  lines.push(
    `time: ${sec(t.total)} in all; check ${sec(t.check)}, model and likelihood ${sec(t.setup)}, workers ${sec(t.workers)}, initialisation ${sec(t.initialisation)} (${r.evaluations.initialisation} evaluations), sampling ${sec(t.sampling)} (${r.evaluations.sampling.toLocaleString('en-US')} evaluations, ${r.evaluations.msPerEvaluation.toPrecision(3)} ms each per worker), diagnostics ${sec(t.diagnostics)}, per-star results ${sec(t.stars)}${t.report === undefined ? '' : `, plots and report ${sec(t.report)}`}`,
    `run directory: ${r.runDir} (manifest.json, chains/, checkpoint.json, stars.arrow, diagnostics.json, summary.txt/csv/json/tex${t.report === undefined ? '' : ', plots/, report.html'})`,
  );
  return lines.join('\n');
}

export function fitResultJson(r: FitResult): unknown {
  const d = r.diagnosis;
  const info = { runId: d.manifest.runId, drawsLine: d.drawsLine, provenance: d.provenance };
  return {
    runDir: r.runDir,
    runId: d.manifest.runId,
    stoppedBy: r.run.stoppedBy,
    steps: r.run.steps,
    verdict: d.diagnosis.verdict,
    summary: JSON.parse(formatSummary(d.summary, 'json', info)) as unknown,
    diagnosis: diagnosisJson(d.diagnosis, info),
    truth: truthChecks(r),
    timings: r.manifest.fit.timings,
    evaluations: r.evaluations,
    warnings: r.warnings,
  };
}
