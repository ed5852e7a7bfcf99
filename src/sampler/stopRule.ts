/**
 * When to stop. Fixed: after a given number of steps. Automatic: once the run is longer than
 * `tauMultiple` (50) integrated autocorrelation times for every parameter of every ensemble and τ moved by
 * less than `tauChange` (1%) since the previous check, up to a step cap: the practice documented with
 * emcee (Foreman-Mackey et al., "Autocorrelation analysis & convergence"; common practice); and, when a
 * `convergence` check is injected, once the history after the burn-in (2 tau_max) meets it too, so that
 * the run it hands over passes the verdict's R-hat and ESS thresholds rather than 50 tau alone.
 *
 * τ comes from an injected estimator (src/diagnostics provides the real one; the sampler may not import
 * it). To estimate τ the rule keeps each ensemble's recent history in memory, at most `historyRows` rows:
 * when full it drops every other row and records half as often from then on, so memory stays flat
 * however long the run. τ measured on a history kept every s steps is τ_rows x s, an overestimate when τ
 * falls below s, which only delays the stop.
 */
import type { EnsembleState } from './types.js';

/**
 * Integrated autocorrelation time of each parameter of one ensemble, in rows of `chain`.
 * `chain` is step-major then walker-major: value j of walker w at row t is at [(t nWalkers + w) ndim + j].
 * Return NaN for a parameter whose chain is too short to tell.
 */
export type TauEstimator = (chain: Float64Array, nRows: number, nWalkers: number, ndim: number) => Float64Array;

/**
 * Whether the ensembles' histories (one per ensemble, laid out as for TauEstimator, `nRows` rows each)
 * meet the run's convergence thresholds once the first `discardRows` rows are left out.
 */
export type ConvergenceCheck = (histories: readonly Float64Array[], nRows: number, nWalkers: number, ndim: number, discardRows: number) => boolean;

export type StopRule =
  | { kind: 'fixed'; steps: number }
  | {
      kind: 'auto';
      /** Step cap. */
      maxSteps: number;
      estimator: TauEstimator;
      /** Stop once steps > tauMultiple x τ_max; default 50. */
      tauMultiple?: number;
      /** ... and |Δτ| / τ < tauChange for every parameter since the last check; default 0.01. */
      tauChange?: number;
      /** Check every this many steps; default 100. */
      checkEvery?: number;
      /** Also required before stopping, once the tau criteria hold (src/diagnostics provides one). */
      convergence?: ConvergenceCheck;
      /** Rows of history kept per ensemble; default 4096. */
      historyRows?: number;
    };

/** What a checkpoint keeps of the automatic rule. */
export interface AutoStopState {
  stride: number;
  count: number;
  /** One history per ensemble, count x nWalkers x ndim values each. */
  rows: Float64Array[];
  /** τ per ensemble and parameter (ensemble-major) at the last check, in steps. */
  lastTau: Float64Array | null;
}

export interface StopCheck {
  /** τ in steps per parameter, the maximum over ensembles (NaN until estimable). */
  tau: Float64Array;
  converged: boolean;
}

/** Burn-in left out of the convergence check, in tau_max: as the verdict's suggested burn-in (common practice). */
const BURN_IN_TAU = 2;

export class AutoStop {
  readonly maxSteps: number;
  private readonly estimator: TauEstimator;
  private readonly tauMultiple: number;
  private readonly tauChange: number;
  private readonly convergence: ConvergenceCheck | undefined;
  readonly checkEvery: number;
  private readonly capacity: number;
  private readonly nWalkers: number;
  private readonly ndim: number;
  private stride = 1;
  private count = 0;
  private rows: Float64Array[];
  private lastTau: Float64Array | null = null;

  constructor(rule: Extract<StopRule, { kind: 'auto' }>, nEnsembles: number, nWalkers: number, ndim: number) {
    this.maxSteps = rule.maxSteps;
    this.estimator = rule.estimator;
    this.tauMultiple = rule.tauMultiple ?? 50;
    this.tauChange = rule.tauChange ?? 0.01;
    this.checkEvery = rule.checkEvery ?? 100;
    this.convergence = rule.convergence;
    this.capacity = rule.historyRows ?? 4096;
    if (!Number.isInteger(this.maxSteps) || this.maxSteps < 1) throw new RangeError(`the step cap must be a positive integer, got ${this.maxSteps}`);
    if (!Number.isInteger(this.checkEvery) || this.checkEvery < 1) throw new RangeError(`checkEvery must be a positive integer, got ${this.checkEvery}`);
    if (!Number.isInteger(this.capacity) || this.capacity < 16 || this.capacity % 2 !== 0) throw new RangeError(`historyRows must be an even integer >= 16, got ${this.capacity}`);
    this.nWalkers = nWalkers;
    this.ndim = ndim;
    this.rows = Array.from({ length: nEnsembles }, () => new Float64Array(this.capacity * nWalkers * ndim));
  }

  /** Record one step of every ensemble (states in ensemble order, all at the same step). */
  record(states: readonly EnsembleState[]): void {
    const step = states[0].step;
    if (step % this.stride !== 0) return;
    if (this.count === this.capacity) this.decimate();
    const size = this.nWalkers * this.ndim;
    for (let e = 0; e < states.length; e++) this.rows[e].set(states[e].positions, this.count * size);
    this.count++;
  }

  /** Keep the rows at multiples of twice the stride (every other one, starting with the second). */
  private decimate(): void {
    const size = this.nWalkers * this.ndim;
    for (const r of this.rows) {
      for (let i = 0; 2 * i + 1 < this.count; i++) r.copyWithin(i * size, (2 * i + 1) * size, (2 * i + 2) * size);
    }
    this.count = Math.floor(this.count / 2);
    this.stride *= 2;
  }

  /** Whether `step` is a check step. */
  due(step: number): boolean {
    return step % this.checkEvery === 0;
  }

  check(step: number): StopCheck {
    const { ndim } = this;
    const nE = this.rows.length;
    const tau = new Float64Array(nE * ndim);
    for (let e = 0; e < nE; e++) {
      const t = this.estimator(this.rows[e].subarray(0, this.count * this.nWalkers * ndim), this.count, this.nWalkers, ndim);
      for (let j = 0; j < ndim; j++) tau[e * ndim + j] = t[j] * this.stride;
    }
    let converged = true;
    const tauMax = new Float64Array(ndim).fill(Number.NaN);
    for (let e = 0; e < nE; e++) {
      for (let j = 0; j < ndim; j++) {
        const t = tau[e * ndim + j];
        if (!(t > 0) || !Number.isFinite(t)) {
          converged = false;
          continue;
        }
        if (!(tauMax[j] >= t)) tauMax[j] = t;
        if (!(step > this.tauMultiple * t)) converged = false;
        const prev = this.lastTau ? this.lastTau[e * ndim + j] : Number.NaN;
        if (!(Math.abs(prev - t) / t < this.tauChange)) converged = false;
      }
    }
    this.lastTau = tau;
    if (converged && this.convergence) {
      let tMax = 0;
      for (let j = 0; j < ndim; j++) tMax = Math.max(tMax, tauMax[j]);
      const size = this.count * this.nWalkers * ndim;
      converged = this.convergence(
        this.rows.map((r) => r.subarray(0, size)),
        this.count,
        this.nWalkers,
        ndim,
        (BURN_IN_TAU * tMax) / this.stride,
      );
    }
    return { tau: tauMax, converged };
  }

  get state(): AutoStopState {
    const size = this.nWalkers * this.ndim;
    return {
      stride: this.stride,
      count: this.count,
      rows: this.rows.map((r) => r.slice(0, this.count * size)),
      lastTau: this.lastTau ? new Float64Array(this.lastTau) : null,
    };
  }

  restore(s: AutoStopState): void {
    if (s.rows.length !== this.rows.length || s.count > this.capacity) throw new RangeError('the saved stop-rule history does not match this run (number of ensembles or history size)');
    this.stride = s.stride;
    this.count = s.count;
    s.rows.forEach((r, e) => this.rows[e].set(r));
    this.lastTau = s.lastTau ? new Float64Array(s.lastTau) : null;
  }
}
