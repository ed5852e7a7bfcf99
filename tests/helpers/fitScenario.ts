/**
 * Simulate a cluster with `coeval simulate`'s library function and fit it with `fit()`, in a temporary
 * folder: the injection-recovery and golden-file tests share this. Catalogues have B, V, I, a selection
 * window from 4 mag below the turnoff (the simulator's default), no binaries (the binary term is too slow
 * for CI; the fit fixes f_binary = 0), and a uniform field.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseConfigText, parseSimulationConfigText } from '../../src/config/index.js';
import { fit, type FitResult } from '../../src/pipeline/fit.js';
import { simulateCluster } from '../../src/pipeline/simulate.js';

export interface Scenario {
  name: string;
  seed: number;
  stars: number;
  logAge: number;
  feh: number;
  dm: number;
  ebv: number;
  fField: number;
}

export interface ScenarioFit {
  /** Prior half-widths around the truth; the prior is uniform and clipped to the built-in model's range. */
  width?: { log_age: number; feh: number; dm: number; ebv: number };
  walkers: number;
  ensembles: number;
  steps: number;
  workers: number;
  /** Nelder-Mead starts of the initialisation (config sampler.init_starts); default 2. */
  initStarts?: number;
  /** Posterior draws for the per-star results (stars.arrow); default 20. */
  starDraws?: number;
  /** Extra lines for the fit config's [sampler]. */
  sampler?: string;
}

/** Write the catalogue and truth of a scenario into `dir` (returns the limits used, for the fit config). */
export async function simulateScenario(dir: string, s: Scenario): Promise<{ limits: string }> {
  const text = `[simulate]\nseed = ${s.seed}\nstars = ${s.stars}\nbands = ["B", "V", "I"]\noutput = "${s.name}.csv"\n[simulate.truth]\nlog_age = ${s.logAge}\nfeh = ${s.feh}\ndm = ${s.dm}\nebv = ${s.ebv}\nf_field = ${s.fField}\n`;
  const loaded = parseSimulationConfigText(text, { baseDir: dir });
  await simulateCluster(loaded);
  // The simulator filled in its default window and error law; the fit uses the same.
  const lik = loaded.config.likelihood;
  const limits = (['B', 'V', 'I'] as const)
    .map((b) => {
      const l = lik.limits[b] as { bright: number; faint: number };
      const e = lik.errors[b] as { a: number; b: number; m_ref: number };
      return `[likelihood.limits.${b}]\nbright = ${l.bright}\nfaint = ${l.faint}\n[likelihood.errors.${b}]\na = ${e.a}\nb = ${e.b}\nm_ref = ${e.m_ref}\n`;
    })
    .join('');
  return { limits };
}

export function fitConfigText(s: Scenario, limits: string, f: ScenarioFit): string {
  const w = f.width ?? { log_age: 0.3, feh: 0.5, dm: 1, ebv: 0.2 };
  const u = (lo: number, hi: number): string => `{ kind = "uniform", min = ${Number(lo.toFixed(4))}, max = ${Number(hi.toFixed(4))} }`;
  const phot = ['B', 'V', 'I'].map((b) => `[photometry.${b}]\nmag = "${b}"\nerr = "${b}_err"\n`).join('');
  return [
    `[catalogue]\npath = "${s.name}.csv"\nid = "id"\ntruth = "${s.name}.truth.json"\n${phot}${limits}`,
    '[priors]',
    `log_age = ${u(Math.max(8.0, s.logAge - w.log_age), Math.min(10.15, s.logAge + w.log_age))}`,
    `feh = ${u(Math.max(-2.3, s.feh - w.feh), Math.min(0.2, s.feh + w.feh))}`,
    `dm = ${u(s.dm - w.dm, s.dm + w.dm)}`,
    `ebv = ${u(Math.max(0, s.ebv - w.ebv), s.ebv + w.ebv)}`,
    'f_binary = 0',
    `f_field = ${u(0, 0.3)}`,
    'sigma_extra = 0',
    `[sampler]\nseed = ${s.seed}\nensembles = ${f.ensembles}\nwalkers = ${f.walkers}\nstop = "fixed"\nsteps = ${f.steps}\nworkers = ${f.workers}\ninit_starts = ${f.initStarts ?? 2}\n${f.sampler ?? ''}`,
  ].join('\n');
}

/** Simulate and fit one scenario in a fresh temporary folder. */
export async function runScenario(s: Scenario, f: ScenarioFit): Promise<{ dir: string; result: FitResult }> {
  const dir = mkdtempSync(join(tmpdir(), `coeval-scenario-${s.name}-`));
  const { limits } = await simulateScenario(dir, s);
  const text = fitConfigText(s, limits, f);
  writeFileSync(join(dir, 'fit.toml'), text);
  const loaded = parseConfigText(text, { file: join(dir, 'fit.toml'), baseDir: dir });
  const result = await fit({ loaded, runDir: join(dir, 'run'), report: false, starDraws: f.starDraws ?? 20 });
  return { dir, result };
}
