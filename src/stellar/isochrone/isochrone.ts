/**
 * `isochrone(logAgeYr, feh, options)`: the built-in model's isochrone, from the main sequence at 0.1 Msun
 * to the end of the early AGB (the first thermal pulse).
 *
 * How it is built (design notes for speed and for the likelihood, which integrates along the polyline):
 *  1. [Fe/H] -> Z (Salaris et al. 1993); the per-Z model is cached (`evolutionModel`).
 *  2. The initial masses where phases change are found by bracketed root finding on the phase end times
 *     (`boundaries.ts`). Each phase is one interval of initial mass.
 *  3. Wind losses come from a few reference tracks over the post-main-sequence mass range
 *     (`massLossInterpolant.ts`).
 *  4. Nodes are placed adaptively. Each interval is seeded, then any segment whose ends differ by more than
 *     the step limit in any requested band (or in log Teff, or in phase fraction) is split into as many
 *     pieces as the excess requires, with the new masses chosen in a variable in which the track is nearly
 *     linear (log M on the main sequence; time to the core law's singularity on the giant branches, where
 *     geometric steps are even steps in log L). Rounds repeat until no segment is too long. The post-main-
 *     sequence phases span a tiny range of initial mass, so nodes there are dense in mass automatically.
 *  5. Photometry is called once per round on the batch of new nodes (contiguous in the node store).
 *
 * Phase coordinate: phase + 0.999 f with f in [0, 1]: on the main sequence f = (1 - tau^2) h(M) + tau^2,
 * tau = t/t_MS, h(M) = ln(M/0.1)/ln(1000) (mass-like for unevolved stars, tau-like near the turnoff; see
 * `mainSequenceCoordinate`); the time fraction in the Hertzsprung gap and in core helium burning; and the
 * fraction of the phase's rise in log L on the giant branch and the early AGB. It rises strictly along the
 * isochrone (each of these rises with initial mass at fixed age) and marks the same evolutionary point at
 * neighbouring ages and metallicities. The gap of 0.001
 * between phases keeps the tip of the giant branch (3.999) apart from the zero-age horizontal branch
 * (4.000), which a low-mass star reaches by a jump (the helium flash).
 */
import type { BandId } from '../../core/bands.js';
import { ModelError } from '../../core/errors.js';
import { Phase, type Isochrone, type PhotometryModel } from '../types.js';
import { fehToZ } from '../evolution/metallicity.js';
import { DEFAULT_REIMERS_ETA } from '../evolution/massLoss.js';
import { evolutionModel, Z_MAX_ACCEPTED, Z_RANGE } from '../evolution/model.js';
import { tMainSequence } from '../evolution/mainSequence.js';
import { bracketedRoot } from '../evolution/rootFind.js';
import type { EvolutionModel } from '../evolution/types.js';
import { earlyBoundaries, phaseIntervals, upperMass, type PhaseInterval } from './boundaries.js';
import { MassLossInterpolant } from './massLossInterpolant.js';
import { NodeEvaluator } from './nodeEvaluator.js';
import { NodeStore } from './nodeStore.js';
import { builtinPhotometry } from '../photometry/index.js';
import { builtinProvenance } from './provenance.js';

export const LOG_AGE_RANGE: readonly [number, number] = [8.0, 10.15];

export interface IsochroneOptions {
  /** Turns (log L, log Teff, log g, [Fe/H]) into absolute magnitudes; the built-in calibration by default. */
  photometry?: PhotometryModel;
  /** Bands to compute (each must be one of `photometry.bands`). */
  bands: readonly BandId[];
  /** [alpha/Fe] for the [Fe/H] -> [M/H] conversion (Salaris et al. 1993); 0 by default. */
  alphaFe?: number;
  /** Reimers eta (HPT2000 section 7.1); 0.5 by default. */
  eta?: number;
  /** Largest magnitude step between adjacent nodes from the turnoff to the horizontal branch; 0.01. */
  maxStepMag?: number;
  /** Largest magnitude step on the lower main sequence and the early AGB; 0.1. */
  maxStepMagSparse?: number;
}

/**
 * Largest log Teff steps (dense / sparse regions). The band limits above are what the likelihood needs; this
 * guard keeps the colour resolved whatever bands are requested (0.005 dex is about 0.02 mag in B-V).
 */
const MAX_STEP_LOGTEFF = 0.005;
const MAX_STEP_LOGTEFF_SPARSE = 0.02;
/**
 * The main sequence counts as "turnoff" (dense nodes) within this many dex in L of its end: 1 mag, plus a
 * margin so that the whole magnitude below the turnoff is dense wherever the turnoff is measured from.
 */
const TURNOFF_DEPTH_LOGL = 0.45;
/** Largest step in phase fraction, and near the end of the main sequence (resolves the hook). */
const MAX_STEP_FRACTION = 0.05;
const MAX_STEP_FRACTION_HOOK = 0.002;
const HOOK_REGION = 0.97;
const PHASE_GAP = 0.999;
/** First and largest fractional margin of the wind reference tracks above the dry end of the EAGB. */
const UPPER_PAD = 2e-3;
const MAX_UPPER_PAD = 0.2;
const MAX_ROUNDS = 16;
/**
 * Pieces per split and round, in phases whose spacing variable only roughly linearises the track (all but
 * the giant branches): splitting a strongly curved segment evenly in one go wastes nodes where it is flat.
 */
const MAX_PIECES_CURVED = 4;
const OVERSPLIT = 1.05;
/** Seeds per interval (pieces) for the post-main-sequence phases. */
const SEED_PIECES: Record<number, number> = {
  [Phase.HertzsprungGap]: 4,
  [Phase.GiantBranch]: 12,
  [Phase.CoreHeliumBurning]: 8,
  [Phase.EarlyAGB]: 8,
};
/** Main-sequence seeds: log-uniform in mass, plus these fractions of the main-sequence lifetime. */
const MS_SEEDS_LOG = 16;
const MS_SEED_FRACTIONS = [0.5, 0.8, 0.9, 0.95, 0.97, 0.98, 0.99, 0.995, 0.998, 0.999];

const store = new NodeStore();
/** Work counts of the last build, for benchmarks and tests. */
export const lastBuildStats = { nodes: 0, exactEvaluations: 0, rounds: 0, curvePieces: [0, 0, 0, 0] };
const evaluator = new NodeEvaluator();
const losses = new MassLossInterpolant();

interface Build {
  model: EvolutionModel;
  tMyr: number;
  feh: number;
  maxStep: number;
  maxStepSparse: number;
  logLTurnoff: number;
  bandIndex: number[];
  photometry: PhotometryModel;
  bands: readonly BandId[];
}

function evaluateInto(i: number, m0: number, phase: Phase, b: Build): boolean {
  evaluator.evaluate(m0, phase);
  store.m0[i] = m0;
  store.mass[i] = evaluator.mass;
  store.logL[i] = evaluator.logL;
  store.logTeff[i] = evaluator.logTeff;
  store.logg[i] = evaluator.logg;
  store.fraction[i] = evaluator.fraction;
  store.coordinate[i] = evaluator.coordinate;
  store.spacing[i] = evaluator.spacing;
  store.phase[i] = phase;
  store.dense[i] =
    phase === Phase.EarlyAGB ? 0 : phase !== Phase.MainSequence || evaluator.logL >= b.logLTurnoff - TURNOFF_DEPTH_LOGL ? 1 : 0;
  return !evaluator.dead;
}

/**
 * Insert n - 1 nodes between a and b, linked in order, splitting the segment evenly in the phase's spacing
 * variable: ln M on the main sequence; on the giant branches ln w, w the time left to the core law's
 * singularity, mapped back to mass linearly; elsewhere M.
 */
function insertBetween(a: number, b: number, n: number, phase: Phase, build: Build): void {
  let prev = a;
  const ma = store.m0[a];
  const mb = store.m0[b];
  // mass(s) = ma + dm * (exp(rate * s) - 1) / span for s in (0, 1); linear when rate is 0.
  let rate = 0;
  let scale = mb - ma;
  if (phase === Phase.MainSequence) {
    rate = Math.log(mb / ma);
    scale = ma;
  } else if (phase === Phase.GiantBranch || phase === Phase.EarlyAGB) {
    const wa = store.spacing[a];
    const wb = store.spacing[b];
    if (wa > 0 && wb > 0 && Math.abs(wb - wa) > 1e-12 * wa) {
      rate = Math.log(wb / wa);
      scale = ((mb - ma) * wa) / (wb - wa);
    }
  }
  for (let i = 1; i < n; i++) {
    const u = i / n;
    const m = rate === 0 ? ma + scale * u : ma + scale * (Math.exp(rate * u) - 1);
    if (!(m > ma && m < mb)) continue;
    const k = store.add();
    evaluateInto(k, m, phase, build);
    store.next[prev] = k;
    prev = k;
  }
  store.next[prev] = b;
}

/** Main-sequence seeds: returns the head of the list. */
function seedMainSequence(iv: PhaseInterval, build: Build): number {
  const masses: number[] = [];
  for (let i = 0; i <= MS_SEEDS_LOG; i++) masses.push(iv.mLo * (iv.mHi / iv.mLo) ** (i / MS_SEEDS_LOG));
  const f = (m: number, tau: number): number => tMainSequence(build.model, m) - build.tMyr / tau;
  for (const tau of MS_SEED_FRACTIONS) {
    const fLo = f(iv.mLo, tau);
    const fHi = f(iv.mHi, tau);
    if (fLo > 0 && fHi < 0) masses.push(bracketedRoot((m) => f(m, tau), iv.mLo, iv.mHi, fLo, fHi, 1e-10));
  }
  masses.sort((x, y) => x - y);
  // The turnoff end first: its luminosity sets which main-sequence nodes count as dense.
  const top = store.add();
  evaluateInto(top, iv.mHi, Phase.MainSequence, build);
  build.logLTurnoff = store.logL[top];
  let head = -1;
  let prev = -1;
  for (const m of masses) {
    if (prev >= 0 && m <= store.m0[prev] * (1 + 1e-12)) continue;
    if (m >= iv.mHi * (1 - 1e-12)) break;
    const k = store.add();
    evaluateInto(k, m, Phase.MainSequence, build);
    if (prev >= 0) store.next[prev] = k;
    else head = k;
    prev = k;
  }
  store.next[prev] = top;
  return head;
}

/**
 * Seeds of a post-main-sequence interval. If the envelope is exhausted inside it (the star becomes a
 * remnant), the interval is cut at that mass and `truncated` is set.
 */
function seedPostMS(iv: PhaseInterval, build: Build): { head: number; truncated: boolean } {
  const a = store.add();
  const aliveA = evaluateInto(a, iv.mLo, iv.phase, build);
  if (!aliveA) return { head: -1, truncated: true };
  const b = store.add();
  let truncated = false;
  if (!evaluateInto(b, iv.mHi, iv.phase, build)) {
    let lo = iv.mLo;
    let hi = iv.mHi;
    for (let i = 0; i < 60 && hi - lo > 1e-13 * hi; i++) {
      const mid = 0.5 * (lo + hi);
      evaluator.evaluate(mid, iv.phase);
      if (evaluator.dead) hi = mid;
      else lo = mid;
    }
    evaluateInto(b, lo, iv.phase, build);
    truncated = true;
  }
  store.next[a] = b;
  insertBetween(a, b, SEED_PIECES[iv.phase], iv.phase, build);
  return { head: a, truncated };
}

/** Two segment queues (current and next round), reused between builds. */
const queues: Int32Array[] = [new Int32Array(1024), new Int32Array(1024)];

/** Queue `which`, grown (keeping its contents) to hold at least `size` entries. */
function queueScratch(which: number, size: number): Int32Array {
  let q = queues[which];
  if (q.length < size) {
    const grown = new Int32Array(Math.max(size, 2 * q.length));
    grown.set(q);
    queues[which] = q = grown;
  }
  return q;
}

function swapQueues(): void {
  const t = queues[0];
  queues[0] = queues[1];
  queues[1] = t;
}

function photometryBatch(from: number, to: number, build: Build): void {
  if (to <= from) return;
  const out = build.bandIndex.map((_, j) => store.mags[j].subarray(from, to));
  build.photometry.absoluteMagnitudes(
    build.bands,
    store.logL.subarray(from, to),
    store.logTeff.subarray(from, to),
    store.logg.subarray(from, to),
    build.feh,
    out,
    to - from,
  );
}

/** How many pieces the segment (a, b) needs (1 if it is fine). */
function piecesNeeded(a: number, b: number, build: Build): number {
  const dense = store.dense[a] === 1 || store.dense[b] === 1;
  const limMag = dense ? build.maxStep : build.maxStepSparse;
  const limTeff = dense ? MAX_STEP_LOGTEFF : MAX_STEP_LOGTEFF_SPARSE;
  const phase = store.phase[a];
  const limF = phase === Phase.MainSequence && store.fraction[b] > HOOK_REGION ? MAX_STEP_FRACTION_HOOK : MAX_STEP_FRACTION;
  let r = Math.abs(store.logTeff[b] - store.logTeff[a]) / limTeff;
  r = Math.max(r, Math.abs(store.fraction[b] - store.fraction[a]) / limF);
  for (let j = 0; j < store.nBands; j++) r = Math.max(r, Math.abs(store.mags[j][b] - store.mags[j][a]) / limMag);
  if (!(r > 1)) return 1;
  // Stop splitting segments that are already a negligible mass apart (a genuine jump in the model).
  if (store.m0[b] - store.m0[a] <= 1e-12 * store.m0[b]) return 1;
  const n = Math.ceil(r * OVERSPLIT);
  return phase === Phase.GiantBranch || phase === Phase.EarlyAGB ? Math.min(256, n) : Math.min(MAX_PIECES_CURVED, n);
}

export function isochrone(logAgeYr: number, feh: number, options: IsochroneOptions): Isochrone {
  const alphaFe = options.alphaFe ?? 0;
  const eta = options.eta ?? DEFAULT_REIMERS_ETA;
  const bands = options.bands;
  const photometry = options.photometry ?? builtinPhotometry();
  if (!(logAgeYr >= LOG_AGE_RANGE[0] && logAgeYr <= LOG_AGE_RANGE[1])) {
    throw new ModelError(`log10(age/yr) = ${logAgeYr} is outside the built-in model's range`, {
      found: logAgeYr,
      expected: `${LOG_AGE_RANGE[0]} to ${LOG_AGE_RANGE[1]}`,
      hint: 'ages below 10^8 yr need pre-main-sequence models, which the built-in model lacks; bring an isochrone grid for them',
    });
  }
  const Z = fehToZ(feh, alphaFe);
  if (!(Z >= Z_RANGE[0] * (1 - 1e-9) && Z <= Z_MAX_ACCEPTED * (1 + 1e-9))) {
    throw new ModelError(`[Fe/H] = ${feh} (Z = ${Z.toPrecision(3)}) is outside the built-in model's metallicity range`, {
      found: feh,
      expected: `Z from ${Z_RANGE[0]} to ${Z_MAX_ACCEPTED.toPrecision(3)} (the Hurley, Pols & Tout 2000 fits, solar Z = 0.02)`,
      hint: 'use a user-supplied isochrone grid for more extreme metallicities',
    });
  }
  if (!(eta >= 0)) throw new ModelError(`Reimers eta = ${eta} must be >= 0`, { found: eta, expected: 'a number >= 0 (0.5 is the paper\'s value)' });
  for (const band of bands) {
    if (!photometry.bands.includes(band)) {
      throw new ModelError(`band ${band} is not provided by the photometric calibration`, {
        found: band,
        expected: photometry.bands.join(', '),
      });
    }
  }
  const model = evolutionModel(Z);
  const tMyr = 10 ** (logAgeYr - 6);
  const build: Build = {
    model,
    tMyr,
    feh,
    maxStep: options.maxStepMag ?? 0.01,
    maxStepSparse: options.maxStepMagSparse ?? 0.1,
    logLTurnoff: Number.POSITIVE_INFINITY,
    bandIndex: bands.map((_, i) => i),
    photometry,
    bands,
  };

  const early = earlyBoundaries(model, tMyr, eta);
  // The wind reference tracks span the post-main-sequence stars: from the turnoff to a bound on the last
  // living star, widened (rarely: strong winds) until the end of the early AGB falls inside it.
  let intervals: PhaseInterval[];
  for (let pad = UPPER_PAD; ; pad *= 8) {
    const mUpper = upperMass(early, pad);
    losses.build(model, eta, early.mTMS, mUpper);
    intervals = phaseIntervals(model, tMyr, eta, early, losses, mUpper);
    if (intervals[intervals.length - 1].mHi < mUpper * (1 - 1e-9) || pad * 8 > MAX_UPPER_PAD) break;
  }
  evaluator.setup(model, tMyr, eta, losses, intervals);
  store.reset(bands.length);

  const heads: number[] = [];
  for (const iv of intervals) {
    if (iv.phase === Phase.MainSequence) {
      heads.push(seedMainSequence(iv, build));
      continue;
    }
    const { head, truncated } = seedPostMS(iv, build);
    if (head >= 0) heads.push(head);
    if (truncated) break;
  }

  // Refinement rounds. Only segments made in the previous round are checked again (a segment that passed
  // keeps its ends), in list order, so that new nodes are appended in list order.
  let queue = queueScratch(0, store.n);
  let nQueue = 0;
  for (const head of heads) for (let a = head; store.next[a] !== -1; a = store.next[a]) queue[nQueue++] = a;
  let from = 0;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    photometryBatch(from, store.n, build);
    from = store.n;
    let next = queueScratch(1, 0);
    let nNext = 0;
    for (let q = 0; q < nQueue; q++) {
      const a = queue[q];
      const b = store.next[a];
      const n = piecesNeeded(a, b, build);
      if (n === 1) continue;
      const first = store.n;
      insertBetween(a, b, n, store.phase[a], build);
      next = queueScratch(1, nNext + 1 + store.n - first);
      next[nNext++] = a;
      for (let k = first; k < store.n; k++) next[nNext++] = k;
    }
    lastBuildStats.rounds = round + 1;
    if (store.n === from) break;
    swapQueues();
    queue = queueScratch(0, 0);
    nQueue = nNext;
  }
  photometryBatch(from, store.n, build);
  lastBuildStats.nodes = store.n;
  lastBuildStats.exactEvaluations = evaluator.exactEvaluations();
  lastBuildStats.curvePieces = evaluator.curvePieces();

  return assemble(heads, logAgeYr, feh, alphaFe, eta, bands, photometry);
}

/** Node order of the last build, reused (no allocation per build). */
let order = new Int32Array(1024);

function assemble(heads: number[], logAgeYr: number, feh: number, alphaFe: number, eta: number, bands: readonly BandId[], photometry: PhotometryModel): Isochrone {
  // Order, dropping a phase's last node where the next phase starts at the very same point.
  if (order.length < store.n) order = new Int32Array(Math.max(store.n, 2 * order.length));
  let n = 0;
  for (const head of heads) {
    if (n > 0) {
      const last = order[n - 1];
      if (Math.abs(store.logL[last] - store.logL[head]) < 1e-7 && Math.abs(store.logTeff[last] - store.logTeff[head]) < 1e-7) n--;
    }
    for (let k = head; k !== -1; k = store.next[k]) order[n++] = k;
  }
  const massInitial = new Float64Array(n);
  const massCurrent = new Float64Array(n);
  const phase = new Uint8Array(n);
  const phaseCoord = new Float64Array(n);
  const logL = new Float64Array(n);
  const logTeff = new Float64Array(n);
  const logg = new Float64Array(n);
  const absMag = bands.map(() => new Float64Array(n));
  const { m0, mass, coordinate } = store;
  const sPhase = store.phase;
  const sLogL = store.logL;
  const sLogTeff = store.logTeff;
  const sLogg = store.logg;
  for (let i = 0; i < n; i++) {
    const k = order[i];
    massInitial[i] = m0[k];
    massCurrent[i] = mass[k];
    phase[i] = sPhase[k];
    phaseCoord[i] = sPhase[k] + PHASE_GAP * Math.min(1, Math.max(0, coordinate[k]));
    logL[i] = sLogL[k];
    logTeff[i] = sLogTeff[k];
    logg[i] = sLogg[k];
  }
  for (let j = 0; j < bands.length; j++) {
    const from = store.mags[j];
    const to = absMag[j];
    for (let i = 0; i < n; i++) to[i] = from[order[i]];
  }
  return {
    logAgeYr,
    feh,
    massInitial,
    massCurrent,
    phase,
    phaseCoord,
    logL,
    logTeff,
    logg,
    bands: [...bands],
    absMag,
    provenance: builtinProvenance(alphaFe, photometry, eta),
  };
}

