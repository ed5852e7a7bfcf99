/**
 * The diagnosis as people and programs read it: the verdict, then a table of the convergence statistics,
 * acceptance and the conventions behind them; or the same as JSON.
 */
import { CITATIONS, THRESHOLDS, type Diagnosis } from '../diagnostics/index.js';
import { alignTable } from './summaryFormats.js';

const num = (x: number, digits: number): string => (Number.isFinite(x) ? Number(x.toPrecision(digits)).toString() : 'NaN');

export function diagnosisTable(d: Diagnosis): { header: string[]; rows: string[][] } {
  const header = ['parameter', 'R-hat', 'ESS bulk', 'ESS tail', 'tau', 'steps/tau', 'MCSE mean', 'MCSE q5', 'MCSE q16', 'MCSE q50', 'MCSE q84', 'MCSE q95', 'ensembles z'];
  const rows = d.parameters.map((p) => [
    p.info.name,
    Number.isFinite(p.rhat) ? p.rhat.toFixed(3) : 'NaN',
    Number.isFinite(p.essBulk) ? Math.round(p.essBulk).toString() : 'NaN',
    Number.isFinite(p.essTail) ? Math.round(p.essTail).toString() : 'NaN',
    num(p.tauSteps, 3),
    Number.isFinite(p.tauSteps) ? Math.floor(d.keptSteps / p.tauSteps).toString() : 'NaN',
    num(p.mcseMean, 2),
    ...p.quantiles.map((q) => num(q.mcse, 2)),
    p.agreement ? num(p.agreement.maxAbsZ, 2) : '-',
  ]);
  return { header, rows };
}

/** The lines under the diagnosis table: acceptance, tau and burn-in, thresholds, conventions, methods. */
export function diagnosisNotes(d: Diagnosis): string[] {
  const acc = d.acceptance;
  return [
    `acceptance: ${num(acc.overall, 3)} overall; per ensemble ${acc.perEnsemble.map((a) => num(a, 3)).join(', ')}; ${acc.stuck.length} stuck walker(s).`,
    `tau_max ${num(d.tauMax, 3)} steps; suggested burn-in ${Number.isFinite(d.suggestedBurnIn) ? d.suggestedBurnIn : 'NaN'} steps (${THRESHOLDS.burnInTauMultiple} tau_max), used ${d.discard}.`,
    `thresholds: R-hat < ${THRESHOLDS.rhat} and ESS > ${THRESHOLDS.ess} (Vehtari et al. 2021); chains of at least ${THRESHOLDS.tauMultiple} tau (common practice, documented with emcee).`,
    `ensembles z: largest |z| of an ensemble's median against the others', in MCSE units (Bonferroni-corrected two-sided test at 1%).`,
    `chains: ${d.chainConvention}`,
    `methods: ${CITATIONS.VEHTARI_2021}; tau: ${CITATIONS.EMCEE}, window c = 5 (${CITATIONS.SOKAL_1997}).`,
  ];
}

export function formatDiagnosis(d: Diagnosis, ctx: { runId: string; drawsLine: string; provenance: string }): string {
  const t = diagnosisTable(d);
  const notes = diagnosisNotes(d);
  const lines = [
    d.verdict.headline,
    ...d.verdict.findings.map((f) => `  - ${f}`),
    '',
    `run ${ctx.runId}: ${ctx.drawsLine}`,
    `provenance: ${ctx.provenance}`,
    '',
    alignTable(t.header, t.rows),
    '',
    ...notes.slice(0, 2),
    '',
    ...notes.slice(2),
  ];
  return lines.join('\n');
}

/** The diagnosis as JSON-ready data (sorted draws left out; NaN becomes null). */
export function diagnosisJson(d: Diagnosis, ctx: { runId: string; provenance: string }): unknown {
  return JSON.parse(
    JSON.stringify(
      {
        runId: ctx.runId,
        provenance: ctx.provenance,
        verdict: d.verdict,
        nEnsembles: d.nEnsembles,
        nWalkers: d.nWalkers,
        totalSteps: d.totalSteps,
        discard: d.discard,
        thin: d.thin,
        keptSteps: d.keptSteps,
        tauMax: d.tauMax,
        suggestedBurnIn: d.suggestedBurnIn,
        thresholds: THRESHOLDS,
        chainConvention: d.chainConvention,
        acceptance: { overall: d.acceptance.overall, perEnsemble: d.acceptance.perEnsemble, perWalker: [...d.acceptance.perWalker], stuck: d.acceptance.stuck },
        parameters: d.parameters.map((p) => ({
          name: p.info.name,
          rhat: p.rhat,
          rhatBulk: p.rhatBulk,
          rhatFolded: p.rhatFolded,
          essBulk: p.essBulk,
          essTail: p.essTail,
          essMean: p.essMean,
          mcseMean: p.mcseMean,
          quantiles: p.quantiles,
          tau: p.tauSteps,
          tauWindow: p.tau.window,
          tauReliable: p.tau.reliable,
          nonFinite: p.nonFinite,
          ensembles: p.groups,
          agreement: p.agreement,
        })),
      },
      (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v),
    ),
  );
}
