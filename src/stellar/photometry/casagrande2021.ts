/**
 * Casagrande et al. 2021 (MNRAS 507, 2684), colour-Teff relations in the Gaia DR3 and 2MASS systems from
 * the infrared flux method applied to GALAH DR3 stars, with gravity and metallicity terms, one formula for
 * dwarfs and giants:
 *
 *   Teff = a0 + a1 X + a2 X^2 + a3 X^3 + a4 X^5 + a5 g + a6 g X + a7 g X^2 + a8 g X^3 + a9 g X^5
 *          + a10 f + a11 f X + a12 f X^2 + a13 f X^3 + a14 f g X,        g = log g, f = [Fe/H].
 *
 * Coefficients (Gaia DR3 set) and the colour ranges over which the relations hold, separately for dwarfs
 * (log g > 3.2) and giants (log g <= 3.2), are those the authors distribute with the paper: repo
 * casaluca/colte, colte.py (numbers only). The authors' own limits on the inputs are used as well: log g
 * within 0-5, [Fe/H] up to +0.6, and [Fe/H] below -4 treated as -4 (colours lose sensitivity there).
 *
 * The paper states the relations for 4000 K <~ Teff <~ 8000 K; each relation is restricted to that window
 * as well as to its colour range. (Near the red ends of the giant ranges some relations turn over, e.g.
 * BP-RP for metal-rich giants beyond about 2.3, at temperatures below 4000 K; the window excludes that.)
 *
 * Joins: the dwarf and giant colour ranges are interpolated smoothly across log g 3.0-3.4 (centred on the
 * authors' 3.2), and log g and [Fe/H] beyond their limits are held smoothly at the limit.
 */
import type { ColourTeffRelation } from './colourRelation.js';
import { smoothWeight, softClamp } from './smooth.js';

type Coefficients = readonly [number, number, number, number, number, number, number, number, number, number, number, number, number, number, number];

interface GaiaRelation {
  a: Coefficients;
  dwarfs: readonly [number, number];
  giants: readonly [number, number];
}

const DR3 = {
  'BP-RP': {
    a: [7980.8845, -4138.3457, 1264.9366, -130.4388, 0, 285.8393, -324.2196, 106.8511, -4.9825, 0, 4.5138, -203.7774, 126.6981, -14.7442, 40.7376],
    dwarfs: [0.2, 2.0],
    giants: [0.2, 2.55],
  },
  'G-J': {
    a: [8142.3539, -3003.2988, 499.1325, -4.8473, 0, 244.503, -303.1783, 125.8628, -18.2917, 0, -125.8444, 59.5183, 0, 0, 16.8172],
    dwarfs: [0.15, 2.1],
    giants: [1.0, 2.8],
  },
  'G-H': {
    a: [8133.809, -2573.4998, 554.7657, -54.071, 0, 229.2455, -206.8658, 68.6489, -10.5528, 0, -124.5804, 41.963, 0, 0, 7.9258],
    dwarfs: [0.25, 2.6],
    giants: [0.25, 3.7],
  },
  'G-Ks': {
    a: [8031.7804, -1815.3523, 0, 70.7201, -1.7309, 252.9647, -342.0817, 161.3031, -26.7714, 0, -120.1133, 42.6723, 0, 0, 10.0433],
    dwarfs: [0.2, 2.8],
    giants: [0.2, 3.9],
  },
  'G-BP': {
    a: [7346.2, 5810.6636, 0, -2880.3823, 669.381, 415.3961, 2084.4883, 3509.22, 1849.0223, 0, -49.0748, 6.8032, 0, 0, -100.3419],
    dwarfs: [-1.0, -0.15],
    giants: [-1.4, -0.15],
  },
  'G-RP': {
    a: [8027.119, -5796.4277, 0, 1747.7036, -308.7685, 248.1828, -323.9569, -120.2658, 225.9584, 0, -35.8856, -16.5715, 0, 0, 48.5619],
    dwarfs: [0.15, 0.85],
    giants: [0.15, 1.15],
  },
} as const satisfies Record<string, GaiaRelation>;

export type Casagrande2021Colour = keyof typeof DR3;

const LOGG_RANGE = [0, 5] as const;
export const CASAGRANDE2021_TEFF_RANGE = [4000, 8000] as const;
const FEH_RANGE = [-4, 0.6] as const;
const HOLD_WIDTH = 0.1;
/** Dwarf (above) and giant (below) colour ranges are blended across this log g interval. */
export const CASAGRANDE2021_GIANT_DWARF_LOGG = [3.0, 3.4] as const;

function relation(name: Casagrande2021Colour): ColourTeffRelation {
  const { a, dwarfs, giants } = DR3[name];
  const teff = (x: number, g: number, f: number) => {
    const x2 = x * x;
    const x3 = x2 * x;
    const x5 = x3 * x2;
    return (
      a[0] + a[1] * x + a[2] * x2 + a[3] * x3 + a[4] * x5 +
      g * (a[5] + a[6] * x + a[7] * x2 + a[8] * x3 + a[9] * x5) +
      f * (a[10] + a[11] * x + a[12] * x2 + a[13] * x3 + a[14] * g * x)
    );
  };
  const dTeff = (x: number, g: number, f: number) => {
    const x2 = x * x;
    const x4 = x2 * x2;
    return (
      a[1] + 2 * a[2] * x + 3 * a[3] * x2 + 5 * a[4] * x4 +
      g * (a[6] + 2 * a[7] * x + 3 * a[8] * x2 + 5 * a[9] * x4) +
      f * (a[11] + 2 * a[12] * x + 3 * a[13] * x2 + a[14] * g)
    );
  };
  const gOf = (logg: number) => softClamp(logg, LOGG_RANGE[0], LOGG_RANGE[1], HOLD_WIDTH);
  const fOf = (feh: number) => softClamp(feh, FEH_RANGE[0], FEH_RANGE[1], HOLD_WIDTH);
  return {
    source: `Casagrande et al. 2021, Gaia DR3 ${name}`,
    teffRange: CASAGRANDE2021_TEFF_RANGE,
    teff(x, logg, feh) {
      return teff(x, gOf(logg), fOf(feh));
    },
    dTeffDx(x, logg, feh) {
      return dTeff(x, gOf(logg), fOf(feh));
    },
    colourRange(logg, _feh, out) {
      const w = smoothWeight(logg, CASAGRANDE2021_GIANT_DWARF_LOGG[0], CASAGRANDE2021_GIANT_DWARF_LOGG[1]);
      out[0] = giants[0] + w * (dwarfs[0] - giants[0]);
      out[1] = giants[1] + w * (dwarfs[1] - giants[1]);
    },
  };
}

export const casagrande2021 = {
  'BP-RP': relation('BP-RP'),
  'G-J': relation('G-J'),
  'G-H': relation('G-H'),
  'G-Ks': relation('G-Ks'),
  'G-BP': relation('G-BP'),
  'G-RP': relation('G-RP'),
} as const satisfies Record<Casagrande2021Colour, ColourTeffRelation>;

export const CASAGRANDE2021_RANGES = DR3;
