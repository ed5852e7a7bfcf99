/**
 * The built-in model as an IsochroneSource (Hurley, Pols & Tout 2000 evolution with the built-in
 * photometry), for `coeval grid build` and for comparing grids with direct computation.
 *
 * The isochrone builder (src/stellar/isochrone) is being finished on another branch. Until it is merged,
 * its module is resolved at run time, so that this stage builds either way and says plainly when the
 * builder is missing. Once it is on main, this becomes a static import.
 */
import type { BandId } from '../core/bands.js';
import { ModelError } from '../core/errors.js';
import type { IsochroneSource, PhotometryModel } from '../stellar/types.js';

interface IsochroneModule {
  builtinModel(options: { photometry: PhotometryModel; alphaFe?: number }): IsochroneSource;
}

const ISOCHRONE_MODULE = '../stellar/isochrone/index.js';

export async function builtinIsochroneSource(bands: readonly BandId[], alphaFe: number): Promise<IsochroneSource> {
  let mod: IsochroneModule;
  try {
    mod = (await import(ISOCHRONE_MODULE)) as IsochroneModule;
  } catch {
    throw new ModelError('the built-in isochrone builder is not part of this build yet', {
      hint: 'import a published grid with `coeval grid import` instead',
    });
  }
  const { builtinPhotometry } = await import('../stellar/photometry/index.js');
  const photometry = builtinPhotometry();
  const missing = bands.filter((b) => !photometry.bands.includes(b));
  if (missing.length > 0) {
    throw new ModelError(`the built-in photometry has no ${missing.join(', ')} magnitudes`, { expected: `bands among ${photometry.bands.join(', ')}` });
  }
  return mod.builtinModel({ photometry, alphaFe });
}

/** Whether the built-in isochrone builder is present in this build. */
export async function builtinAvailable(): Promise<boolean> {
  try {
    await import(ISOCHRONE_MODULE);
    return true;
  } catch {
    return false;
  }
}
