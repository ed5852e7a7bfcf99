/**
 * The diagnosis of a run: every parameter's statistics, acceptance, agreement between ensembles, a burn-in
 * suggestion and a verdict in words.
 *
 * Chain convention: R-hat and ESS treat every walker of every ensemble as one chain, K x W chains in all.
 * Why: (1) tau, as emcee estimates it, averages the walkers' autocorrelations, so per-walker chains give
 * ESS ~ K W N / tau in the same units as tau; (2) a walker that has stranded away from the others raises
 * the between-chain variance, which a per-ensemble average would hide; (3) the K ensembles are independent
 * and started apart, so differences between them also enter R-hat through their walkers. The walkers of
 * one ensemble are not independent Markov chains (each move uses the others' positions), which makes the
 * ESS somewhat optimistic; the agreement test between the independent ensembles covers that gap.
 */
import type { ParameterInfo } from '../core/parameters.js';
import { acceptance, type Acceptance } from './acceptance.js';
import type { Chains } from './chains.js';
import { THRESHOLDS } from './citations.js';
import { ensembleAgreement, type EnsembleAgreement } from './ensembleAgreement.js';
import { parameterDiagnostics, type ParameterDiagnostics } from './parameterDiagnostics.js';
import { verdict, type Verdict } from './verdict.js';

export const CHAIN_CONVENTION =
  'R-hat and ESS treat every walker of every ensemble as one chain: per-walker chains put ESS in the same units as tau (emcee averages the walkers\' autocorrelations), a stranded walker raises R-hat instead of being averaged away, and the independent ensembles\' differences enter R-hat through their walkers. Walkers of one ensemble are not independent chains, so the ESS is somewhat optimistic; the agreement test between ensembles covers that.';

export interface DiagnoseInput {
  parameters: readonly ParameterInfo[];
  /** Per parameter: nEnsembles x nWalkers chains (ensemble-major: chain k * nWalkers + w) of the kept draws. */
  draws: readonly Chains[];
  nEnsembles: number;
  nWalkers: number;
  /** Accepted proposals per chain (ensemble-major) over `acceptanceSteps` steps after the burn-in. */
  accepted: ArrayLike<number>;
  acceptanceSteps: number;
  /** Stored steps per walker in the run, the first `discard` of which were dropped as burn-in. */
  totalSteps: number;
  discard: number;
  /** Thinning of the draws given (their spacing in stored steps). */
  thin: number;
  /** True when `discard` is our own suggestion (then the verdict does not second-guess it). */
  discardSuggested?: boolean;
}

export interface ParameterDiagnosis extends ParameterDiagnostics {
  info: ParameterInfo;
  /** tau in stored steps (tau of the draws times thin). */
  tauSteps: number;
  agreement?: EnsembleAgreement;
}

export interface Diagnosis {
  parameters: ParameterDiagnosis[];
  acceptance: Acceptance;
  nEnsembles: number;
  nWalkers: number;
  totalSteps: number;
  discard: number;
  thin: number;
  /** Stored steps per walker after the burn-in. */
  keptSteps: number;
  tauMax: number;
  /** Burn-in suggested from tau: THRESHOLDS.burnInTauMultiple x tau_max, in stored steps. */
  suggestedBurnIn: number;
  verdict: Verdict;
  chainConvention: string;
}

export function diagnose(input: DiagnoseInput): Diagnosis {
  return diagnosisOf(
    input,
    input.parameters.map((_, i) => parameterDiagnostics(input.draws[i], input.nEnsembles)),
  );
}

/**
 * The diagnosis from each parameter's `parameterDiagnostics(input.draws[i], input.nEnsembles)` computed
 * elsewhere (e.g. on worker threads): what `diagnose` returns, value for value.
 */
export function diagnosisOf(input: DiagnoseInput, perParameter: readonly ParameterDiagnostics[]): Diagnosis {
  const { nEnsembles, nWalkers, thin } = input;
  if (perParameter.length !== input.parameters.length) throw new RangeError(`${perParameter.length} parameter diagnostics for ${input.parameters.length} parameters`);
  const parameters: ParameterDiagnosis[] = input.parameters.map((info, i) => {
    const p = perParameter[i];
    const agreement = ensembleAgreement(
      p.groups.map((g) => g.median),
      p.groups.map((g) => g.mcse),
    );
    return { ...p, info, tauSteps: p.tau.tau * thin, agreement };
  });
  const acc = acceptance(input.accepted, input.acceptanceSteps, nEnsembles, nWalkers);
  const taus = parameters.map((p) => p.tauSteps).filter(Number.isFinite);
  const tauMax = taus.length ? Math.max(...taus) : NaN;
  const keptSteps = input.totalSteps - input.discard;
  const suggestedBurnIn = Number.isFinite(tauMax) ? Math.ceil(THRESHOLDS.burnInTauMultiple * tauMax) : NaN;
  const base = { parameters, acceptance: acc, nEnsembles, nWalkers, totalSteps: input.totalSteps, discard: input.discard, thin, keptSteps, tauMax, suggestedBurnIn, chainConvention: CHAIN_CONVENTION };
  return { ...base, verdict: verdict({ ...base, discardSuggested: input.discardSuggested ?? false }) };
}
