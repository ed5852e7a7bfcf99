import type { CoevalConfig } from '../../config/index.js';
import type { FitManifestSection } from '../fitManifest.js';
import type { StellarSetup } from '../stellarModel.js';

/**
 * The stellar model and extinction law a run was fitted with, rebuilt from the resolved config in its
 * manifest (a user grid is opened from the same cache or tables, relative to the same folder).
 */
export async function runStellarSetup(fit: FitManifestSection): Promise<StellarSetup> {
  const { stellarSetupFromConfig } = await import('../gridModel.js');
  return stellarSetupFromConfig({ config: fit.config as CoevalConfig, baseDir: fit.baseDir, overrides: fit.overrides ?? [] });
}
