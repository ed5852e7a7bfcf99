/**
 * The edge behaviour shared by the colours: beyond the hot edge a colour follows Flower's empirical B-V
 * (scaled by the colour's mean slope ratio to it over the last 0.1 dex of its range, and with its sign for colours that grow with temperature; see flower1996.ts
 * for why), beyond the cool edge a black body's colour in the same bands (scaled, with the slope ratio kept
 * within [1/2, 5/2]).
 */
import type { EdgeBehaviour } from './colourRelation.js';
import { FLOWER_BV_SHAPE } from './flower1996.js';
import type { Shape } from './planckShape.js';

/** Bounds on cool-side slope ratios (real M dwarfs show about 1.6-2.3 against a black body). */
export const COOL_SLOPE_RATIO_RANGE = [0.5, 2.5] as const;

const NEGATED_FLOWER_BV_SHAPE: Shape = {
  value: (logTeff) => -FLOWER_BV_SHAPE.value(logTeff),
  slope: (logTeff) => -FLOWER_BV_SHAPE.slope(logTeff),
};

/** Width over which a cool-side extension's slope goes from the relation's own to the mean ratio. */
export const COOL_SATURATION_DEX = 0.005;

/**
 * Beyond the cool edge the far-field slope ratio is the relation's mean ratio to the black body over its
 * last 0.1 dex (the `secant` mode), not its slope at the very edge: a fitted polynomial's slope at the end of
 * its range is its least constrained value (Casagrande et al. 2010 V-Rc and V-Ic are quadratics whose
 * turning point lies just beyond their red limits; the Casagrande et al. 2021 slopes at 4000 K change
 * quickly with [Fe/H]), and amplified over a long extension it would make cool stars' colours swing with
 * metallicity. The edge's own slope is kept over the first 0.005 dex only (the first derivative stays
 * continuous; a longer stretch would carry the erratic edge slope into the far field). The price: M dwarfs'
 * colours redden faster than these mean ratios say (molecular bands), so extended M-dwarf colours come out
 * too blue; the tests measure by how much.
 */
export function colourEdges(planck: Shape): EdgeBehaviour {
  // A colour such as G-BP (longer minus shorter wavelength) rises with temperature, opposite to B-V.
  const hotShape = planck.slope(3.9) * FLOWER_BV_SHAPE.slope(3.9) > 0 ? FLOWER_BV_SHAPE : NEGATED_FLOWER_BV_SHAPE;
  return {
    hot: { shape: hotShape, mode: 'secant' },
    cool: { shape: planck, mode: 'secant', slopeRatioRange: COOL_SLOPE_RATIO_RANGE, saturationDex: COOL_SATURATION_DEX },
  };
}
