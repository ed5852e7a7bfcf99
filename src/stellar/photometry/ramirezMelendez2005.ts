/**
 * Ramirez & Melendez 2005 (ApJ 626, 465), colour-Teff-[Fe/H] relations for giants from the infrared flux
 * method: theta = 5040/T0 = a0 + a1 X + a2 X^2 + a3 X [Fe/H] + a4 [Fe/H] + a5 [Fe/H]^2 with the giant
 * coefficients of their Table 3, then Teff = T0 + P(X), where P is the small residual polynomial of their
 * Table 5 for the star's [Fe/H] bin (+0.5 > [Fe/H] > -0.5, -0.5 >= [Fe/H] > -1.5, -1.5 >= [Fe/H] > -2.5,
 * -2.5 >= [Fe/H] > -4.0), each with its own colour range. Johnson B-V, Cousins V-Rc and V-Ic. Coefficient
 * numbers read from repo wangleon/StellarLab (stella/parameter/teff.py), which reproduces those tables.
 *
 * Joins: the published P and colour ranges change in steps at the bin limits; here P is blended smoothly
 * over +-0.1 dex around each limit, and the colour range is interpolated linearly in [Fe/H] between bin
 * centres (0, -1, -2, -3.25), so nothing jumps with [Fe/H]. Beyond +0.5 and below -4.0 the relation is
 * held at the limit.
 */
import type { ColourTeffRelation } from './colourRelation.js';
import { poly, polyDerivative, smoothWeight, softClamp } from './smooth.js';

interface GiantRelation {
  a: readonly [number, number, number, number, number, number];
  /** P polynomials (coefficients of X^0, X^1, ...), one per bin from metal-rich to metal-poor. */
  p: readonly (readonly number[])[];
  /** Valid colour range per bin. */
  range: readonly (readonly [number, number])[];
}

const GIANTS = {
  'B-V': {
    a: [0.5737, 0.4882, -0.0149, 0.0563, -0.116, -0.0114],
    p: [[112.116, -372.622, 67.1254, 395.333, -203.471], [-12.9762], [606.032, -1248.79, 627.453], [-9.26209]],
    range: [[0.144, 1.668], [0.664, 1.558], [0.605, 1.352], [0.68, 1.11]],
  },
  'V-Rc': {
    a: [0.3849, 1.6205, -0.6395, 0.106, -0.0875, -0.0089],
    p: [[-8.51797, 15.6675], [-10.7764], [61.9821, -78.7382], [27.9886, -100.149]],
    range: [[0.299, 1.106], [0.387, 0.752], [0.429, 0.598], [0.394, 0.55]],
  },
  'V-Ic': {
    a: [0.3575, 0.9069, -0.2025, 0.0395, -0.0551, -0.0061],
    p: [[0.42933], [-0.1418], [9.31011], [-23.0514]],
    range: [[0.573, 2.0], [0.795, 1.524], [0.87, 1.303], [0.812, 1.095]],
  },
} as const satisfies Record<string, GiantRelation>;

export type RamirezMelendez2005Colour = keyof typeof GIANTS;

/** Bin limits (metal-rich to metal-poor), the half width of the P blend, and bin centres for the ranges. */
const BIN_LIMITS = [-0.5, -1.5, -2.5] as const;
const P_BLEND_HALF_WIDTH = 0.1;
const BIN_CENTRES = [0.0, -1.0, -2.0, -3.25] as const;
const FEH_RANGE = [-4.0, 0.5] as const;
const FEH_HOLD_WIDTH = 0.1;

/** Weights of the four bins at feh (sum to 1; at most two non-zero). */
function binWeights(feh: number, w: Float64Array): void {
  // u_k: fraction of "metal-poorer than limit k".
  const u0 = smoothWeight(-feh, -BIN_LIMITS[0] - P_BLEND_HALF_WIDTH, -BIN_LIMITS[0] + P_BLEND_HALF_WIDTH);
  const u1 = smoothWeight(-feh, -BIN_LIMITS[1] - P_BLEND_HALF_WIDTH, -BIN_LIMITS[1] + P_BLEND_HALF_WIDTH);
  const u2 = smoothWeight(-feh, -BIN_LIMITS[2] - P_BLEND_HALF_WIDTH, -BIN_LIMITS[2] + P_BLEND_HALF_WIDTH);
  w[0] = 1 - u0;
  w[1] = u0 - u1;
  w[2] = u1 - u2;
  w[3] = u2;
}

function relation(name: RamirezMelendez2005Colour): ColourTeffRelation {
  const { a, p, range } = GIANTS[name];
  const weights = new Float64Array(4);
  const fehOf = (feh: number) => softClamp(feh, FEH_RANGE[0], FEH_RANGE[1], FEH_HOLD_WIDTH);
  const theta = (x: number, f: number) => a[0] + a[1] * x + a[2] * x * x + a[3] * x * f + a[4] * f + a[5] * f * f;
  const dTheta = (x: number, f: number) => a[1] + 2 * a[2] * x + a[3] * f;
  const correction = (x: number, f: number, derivative: boolean) => {
    binWeights(f, weights);
    let s = 0;
    for (let k = 0; k < 4; k++) if (weights[k] !== 0) s += weights[k] * (derivative ? polyDerivative(p[k], x) : poly(p[k], x));
    return s;
  };
  return {
    source: `Ramirez & Melendez 2005, Tables 3 and 5 (${name}, giants)`,
    teff(x, _logg, feh) {
      const f = fehOf(feh);
      return 5040 / theta(x, f) + correction(x, f, false);
    },
    dTeffDx(x, _logg, feh) {
      const f = fehOf(feh);
      const t = theta(x, f);
      return (-5040 * dTheta(x, f)) / (t * t) + correction(x, f, true);
    },
    colourRange(_logg, feh, out) {
      const f = fehOf(feh);
      if (f >= BIN_CENTRES[0]) {
        out[0] = range[0][0];
        out[1] = range[0][1];
        return;
      }
      for (let k = 1; k < BIN_CENTRES.length; k++) {
        if (f >= BIN_CENTRES[k]) {
          const t = (f - BIN_CENTRES[k]) / (BIN_CENTRES[k - 1] - BIN_CENTRES[k]);
          out[0] = range[k][0] + t * (range[k - 1][0] - range[k][0]);
          out[1] = range[k][1] + t * (range[k - 1][1] - range[k][1]);
          return;
        }
      }
      const last = range[range.length - 1];
      out[0] = last[0];
      out[1] = last[1];
    },
  };
}

export const ramirezMelendez2005Giants = {
  'B-V': relation('B-V'),
  'V-Rc': relation('V-Rc'),
  'V-Ic': relation('V-Ic'),
} as const satisfies Record<RamirezMelendez2005Colour, ColourTeffRelation>;
