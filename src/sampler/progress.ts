/**
 * Progress of a run, as an observer of its states: on a terminal, a cli-progress bar (steps, acceptance,
 * τ when known, best log-probability, ETA); elsewhere (nohup, batch jobs, logs) one plain line every
 * `intervalSeconds`; nothing when quiet. Output goes to stderr, so stdout carries only results
 * (src/cli/output.ts conventions).
 */
import cliProgress from 'cli-progress';
import type { RunInfo, RunObserver, RunResult } from './runEnsembles.js';
import type { EnsembleState } from './types.js';

export interface ProgressOptions {
  /** 'auto': a bar on a TTY, lines otherwise. Default 'auto'. */
  mode?: 'auto' | 'bar' | 'lines' | 'none';
  quiet?: boolean;
  stream?: NodeJS.WritableStream & { isTTY?: boolean };
  /** Seconds between plain lines; default 30. */
  intervalSeconds?: number;
  /** A clock in ms, for tests; default performance.now. */
  now?: () => number;
}

/** Running figures a display shows; kept apart from the display so both modes agree. */
class Tally {
  proposals = 0;
  accepts = 0;
  best = Number.NEGATIVE_INFINITY;
  firstStep: number | undefined;
  firstMs = 0;

  add(states: readonly EnsembleState[], nowMs: number): void {
    if (this.firstStep === undefined) {
      this.firstStep = states[0].step;
      this.firstMs = nowMs;
    }
    for (const s of states) {
      for (let w = 0; w < s.nWalkers; w++) {
        this.accepts += s.accepted[w];
        if (s.logProb[w] > this.best) this.best = s.logProb[w];
      }
      this.proposals += s.nWalkers;
    }
  }

  get acceptance(): number {
    return this.proposals > 0 ? this.accepts / this.proposals : Number.NaN;
  }
}

export function progressReporter(options: ProgressOptions = {}): RunObserver {
  const stream = options.stream ?? process.stderr;
  const now = options.now ?? (() => performance.now());
  let mode = options.mode ?? 'auto';
  if (options.quiet) mode = 'none';
  if (mode === 'auto') mode = stream.isTTY ? 'bar' : 'lines';
  if (mode === 'none') return { onStep: () => {} };
  const tally = new Tally();
  const tauText = (info: RunInfo): string => {
    if (!info.tau) return '-';
    const m = Math.max(...Array.from(info.tau).filter(Number.isFinite));
    return Number.isFinite(m) ? m.toFixed(1) : '-';
  };

  if (mode === 'bar') {
    const bar = new cliProgress.SingleBar(
      {
        stream,
        format: 'sampling [{bar}] {value}/{total} steps | acceptance {acc} | tau {tau} | best log-prob {best} | ETA {eta_formatted}',
        hideCursor: true,
        etaBuffer: 50,
        fps: 5,
      },
      cliProgress.Presets.shades_classic,
    );
    let started = false;
    let stopped = false;
    return {
      onStep(states, info) {
        tally.add(states, now());
        if (stopped) return;
        const payload = { acc: tally.acceptance.toFixed(3), tau: tauText(info), best: tally.best.toPrecision(6) };
        if (!started) {
          bar.start(info.maxSteps, info.step, payload);
          started = true;
        } else {
          bar.update(info.step, payload);
        }
      },
      onNotice(line) {
        // The bar redraws its line; stop it so that the notice (and what follows) stays readable.
        if (started && !stopped) bar.stop();
        stopped = true;
        stream.write(`${line}\n`);
      },
      onEnd() {
        if (started && !stopped) bar.stop();
        stopped = true;
      },
    };
  }

  const intervalMs = (options.intervalSeconds ?? 30) * 1000;
  let lastLine = Number.NEGATIVE_INFINITY;
  const line = (info: RunInfo, t: number, final: string): void => {
    const done = info.step - (tally.firstStep ?? info.step);
    const rateMs = done > 0 ? (t - tally.firstMs) / done : Number.NaN;
    const eta = Number.isFinite(rateMs) ? formatSeconds(((info.maxSteps - info.step) * rateMs) / 1000) : '-';
    stream.write(
      `step ${info.step}/${info.maxSteps} (${((100 * info.step) / info.maxSteps).toFixed(0)}%)  acceptance ${tally.acceptance.toFixed(3)}  tau ${tauText(info)}  best log-prob ${tally.best.toPrecision(6)}  ${final || `ETA ${eta}`}\n`,
    );
  };
  return {
    onNotice(line) {
      stream.write(`${line}\n`);
    },
    onStep(states, info) {
      const t = now();
      tally.add(states, t);
      if (t - lastLine >= intervalMs) {
        line(info, t, '');
        lastLine = t;
      }
    },
    onEnd(result: RunResult | undefined, info) {
      if (tally.firstStep !== undefined) line(info, now(), result ? `done (${result.stoppedBy})` : 'stopped');
    },
  };
}

function formatSeconds(s: number): string {
  if (s < 60) return `${Math.round(s)}s`;
  if (s < 3600) return `${Math.floor(s / 60)}m${String(Math.round(s % 60)).padStart(2, '0')}s`;
  return `${Math.floor(s / 3600)}h${String(Math.floor((s % 3600) / 60)).padStart(2, '0')}m`;
}
