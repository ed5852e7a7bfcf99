/**
 * The edge behaviour shared by the colours: beyond the hot edge a colour follows Flower's empirical B-V
 * (scaled by the colour's mean slope ratio to it over the last 0.1 dex of its range, and with its sign for colours that grow with temperature; see flower1996.ts
 * for why), beyond the cool edge a black body's colour in the same bands (scaled, with the slope ratio kept
 * within [1/2, 5/2]).
 */
import type { EdgeBehaviour } from './colourRelation.js';
import { FLOWER_BV_SHAPE } from './flower1996.js';
import type { Shape } from './planckShape.js';

/**
 * Slope ratios of M-dwarf colours to black-body colours in the Pecaut & Mamajek 2013 sequence, M0-M4 V:
 * about 1.6 (V-Rc), 2.0 (BP-RP), 2.3 (V-Ic).
 */
export const COOL_SLOPE_RATIO_RANGE = [0.5, 2.5] as const;

const NEGATED_FLOWER_BV_SHAPE: Shape = {
  value: (logTeff) => -FLOWER_BV_SHAPE.value(logTeff),
  slope: (logTeff) => -FLOWER_BV_SHAPE.slope(logTeff),
};

export function colourEdges(planck: Shape): EdgeBehaviour {
  // A colour such as G-BP (longer minus shorter wavelength) rises with temperature, opposite to B-V.
  const hotShape = planck.slope(3.9) * FLOWER_BV_SHAPE.slope(3.9) > 0 ? FLOWER_BV_SHAPE : NEGATED_FLOWER_BV_SHAPE;
  return {
    hot: { shape: hotShape, mode: 'secant' },
    cool: { shape: planck, mode: 'scaled', slopeRatioRange: COOL_SLOPE_RATIO_RANGE },
  };
}
