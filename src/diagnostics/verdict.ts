/**
 * The verdict in words: converged; run longer (and by how many steps); or problems (naming parameters and
 * walkers). Thresholds from citations.ts: R-hat < 1.01 and bulk and tail ESS > 400 (VEHTARI_2021), chains
 * of at least 50 tau (common practice, EMCEE).
 */
import type { Acceptance } from './acceptance.js';
import { THRESHOLDS } from './citations.js';
import type { ParameterDiagnosis } from './diagnose.js';

export type VerdictStatus = 'converged' | 'run-longer' | 'problems';

export interface Verdict {
  status: VerdictStatus;
  /** One sentence. */
  headline: string;
  /** The findings behind it, one sentence each. */
  findings: string[];
  /** Further steps suggested when the chains are too short (undefined when they are long enough). */
  moreSteps?: number;
}

interface VerdictInput {
  parameters: ParameterDiagnosis[];
  acceptance: Acceptance;
  nEnsembles: number;
  discard: number;
  keptSteps: number;
  tauMax: number;
  suggestedBurnIn: number;
  discardSuggested: boolean;
}

const fmt = (x: number, digits = 3): string => (Number.isFinite(x) ? Number(x.toPrecision(digits)).toLocaleString('en-US') : String(x));

/** Round up to two significant digits, so that suggestions read as the estimates they are. */
function roundUp2(x: number): number {
  if (x <= 0) return 0;
  const p = 10 ** Math.max(0, Math.floor(Math.log10(x)) - 1);
  return Math.ceil(x / p) * p;
}

export function verdict(d: VerdictInput): Verdict {
  const problems: string[] = [];
  const shortfalls: string[] = [];
  const notes: string[] = [];
  let neededKept = d.keptSteps;

  for (const p of d.parameters) {
    const name = p.info.name;
    if (p.nonFinite > 0) {
      problems.push(`${name} has ${p.nonFinite} non-finite draws.`);
      continue;
    }
    if (Number.isNaN(p.rhat)) {
      problems.push(`${name} does not vary: every walker holds one value (a parameter that should be fixed, or walkers that never moved).`);
      continue;
    }
    if (p.agreement?.disagree) {
      const a = p.agreement;
      problems.push(
        `${name}: the median of ensemble ${a.worst} is ${fmt(a.maxAbsZ, 2)} MCSE from the others' (p = ${a.pValue.toExponential(1)} after correcting for ${d.nEnsembles} ensembles); an ensemble may sit in another mode.`,
      );
    }
    if (!(p.rhat < THRESHOLDS.rhat)) {
      shortfalls.push(`${name}: R-hat ${fmt(p.rhat, 4)} (needs < ${THRESHOLDS.rhat}).`);
      // R-hat shrinks as chains lengthen, at no predictable rate; doubling is the usual next step.
      neededKept = Math.max(neededKept, 2 * d.keptSteps);
    }
    const essMin = Math.min(p.essBulk, p.essTail);
    if (!(essMin > THRESHOLDS.ess)) {
      shortfalls.push(`${name}: ${p.essBulk <= p.essTail ? 'bulk' : 'tail'} ESS ${fmt(essMin)} (needs > ${THRESHOLDS.ess}).`);
      // ESS grows in proportion to the chain length.
      if (essMin > 0) neededKept = Math.max(neededKept, (d.keptSteps * THRESHOLDS.ess * 1.1) / essMin);
    }
    if (!p.tau.reliable) {
      shortfalls.push(`${name}: the chains are ${fmt(d.keptSteps)} steps, fewer than ${THRESHOLDS.tauMultiple} tau = ${fmt(THRESHOLDS.tauMultiple * p.tauSteps)} (tau = ${fmt(p.tauSteps)} steps).`);
      neededKept = Math.max(neededKept, THRESHOLDS.tauMultiple * p.tauSteps * 1.1);
    }
  }
  for (const s of d.acceptance.stuck) {
    problems.push(`walker ${s.walker} of ensemble ${s.ensemble} is stuck: acceptance ${fmt(s.acceptance, 2)} against ${fmt(s.ensembleMedian, 2)} for its ensemble.`);
  }
  d.acceptance.perEnsemble.forEach((a, k) => {
    // Common practice for affine-invariant ensembles (references.md): 0.2 to 0.5 is healthy.
    if (a < 0.2 || a > 0.5) notes.push(`ensemble ${k} accepts ${fmt(a, 2)} of proposals; 0.2 to 0.5 is usual (common practice).`);
  });
  if (!d.discardSuggested && Number.isFinite(d.suggestedBurnIn) && d.discard < d.suggestedBurnIn) {
    notes.push(`the burn-in of ${fmt(d.discard)} steps is shorter than the suggested ${fmt(d.suggestedBurnIn)} (${THRESHOLDS.burnInTauMultiple} tau_max).`);
  }

  const moreSteps = neededKept > d.keptSteps ? roundUp2(neededKept - d.keptSteps) : undefined;
  if (problems.length > 0) {
    const headline = `Problems: ${problems.length === 1 ? 'one finding' : `${problems.length} findings`} need attention before these chains can be used${moreSteps ? `; the chains are also too short (about ${fmt(moreSteps)} more steps)` : ''}.`;
    return { status: 'problems', headline, findings: [...problems, ...shortfalls, ...notes], moreSteps };
  }
  if (shortfalls.length > 0) {
    const headline = `Run longer: about ${fmt(moreSteps ?? d.keptSteps)} more steps per walker (now ${fmt(d.keptSteps)} after a burn-in of ${fmt(d.discard)}).`;
    return { status: 'run-longer', headline, findings: [...shortfalls, ...notes], moreSteps: moreSteps ?? d.keptSteps };
  }
  const headline = `Converged: R-hat < ${THRESHOLDS.rhat}, bulk and tail ESS > ${THRESHOLDS.ess} and at least ${THRESHOLDS.tauMultiple} tau for every parameter${d.nEnsembles > 1 ? `; the ${d.nEnsembles} ensembles agree` : ''}; no stuck walkers.`;
  return { status: 'converged', headline, findings: notes };
}
