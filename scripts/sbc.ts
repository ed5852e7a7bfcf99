/**
 * Simulation-based calibration (Talts, Betancourt, Simpson, Vehtari & Gelman 2018, arXiv:1804.06788), as
 * `npm run validate`. Not part of CI: it fits many clusters.
 *
 * For each of N replications: draw the cluster parameters from the prior below, simulate a small catalogue
 * with coeval's forward model (`coeval simulate`'s library function), fit it with a short run, thin the
 * pooled post-burn-in draws to L = 109 evenly spaced draws, and record the rank of the true value among them
 * (0..109). If the fit's posterior is calibrated, each parameter's ranks are uniform. Reported per
 * parameter: the rank histogram in 11 bins of 10 ranks, Pearson's chi-square against uniform (10 degrees of
 * freedom; p-value from the closed-form survival function for even degrees of freedom, Abramowitz & Stegun
 * 26.4.21), and the coverage of the central 68% and 95% intervals with their binomial standard errors.
 *
 *   npm run validate -- [--n 100] [--stars 300] [--steps 200] [--auto] [--out validation/sbc] [--resume]
 *
 * Writes OUT.json (every replication, rewritten atomically after each one), OUT.txt (the figures) and
 * OUT.svg (the rank histograms). With --resume, the replications already in OUT.json are kept and the run
 * goes on from the next one; replication i always has the same truth and seed, so a resumed run is the
 * same run.
 * Thinning: 109 draws spread over ~4,000 correlated ones; ranks from correlated draws would pile up at the
 * ends, so the run length must be many autocorrelation times (the script reports the mean tau). Each
 * replication's largest R-hat is kept and the figures say how many ended above 1.01: ranks from chains
 * that have not mixed measure the run length, not the calibration. With --auto the fits use the sampler's
 * automatic stop (50 tau, then R-hat and ESS past the verdict's thresholds, checked every 100 steps) with
 * --steps as the cap, instead of a fixed length.
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { parseConfigText, parseSimulationConfigText } from '../src/config/index.js';
import { writeFileAtomic } from '../src/core/atomicWrite.js';
import { readRunChains } from '../src/io/index.js';
import { fit } from '../src/pipeline/fit.js';
import { simulateCluster } from '../src/pipeline/simulate.js';
import { SamplerRng } from '../src/sampler/index.js';

const PRIOR = {
  log_age: [9.6, 10.1],
  feh: [-2.0, -0.5],
  dm: [13.5, 15.5],
  ebv: [0.0, 0.2],
  f_field: [0.0, 0.2],
} as const;
type Name = keyof typeof PRIOR;
const NAMES = Object.keys(PRIOR) as Name[];
const L = 109;
const BINS = 11;

/** P(chi2_k > x) for even k: e^(-x/2) sum_{i < k/2} (x/2)^i / i! (Abramowitz & Stegun 26.4.21). */
export function chiSquareSurvivalEven(x: number, k: number): number {
  let term = 1;
  let sum = 1;
  for (let i = 1; i < k / 2; i++) {
    term *= x / 2 / i;
    sum += term;
  }
  return Math.exp(-x / 2) * sum;
}

interface Replication {
  i: number;
  truth: Record<Name, number>;
  rank: Record<Name, number>;
  inside68: Record<Name, boolean>;
  inside95: Record<Name, boolean>;
  tauMax: number;
  /** Largest R-hat over the parameters at the end (absent in files written before it was recorded). */
  rhatMax?: number;
  /** Steps taken. */
  steps?: number;
  seconds: number;
}

async function replicate(i: number, seed: number, stars: number, steps: number, auto: boolean, rng: SamplerRng): Promise<Replication> {
  const t0 = performance.now();
  const truth = Object.fromEntries(NAMES.map((n) => [n, PRIOR[n][0] + (PRIOR[n][1] - PRIOR[n][0]) * rng.uniform()])) as Record<Name, number>;
  const dir = mkdtempSync(join(tmpdir(), 'coeval-sbc-'));
  try {
    const sim = parseSimulationConfigText(
      `[simulate]\nseed = ${seed}\nstars = ${stars}\nbands = ["B", "V", "I"]\noutput = "c.csv"\n[simulate.truth]\nlog_age = ${truth.log_age}\nfeh = ${truth.feh}\ndm = ${truth.dm}\nebv = ${truth.ebv}\nf_field = ${truth.f_field}\n`,
      { baseDir: dir },
    );
    await simulateCluster(sim);
    const lik = sim.config.likelihood;
    const window = (['B', 'V', 'I'] as const)
      .map((b) => {
        const l = lik.limits[b] as { bright: number; faint: number };
        const e = lik.errors[b] as { a: number; b: number; m_ref: number };
        return `[likelihood.limits.${b}]\nbright = ${l.bright}\nfaint = ${l.faint}\n[likelihood.errors.${b}]\na = ${e.a}\nb = ${e.b}\nm_ref = ${e.m_ref}\n`;
      })
      .join('');
    const phot = ['B', 'V', 'I'].map((b) => `[photometry.${b}]\nmag = "${b}"\nerr = "${b}_err"\n`).join('');
    const priors = NAMES.map((n) => `${n} = { kind = "uniform", min = ${PRIOR[n][0]}, max = ${PRIOR[n][1]} }`).join('\n');
    const text = `[catalogue]\npath = "c.csv"\nid = "id"\n${phot}${window}[priors]\n${priors}\nf_binary = 0\nsigma_extra = 0\n[sampler]\nseed = ${seed}\nensembles = 2\nwalkers = 12\n${auto ? 'stop = "auto"\ncheck_every = 100\n' : 'stop = "fixed"\n'}steps = ${steps}\nworkers = 2\ninit_starts = 2\n`;
    const loaded = parseConfigText(text, { file: join(dir, 'fit.toml'), baseDir: dir });
    const r = await fit({ loaded, runDir: join(dir, 'run'), report: false, starDraws: 1 });
    const d = r.diagnosis.diagnosis;
    const chains = readRunChains(r.runDir, r.manifest, { parameters: [...NAMES], discard: Math.round(d.discard / d.thin) });
    const nPooled = chains.nEnsembles * chains.nWalkers * chains.nDraws;
    const rank = {} as Record<Name, number>;
    const inside68 = {} as Record<Name, boolean>;
    const inside95 = {} as Record<Name, boolean>;
    NAMES.forEach((n) => {
      const all = chains.values[n];
      let below = 0;
      for (let k = 0; k < L; k++) if (all[Math.floor(((k + 0.5) * nPooled) / L)] < truth[n]) below++;
      rank[n] = below;
      const sorted = Float64Array.from(all).sort();
      const q = (p: number): number => sorted[Math.min(nPooled - 1, Math.floor(p * nPooled))];
      inside68[n] = truth[n] >= q(0.16) && truth[n] <= q(0.84);
      inside95[n] = truth[n] >= q(0.025) && truth[n] <= q(0.975);
    });
    const tauMax = Math.max(...d.parameters.map((p) => p.tau.tau));
    const rhatMax = Math.max(...d.parameters.map((p) => p.rhat));
    return { i, truth, rank, inside68, inside95, tauMax, rhatMax, steps: d.totalSteps, seconds: (performance.now() - t0) / 1000 };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function figures(reps: Replication[]): { text: string; svg: string } {
  const n = reps.length;
  const lines = [`simulation-based calibration: ${n} replications, ${L} draws per posterior, ${BINS} bins; mean tau_max ${(reps.reduce((s, r) => s + r.tauMax, 0) / n).toFixed(1)} steps`];
  const withRhat = reps.filter((r) => r.rhatMax !== undefined);
  if (withRhat.length > 0) {
    const high = withRhat.filter((r) => !((r.rhatMax as number) < 1.01));
    const largest = Math.max(...withRhat.map((r) => r.rhatMax as number));
    lines.push(`R-hat at the end: ${high.length} of ${withRhat.length} replications have a parameter at R-hat >= 1.01 (largest ${largest.toFixed(3)}); their ranks are included above`);
  }
  const panels: string[] = [];
  NAMES.forEach((name, j) => {
    const counts = new Array<number>(BINS).fill(0);
    for (const r of reps) counts[Math.min(BINS - 1, Math.floor((r.rank[name] * BINS) / (L + 1)))]++;
    const expected = n / BINS;
    const chi2 = counts.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    const p = chiSquareSurvivalEven(chi2, BINS - 1);
    const c68 = reps.filter((r) => r.inside68[name]).length / n;
    const c95 = reps.filter((r) => r.inside95[name]).length / n;
    const se = (c: number, p0: number): string => `${(100 * c).toFixed(1)}% (nominal ${100 * p0}%, binomial s.e. ${(100 * Math.sqrt((p0 * (1 - p0)) / n)).toFixed(1)}%)`;
    lines.push(`${name.padEnd(8)} ranks per bin ${counts.join(' ')}; chi-square ${chi2.toFixed(2)} (10 dof), p = ${p.toFixed(3)}; coverage 68%: ${se(c68, 0.68)}; 95%: ${se(c95, 0.95)}`);
    const w = 200;
    const h = 120;
    const x0 = 10 + j * (w + 20);
    const maxC = Math.max(...counts, expected * 2);
    const bars = counts.map((c, b) => `<rect x="${x0 + (b * w) / BINS}" y="${30 + h - (c / maxC) * h}" width="${w / BINS - 2}" height="${(c / maxC) * h}" fill="#4a7ab5"/>`).join('');
    const band = [-2, 2].map((k) => 30 + h - ((expected + k * Math.sqrt(expected * (1 - 1 / BINS))) / maxC) * h);
    panels.push(`${bars}<rect x="${x0}" y="${band[1]}" width="${w}" height="${band[0] - band[1]}" fill="#999" opacity="0.3"/><text x="${x0}" y="20" font-family="sans-serif" font-size="13">${name}: chi2 ${chi2.toFixed(1)}, p ${p.toFixed(2)}</text>`);
  });
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${NAMES.length * 220}" height="170"><rect width="100%" height="100%" fill="white"/>${panels.join('')}</svg>\n`;
  return { text: `${lines.join('\n')}\n(grey band in the figure: expected count +- 2 binomial sd per bin)\n`, svg };
}

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { n: { type: 'string', default: '100' }, stars: { type: 'string', default: '300' }, steps: { type: 'string', default: '200' }, out: { type: 'string', default: 'validation/sbc' }, seed: { type: 'string', default: '2018' }, resume: { type: 'boolean', default: false }, auto: { type: 'boolean', default: false } } });
  const n = Number(values.n);
  const out = resolve(values.out as string);
  mkdirSync(dirname(out), { recursive: true });
  const rng = SamplerRng.fromSeed(Number(values.seed), 1);
  const reps: Replication[] = values.resume && existsSync(`${out}.json`) ? (JSON.parse(readFileSync(`${out}.json`, 'utf8')) as Replication[]) : [];
  if (reps.length > 0) process.stderr.write(`resuming after ${reps.length} replications from ${out}.json\n`);
  for (let i = 0; i < n; i++) {
    if (i < reps.length) {
      // Replay the truth's draws, so that later replications get the truths they would have had.
      for (let k = 0; k < NAMES.length; k++) rng.uniform();
      continue;
    }
    const r = await replicate(i, Number(values.seed) * 1000 + i + 1, Number(values.stars), Number(values.steps), values.auto === true, rng);
    reps.push(r);
    process.stderr.write(`replication ${i + 1}/${n}: ${r.seconds.toFixed(1)} s, ${r.steps} steps, R-hat max ${(r.rhatMax as number).toFixed(3)}, ranks ${NAMES.map((nm) => r.rank[nm]).join(' ')}\n`);
    writeFileAtomic(`${out}.json`, `${JSON.stringify(reps)}\n`);
  }
  const f = figures(reps);
  writeFileAtomic(`${out}.txt`, f.text);
  writeFileAtomic(`${out}.svg`, f.svg);
  process.stdout.write(f.text);
}

await main();
