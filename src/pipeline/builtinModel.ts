import type { BandId } from '../core/bands.js';
import { ModelError } from '../core/errors.js';
import type { IsochroneSource } from '../stellar/types.js';

/** The built-in model as an IsochroneSource (evolution + photometry), for `coeval grid build`. */
export async function builtinIsochroneSource(_bands: readonly BandId[], _alphaFe: number): Promise<IsochroneSource> {
  throw new ModelError('the built-in stellar model is not part of this build yet', { hint: 'import a published grid with `coeval grid import` instead' });
}
