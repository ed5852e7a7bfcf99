/**
 * Flower 1996 (ApJ 469, 355) bolometric correction BC_V and B-V colour as functions of Teff, with the
 * coefficients as corrected and reprinted by Torres 2010 (AJ 140, 1158): Table 1 (BC_V, three pieces in
 * log Teff) and Table 2 (log Teff against B-V, the relation for all luminosity classes except
 * supergiants). Coefficient numbers read from repo wangleon/StellarLab (stella/parameter/bc.py, teff.py),
 * which reproduces those tables. Check: BC_V(5772 K) = -0.081, the -0.08 of references.md.
 *
 * No metallicity or gravity terms: Flower's relations are for solar-neighbourhood stars.
 */
import { poly, polyDerivative, pow10, smoothWeight } from './smooth.js';
import { colourFromTeff, type ColourTeffRelation, type EdgeBehaviour } from './colourRelation.js';
import { tabulatedShape } from './hermite.js';
import { EFFECTIVE_WAVELENGTH_UM, planckColourShape, type Shape } from './planckShape.js';

/** Torres 2010 Table 1: BC_V = sum c_i (log Teff)^i; pieces for log Teff >= 3.90, 3.70-3.90, < 3.70. */
const BC_HOT = [-0.118115450538963e6, 0.137145973583929e6, -0.636233812100225e5, 0.147412923562646e5, -0.170587278406872e4, 0.78873172180499e2];
const BC_MID = [-0.370510203809015e5, 0.385672629965804e5, -0.150651486316025e5, 0.261724637119416e4, -0.170623810323864e3];
const BC_COOL = [-0.190537291496456e5, 0.155144866764412e5, -0.421278819301717e4, 0.381476328422343e3];

/**
 * The published pieces do not meet exactly (they differ by 0.022 mag at log Teff = 3.70 and 0.003 mag at
 * 3.90), so each join is a smooth blend over +-BC_JOIN_HALF_WIDTH in log Teff.
 */
const BC_JOIN_HALF_WIDTH = 0.01;

/** Flower 1996 BC_V at log Teff (Torres 2010 Table 1), pieces blended smoothly. */
export function flowerBcV(logTeff: number): number {
  if (logTeff < 3.7 - BC_JOIN_HALF_WIDTH) return poly(BC_COOL, logTeff);
  if (logTeff < 3.7 + BC_JOIN_HALF_WIDTH) {
    const w = smoothWeight(logTeff, 3.7 - BC_JOIN_HALF_WIDTH, 3.7 + BC_JOIN_HALF_WIDTH);
    return (1 - w) * poly(BC_COOL, logTeff) + w * poly(BC_MID, logTeff);
  }
  if (logTeff < 3.9 - BC_JOIN_HALF_WIDTH) return poly(BC_MID, logTeff);
  if (logTeff < 3.9 + BC_JOIN_HALF_WIDTH) {
    const w = smoothWeight(logTeff, 3.9 - BC_JOIN_HALF_WIDTH, 3.9 + BC_JOIN_HALF_WIDTH);
    return (1 - w) * poly(BC_MID, logTeff) + w * poly(BC_HOT, logTeff);
  }
  return poly(BC_HOT, logTeff);
}

/** dBC_V/dlogTeff by a central difference (used only for shapes and edges, never in the hot path). */
function flowerBcVSlope(logTeff: number): number {
  const h = 1e-5;
  return (flowerBcV(logTeff + h) - flowerBcV(logTeff - h)) / (2 * h);
}

/** Flower's BC_V as an extension shape (e.g. for BC_G of stars hotter than 8000 K, where G - V is nearly constant). */
export const FLOWER_BCV_SHAPE: Shape = { value: flowerBcV, slope: flowerBcVSlope };

/**
 * Range of log Teff over which Flower's BC_V is used as published. Hot: Flower's sample reaches O stars
 * (log Teff ~ 4.6). Cool: his coolest calibrators are giants and supergiants, and for dwarfs the relation
 * runs 0.07 mag more negative than the Pecaut & Mamajek 2013 dwarf sequence at 4090 K and 0.2-1 mag below
 * 3900 K; dwarfs cooler than FLOWER_BCV_DWARF_COOL_EDGE therefore use an extension instead (bolometric.ts).
 */
export const FLOWER_BCV_RANGE = { logTeffMin: 3.5, logTeffMax: 4.65 } as const;
export const FLOWER_BCV_DWARF_COOL_EDGE = Math.log10(4250);

/** Torres 2010 Table 2, all classes but supergiants: log Teff = sum c_i (B-V)^i. */
const LOGT_BV = [3.979145106714099, -0.654992268598245, 1.740690042385095, -4.608815154057166, 6.792599779944473, -5.396909891322525, 2.19297037652249, -0.359495739295671];

/** B-V interval of Flower's temperature relation used here; log Teff is monotone in B-V across it. */
export const FLOWER_BV_RANGE = { min: -0.3, max: 1.75 } as const;

/** Flower 1996 B-V-Teff (Torres 2010 Table 2) in the form the inverter needs; no gravity or metallicity terms. */
export const flowerBvRelation: ColourTeffRelation = {
  source: 'Flower 1996 B-V-Teff (Torres 2010, Table 2)',
  teff(x) {
    return pow10(poly(LOGT_BV, x));
  },
  dTeffDx(x) {
    return pow10(poly(LOGT_BV, x)) * Math.LN10 * polyDerivative(LOGT_BV, x);
  },
  colourRange(_logg, _feh, range) {
    range[0] = FLOWER_BV_RANGE.min;
    range[1] = FLOWER_BV_RANGE.max;
  },
};

const PLANCK_BV = planckColourShape(EFFECTIVE_WAVELENGTH_UM.B, EFFECTIVE_WAVELENGTH_UM.V);
const FLOWER_BV_EDGES: EdgeBehaviour = { hot: { shape: PLANCK_BV, mode: 'scaled' }, cool: { shape: PLANCK_BV, mode: 'scaled' } };
const scratch = new Float64Array(2);

/** Flower's B-V at log Teff (no gravity or metallicity terms), black-body continued beyond -0.3 < B-V < 1.75. */
export function flowerBv(logTeff: number): number {
  return colourFromTeff(flowerBvRelation, logTeff, 4, 0, FLOWER_BV_EDGES, scratch);
}

/**
 * Flower's B-V as an extension shape. Hot stars' colours all change roughly in proportion to B-V (from A0
 * to B2 dwarfs, B-V changes by -0.22, BP-RP by -0.18, V-Ic by -0.23 and V-Ks by -0.64 in the Pecaut &
 * Mamajek sequence), so this empirical shape, scaled, carries every colour beyond its hot edge. Tabulated
 * once (cubic Hermite, nodes every 0.0025 dex, exact value and slope at each node) because each value is a
 * root-find.
 */
export const FLOWER_BV_SHAPE: Shape = tabulatedShape(
  flowerBv,
  (logTeff) => {
    const h = 1e-6;
    return (flowerBv(logTeff + h) - flowerBv(logTeff - h)) / (2 * h);
  },
  3.2,
  4.9,
  0.0025,
);
