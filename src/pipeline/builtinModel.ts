/**
 * The built-in model as an IsochroneSource (Hurley, Pols & Tout 2000 evolution with the built-in
 * photometry), for `coeval grid build` and for comparing grids with direct computation.
 */
import type { BandId } from '../core/bands.js';
import { ModelError } from '../core/errors.js';
import { builtinModel } from '../stellar/isochrone/index.js';
import { builtinPhotometry } from '../stellar/photometry/index.js';
import type { IsochroneSource } from '../stellar/types.js';

export function builtinIsochroneSource(bands: readonly BandId[], alphaFe: number): IsochroneSource {
  const photometry = builtinPhotometry();
  const missing = bands.filter((b) => !photometry.bands.includes(b));
  if (missing.length > 0) {
    throw new ModelError(`the built-in photometry has no ${missing.join(', ')} magnitudes`, {
      expected: `bands among ${photometry.bands.join(', ')}`,
      hint: 'choose other bands, or import a published grid that has them',
    });
  }
  return builtinModel({ photometry, alphaFe });
}
