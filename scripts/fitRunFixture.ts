/**
 * A run directory shaped like one `coeval fit` writes, without running a fit: a manifest with a `fit`
 * section for the built-in model (B, V, I), AR(1) chains around a chosen posterior (scripts/ar1Run.ts), and
 * a stars.arrow of the invented cluster "Orrin 12" drawn with the likelihood's forward model at the truth,
 * with made-up memberships. For tests and for looking at plots and reports: the chains are not a fit.
 */
import mt19937 from '@stdlib/random-base-mt19937';
import * as arrow from 'apache-arrow';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BandId } from '../src/core/bands.js';
import { CLUSTER_PARAMETERS, type ClusterParameterName } from '../src/core/parameters.js';
import { coevalVersion } from '../src/core/version.js';
import { parseConfigText } from '../src/config/index.js';
import { createRunDirectory, newRunId, RUN_FORMAT, RUN_LAYOUT, RunChainWriter, type RunManifest } from '../src/io/index.js';
import type { FitManifest } from '../src/pipeline/fitManifest.js';
import { simulateCatalog } from '../src/likelihood/index.js';
import { builtinSetup } from '../src/pipeline/stellarModel.js';
import type { EnsembleState } from '../src/sampler/types.js';
import { AR1_BLOB_NAMES, ar1States } from './ar1Run.js';

export interface FitRunFixtureOptions {
  nStars: number;
  /** Posterior means and sds of the sampled parameters; the truth is put at the means unless given. */
  posterior: Partial<Record<ClusterParameterName, { mean: number; sd: number }>>;
  fixed?: Partial<Record<ClusterParameterName, number>>;
  truth?: Partial<Record<ClusterParameterName, number>>;
  nWalkers?: number;
  nEnsembles?: number;
  nSteps?: number;
  rho?: number;
  seed?: number;
  /** Fraction of catalogue stars that are field stars. */
  fieldFraction?: number;
}

export const FIXTURE_BANDS: BandId[] = ['B', 'V', 'I'];

/** Limits of the synthetic catalogue, and its error law sigma(m) = a + b 10^(0.4 (m - mRef)). */
export const FIXTURE_WINDOW = { bright: 12, faint: 23 };
export const FIXTURE_ERRORS = { a: 0.004, b: 0.03, mRef: 22 };

const CONFIG = `
[catalogue]
path = "orrin12.csv"
id = "star"
[photometry.B]
mag = "B"
err = "B_err"
[photometry.V]
mag = "V"
err = "V_err"
[photometry.I]
mag = "I"
err = "I_err"
[priors]
log_age = { kind = "uniform", min = 9.6, max = 10.15 }
feh = { kind = "uniform", min = -2.2, max = 0.2 }
dm = { kind = "normal", mean = 14.6, sd = 0.5 }
ebv = { kind = "uniform", min = 0, max = 0.5 }
`;

export function writeFitRunFixture(dir: string, o: FitRunFixtureOptions): string {
  const seed = o.seed ?? 7;
  const loaded = parseConfigText(CONFIG, { baseDir: dir });
  const setup = builtinSetup(loaded.config.model);
  const names = (Object.keys(o.posterior) as ClusterParameterName[]).filter((n) => o.posterior[n]);
  const nEnsembles = o.nEnsembles ?? 3;
  const prov = setup.source.provenance;
  const truth = o.truth ?? Object.fromEntries(names.map((n) => [n, o.posterior[n]!.mean]));
  const fit: FitManifest['fit'] = {
    config: loaded.config,
    configFile: join(dir, 'orrin12.toml'),
    baseDir: dir,
    overrides: [],
    bands: FIXTURE_BANDS,
    catalogue: { path: join(dir, 'orrin12.csv'), format: 'csv', nStars: o.nStars },
    fixed: o.fixed ?? {},
    priors: ['log_age ~ uniform(9.6, 10.15)', 'feh ~ uniform(-2.2, 0.2)', 'dm ~ normal(14.6, 0.5)', 'ebv ~ uniform(0, 0.5)', 'f_binary ~ uniform(0, 1)', 'f_field ~ uniform(0, 1)'],
    model: {
      name: prov.model,
      evolution: prov.evolution,
      solarZ: prov.solarZ,
      alphaFe: prov.alphaFe,
      bands: Object.fromEntries(FIXTURE_BANDS.map((b) => [b, prov.bands[b] ?? ''])),
      extinction: setup.extinction.provenance,
      caveats: [...prov.caveats],
    },
    truth,
    timings: { check: 0.8, initialisation: 12.5, sampling: 301.2, postprocessing: 9.4 },
  };
  const manifest: RunManifest & { fit: FitManifest['fit'] } = {
    format: RUN_FORMAT,
    runId: newRunId(),
    createdAt: new Date().toISOString(),
    coevalVersion: coevalVersion(),
    parameters: names.map((n) => ({ ...CLUSTER_PARAMETERS[n] })),
    nEnsembles,
    nWalkers: o.nWalkers ?? 16,
    seeds: Array.from({ length: nEnsembles }, (_, k) => seed + k),
    chainFiles: Array.from({ length: nEnsembles }, (_, k) => RUN_LAYOUT.chainFile(k)),
    provenance: { model: prov.model, calibration: 'built-in photometric calibration (see fit.model.bands)', notes: ['synthetic test run: AR(1) chains, made-up memberships'] },
    status: 'finished',
    fit,
  };
  const path = createRunDirectory(dir, manifest);
  const sink = RunChainWriter.create(path, manifest, { blobNames: AR1_BLOB_NAMES });
  const gens = Array.from({ length: nEnsembles }, (_, k) =>
    ar1States({
      parameters: manifest.parameters,
      mean: names.map((n) => o.posterior[n]!.mean),
      sd: names.map((n) => o.posterior[n]!.sd),
      rho: o.rho ?? 0.7,
      nWalkers: manifest.nWalkers,
      nSteps: o.nSteps ?? 600,
      seed: seed + k,
      ensemble: k,
    }),
  );
  for (let step = 1; step <= (o.nSteps ?? 600); step++) for (const g of gens) sink.append(g.next().value as EnsembleState);
  sink.close();
  writeFileSync(join(path, RUN_LAYOUT.stars), starsArrow(o, truth, setup, seed));
  return path;
}

/**
 * A catalogue drawn with the likelihood's forward model at the truth, as stars.arrow bytes, with made-up
 * posterior memberships: near 1 for cluster stars (split between single and binary by the true
 * component), near 0 for field stars, with some confusion.
 */
function starsArrow(o: FitRunFixtureOptions, truth: Partial<Record<ClusterParameterName, number>>, setup: ReturnType<typeof builtinSetup>, seed: number): Uint8Array {
  const law = { a: FIXTURE_ERRORS.a, b: FIXTURE_ERRORS.b, mRef: FIXTURE_ERRORS.mRef };
  const window = { bright: FIXTURE_WINDOW.bright, faint: FIXTURE_WINDOW.faint };
  const sim = simulateCatalog(
    {
      seed: seed + 101,
      nStars: o.nStars,
      bands: FIXTURE_BANDS,
      theta: {
        logAgeYr: truth.log_age ?? 10,
        feh: truth.feh ?? -1,
        dm: truth.dm ?? 14.5,
        ebv: truth.ebv ?? 0.05,
        fBinary: truth.f_binary ?? 0.25,
        fField: o.fieldFraction ?? truth.f_field ?? 0.15,
        sigmaExtra: truth.sigma_extra ?? 0,
      },
      errorLaw: { B: law, V: law, I: law },
      likelihood: { limits: { B: window, V: window, I: window } },
    },
    setup.source,
    setup.extinction,
  );
  const rand = mt19937.factory({ seed: seed + 202 });
  const u = (): number => (rand() + 0.5) / 4294967296;
  const comp = sim.truth.component;
  const member = Float64Array.from(comp, (c) => (c === 2 ? 0.15 * u() : 0.8 + 0.2 * u()));
  const binaryShare = Float64Array.from(comp, (c) => (c === 1 ? 0.8 : 0.2));
  return encodeStars(sim.catalog.mag, sim.catalog.err, member, binaryShare);
}

function encodeStars(mags: Float64Array[], errs: Float64Array[], member: Float64Array, binaryShare: Float64Array): Uint8Array {
  const n = member.length;
  const cols: Record<string, arrow.Vector> = {
    id: arrow.vectorFromArray(Array.from({ length: n }, (_, i) => `O12-${String(i + 1).padStart(6, '0')}`), new arrow.Utf8()),
    row: arrow.makeVector(Int32Array.from({ length: n }, (_, i) => i)),
  };
  FIXTURE_BANDS.forEach((b, k) => {
    cols[b] = arrow.makeVector(Float64Array.from(mags[k]));
    cols[`${b}_err`] = arrow.makeVector(Float64Array.from(errs[k]));
  });
  cols.p_single = arrow.makeVector(member.map((p, i) => (1 - binaryShare[i]) * p));
  cols.p_binary = arrow.makeVector(member.map((p, i) => binaryShare[i] * p));
  cols.p_field = arrow.makeVector(member.map((p) => 1 - p));
  cols.membership_prior = arrow.makeVector(new Float64Array(n).fill(Number.NaN));
  cols.mass_median = arrow.makeVector(new Float64Array(n).fill(Number.NaN));
  const table = new arrow.Table(cols);
  table.schema.metadata.set('coeval.stars', JSON.stringify({ nDraws: 200 }));
  return arrow.tableToIPC(table, 'file');
}
