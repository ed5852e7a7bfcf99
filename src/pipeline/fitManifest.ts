/**
 * What `coeval fit` adds to a run's manifest.json (under the key `fit`), so that plots, reports and resumed
 * runs can rebuild everything from the run directory alone: the resolved config, where relative paths
 * were resolved from, the parameter space, and the provenance of the stellar model.
 */
import type { BandId } from '../core/bands.js';
import type { ClusterParameterName } from '../core/parameters.js';
import type { CoevalConfig } from '../config/index.js';
import type { RunManifest } from '../io/index.js';

export interface FitManifestSection {
  /** The config as resolved (defaults, file, --set overrides), as plain JSON. */
  config: CoevalConfig;
  /** The config file's absolute path when the run started, and the folder relative paths resolve from. */
  configFile: string;
  baseDir: string;
  overrides: string[];
  /** Bands fitted, in catalogue order. */
  bands: BandId[];
  catalogue: { path: string; format: string; nStars: number };
  /** Parameters held fixed, with their values (sampled ones are the manifest's `parameters`). */
  fixed: Partial<Record<ClusterParameterName, number>>;
  /** One line per parameter, e.g. `log_age ~ uniform(9.8, 10.2)`. */
  priors: string[];
  /** Stellar model and extinction: what produced the numbers, and where it is approximate. */
  model: {
    name: string;
    evolution: string;
    solarZ: number;
    alphaFe: number;
    bands: Partial<Record<BandId, string>>;
    extinction: string;
    caveats: string[];
  };
  /** Known true values, when the catalogue was simulated and the config names its truth file. */
  truth?: Partial<Record<ClusterParameterName, number>>;
  /** Wall-clock seconds per stage (check, initialisation, sampling, post-processing). */
  timings: Record<string, number>;
}

export type FitManifest = RunManifest & { fit: FitManifestSection };
