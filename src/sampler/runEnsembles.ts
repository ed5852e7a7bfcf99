/**
 * The run loop: K independent ensembles stepped together over one evaluator (so their evaluations share
 * the worker pool), their states handed to the chain sink and to observers (progress), checkpoints written
 * every N steps or T seconds, a stop rule, and a clean stop on SIGINT/SIGTERM. Everything here consumes
 * the samplers' generators; the samplers know nothing of it.
 *
 * Order of events at each step: all ensembles take the step; observers see the states; states at
 * multiples of `thin` go to the sink; the stop rule records them; then, if a check is due, τ is estimated;
 * then, if the run is stopping (steps reached, converged, cap, or a signal) or a checkpoint is due, the sink
 * is flushed and the checkpoint written. A resumed run replays the same sequence from its checkpoint, so
 * its chain is bit-identical to a run that never stopped.
 */
import { InterruptedError } from '../core/errors.js';
import type { ChainSink } from './chainSink.js';
import { readCheckpoint, writeCheckpoint, type Checkpoint } from './checkpoint.js';
import { EnsembleSampler, type EnsembleSamplerOptions } from './ensembleSampler.js';
import type { Evaluator } from './evaluator.js';
import { initializeEnsemble, type InitMethod, type OptimumReport } from './initialize.js';
import type { Move, WeightedMove } from './moves/move.js';
import { SamplerRng } from './rng.js';
import { AutoStop, type StopRule } from './stopRule.js';
import type { EnsembleState } from './types.js';

export interface RunInfo {
  /** Steps taken by every ensemble. */
  step: number;
  /** The step count the run stops at at the latest. */
  maxSteps: number;
  nEnsembles: number;
  /** τ in steps, max over ensembles, per parameter, from the last check of the automatic rule. */
  tau?: Float64Array;
}

export interface RunResult {
  steps: number;
  stoppedBy: 'steps' | 'converged' | 'cap';
  tau?: Float64Array;
  /** Acceptance fraction of each ensemble over the whole run. */
  acceptance: number[];
}

/** Something that watches the run: progress displays, logs. */
export interface RunObserver {
  onStep(states: readonly EnsembleState[], info: RunInfo): void;
  /** A line for the user while the run goes on (e.g. that a signal was received). */
  onNotice?(line: string): void;
  /** The run ended: with its result, or undefined when it was interrupted or failed. */
  onEnd?(result: RunResult | undefined, info: RunInfo): void;
}

export interface CheckpointOptions {
  path: string;
  /** Write every this many steps (default 1000). */
  everySteps?: number;
  /** ... or when this many seconds have passed since the last one (default 600). */
  everySeconds?: number;
  /** Stored verbatim in the checkpoint (seed, config, ...); JSON-serialisable. */
  meta?: unknown;
}

export interface RunOptions {
  samplers: readonly EnsembleSampler[];
  stop: StopRule;
  thin?: number;
  sink?: ChainSink;
  checkpoint?: CheckpointOptions;
  observers?: readonly RunObserver[];
  /** Stop cleanly on SIGINT and SIGTERM (default true). */
  handleSignals?: boolean;
  /** Shown after an interruption: how to resume (e.g. the command line). */
  resumeHint?: string;
  /** The checkpoint the samplers were rebuilt from, when resuming. */
  resumedFrom?: Checkpoint;
}

export async function runEnsembles(options: RunOptions): Promise<RunResult> {
  const { samplers, stop } = options;
  const thin = options.thin ?? 1;
  if (samplers.length === 0) throw new RangeError('no ensembles to run');
  const cap = stop.kind === 'auto' ? stop.maxSteps : stop.steps;
  if (!Number.isInteger(cap) || cap < 0) throw new RangeError(`the number of steps must be a non-negative integer, got ${cap}`);
  if (!Number.isInteger(thin) || thin < 1) throw new RangeError(`thin must be a positive integer, got ${thin}`);
  const step0 = samplers[0].step;
  if (samplers.some((s) => s.step !== step0)) throw new RangeError('all ensembles must start at the same step');
  const { nWalkers, ndim } = samplers[0];
  const auto = stop.kind === 'auto' ? new AutoStop(stop, samplers.length, nWalkers, ndim) : undefined;
  const maxSteps = stop.kind === 'auto' ? stop.maxSteps : stop.steps;
  const cp = options.checkpoint;
  const everySteps = cp?.everySteps ?? 1000;
  const everyMs = (cp?.everySeconds ?? 600) * 1000;
  const sink = options.sink;
  const observers = options.observers ?? [];
  const resumed = options.resumedFrom;
  let elapsedBefore = 0;
  if (resumed) {
    if (resumed.thin !== thin) throw new RangeError(`the run being resumed stored every ${resumed.thin} steps; resume it with the same thin, not ${thin}`);
    if (auto) {
      if (!resumed.autoStop) throw new RangeError('the run being resumed used a fixed number of steps; resume it with the same stop rule');
      auto.restore(resumed.autoStop);
    }
    elapsedBefore = resumed.elapsedSeconds;
    if (sink) {
      if (!sink.rewind) throw new Error('this chain sink cannot rewind, so it cannot continue a resumed run');
      await sink.rewind(resumed.ensembles.map((e) => e.step));
    }
  }

  let signalled: NodeJS.Signals | undefined;
  const onSignal = (sig: NodeJS.Signals): void => {
    if (signalled === undefined) {
      signalled = sig;
      for (const o of observers) o.onNotice?.(`${sig} received: stopping after the current step (send it again to stop at once, without a checkpoint)`);
      return;
    }
    // A second signal: the user does not want to wait. Restore the default action and re-raise it.
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    process.kill(process.pid, sig);
  };
  const handleSignals = options.handleSignals ?? true;
  if (handleSignals) {
    process.on('SIGINT', onSignal);
    process.on('SIGTERM', onSignal);
  }
  const t0 = performance.now();
  let lastCheckpointMs = t0;
  const info: RunInfo = { step: step0, maxSteps, nEnsembles: samplers.length };
  const saveCheckpoint = async (step: number): Promise<void> => {
    if (sink) await sink.flush();
    if (!cp) return;
    writeCheckpoint(cp.path, {
      step,
      thin,
      elapsedSeconds: elapsedBefore + (performance.now() - t0) / 1000,
      meta: cp.meta,
      ensembles: samplers.map((s) => s.snapshot()),
      autoStop: auto ? auto.state : null,
    });
    lastCheckpointMs = performance.now();
  };

  const generators = samplers.map((s) => s.sample());
  let result: RunResult | undefined;
  try {
    let step = step0;
    let stoppedBy: RunResult['stoppedBy'] | undefined = step >= maxSteps ? (stop.kind === 'auto' ? 'cap' : 'steps') : undefined;
    while (stoppedBy === undefined) {
      const next = await Promise.all(generators.map((g) => g.next()));
      const states = next.map((n) => {
        if (n.done) throw new Error('an ensemble generator ended unexpectedly');
        return n.value;
      });
      step = states[0].step;
      info.step = step;
      if (step % thin === 0) {
        if (sink) for (const s of states) await sink.append(s);
      }
      if (auto) {
        auto.record(states);
        if (auto.due(step)) {
          const c = auto.check(step);
          info.tau = c.tau;
          if (c.converged) stoppedBy = 'converged';
        }
      }
      if (stoppedBy === undefined && step >= maxSteps) stoppedBy = stop.kind === 'auto' ? 'cap' : 'steps';
      for (const o of observers) o.onStep(states, info);
      if (stoppedBy !== undefined) break;
      if (signalled) {
        await saveCheckpoint(step);
        const where = cp ? `; the checkpoint ${cp.path} holds step ${step}` : ' (no checkpoint was configured, so the run cannot be resumed)';
        throw new InterruptedError(`interrupted by ${signalled} after step ${step}${where}${cp && options.resumeHint ? `; resume with: ${options.resumeHint}` : ''}`);
      }
      if (cp && (step % everySteps === 0 || performance.now() - lastCheckpointMs >= everyMs)) await saveCheckpoint(step);
    }
    await saveCheckpoint(step);
    result = {
      steps: step,
      stoppedBy: stoppedBy ?? 'steps',
      tau: info.tau,
      acceptance: samplers.map((s) => {
        const a = s.acceptanceFraction();
        return a.reduce((x, y) => x + y, 0) / a.length;
      }),
    };
    return result;
  } finally {
    if (handleSignals) {
      process.off('SIGINT', onSignal);
      process.off('SIGTERM', onSignal);
    }
    await Promise.all(generators.map((g) => g.return(undefined)));
    if (sink) await sink.close();
    for (const o of observers) o.onEnd?.(result, info);
  }
}

export interface CreateEnsemblesOptions {
  evaluator: Evaluator;
  /** The run seed, an integer in [0, 2^32); ensemble k draws from the stream (seed, k). */
  seed: number;
  nEnsembles?: number;
  nWalkers: number;
  moves?: Move | readonly WeightedMove[];
  init: InitMethod;
  randomizeSplit?: boolean;
  /** Draws per walker before initialisation gives up; default 100. */
  maxAttempts?: number;
}

/** Start K ensembles (default 4), each from its own stream of the run seed; initialised concurrently. */
export async function createEnsembles(options: CreateEnsemblesOptions): Promise<{ samplers: EnsembleSampler[]; optima: (OptimumReport | undefined)[] }> {
  const nEnsembles = options.nEnsembles ?? 4;
  if (!Number.isInteger(nEnsembles) || nEnsembles < 1) throw new RangeError(`the number of ensembles must be a positive integer, got ${nEnsembles}`);
  const made = await Promise.all(
    Array.from({ length: nEnsembles }, async (_, k) => {
      const rng = SamplerRng.fromSeed(options.seed, k);
      const start = await initializeEnsemble(options.init, { nWalkers: options.nWalkers, evaluator: options.evaluator, rng, maxAttempts: options.maxAttempts, ensemble: k });
      const sampler = new EnsembleSampler({ evaluator: options.evaluator, moves: options.moves, randomizeSplit: options.randomizeSplit, ensemble: k }, rng, start);
      return { sampler, optimum: start.optimum };
    }),
  );
  return { samplers: made.map((m) => m.sampler), optima: made.map((m) => m.optimum) };
}

/** Read a checkpoint and rebuild its ensembles; pass both to `runEnsembles` (as `samplers`, `resumedFrom`). */
export function resumeEnsembles(path: string, options: Omit<EnsembleSamplerOptions, 'ensemble'>): { samplers: EnsembleSampler[]; checkpoint: Checkpoint } {
  const checkpoint = readCheckpoint(path);
  const samplers = checkpoint.ensembles.map((snap) => EnsembleSampler.fromSnapshot(options, snap));
  return { samplers, checkpoint };
}
