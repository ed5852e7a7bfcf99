/**
 * Casagrande et al. 2010 (A&A 512, A54), colour-Teff-[Fe/H] relations for dwarfs and subgiants from the
 * infrared flux method: theta = 5040/Teff = a0 + a1 X + a2 X^2 + a3 X [Fe/H] + a4 [Fe/H] + a5 [Fe/H]^2
 * (their eq. 3), coefficients and validity ranges from their Table 4 (Johnson B-V; Cousins V-Rc, V-Ic).
 * No gravity term. Outside its [Fe/H] range a relation is evaluated at the nearest [Fe/H] it covers
 * (smoothly, see softClamp).
 */
import type { ColourTeffRelation } from './colourRelation.js';
import { softClamp } from './smooth.js';

interface ThetaRelation {
  a: readonly [number, number, number, number, number, number];
  colour: readonly [number, number];
  feh: readonly [number, number];
}

const TABLE4 = {
  'B-V': { a: [0.5665, 0.4809, -0.006, -0.0613, -0.0042, -0.0055], colour: [0.18, 1.29], feh: [-5.0, 0.4] },
  'V-Rc': { a: [0.4386, 1.4614, -0.7014, -0.0807, 0.0142, -0.0015], colour: [0.24, 0.8], feh: [-5.0, 0.3] },
  'V-Ic': { a: [0.4033, 0.8171, -0.1987, -0.0409, 0.0319, 0.0012], colour: [0.46, 1.47], feh: [-5.0, 0.3] },
} as const satisfies Record<string, ThetaRelation>;

export type Casagrande2010Colour = keyof typeof TABLE4;

/** Width of the smooth hold at the [Fe/H] limits, in dex. */
const FEH_HOLD_WIDTH = 0.1;

function relation(name: Casagrande2010Colour): ColourTeffRelation {
  const { a, colour, feh: fehRange } = TABLE4[name];
  const theta = (x: number, f: number) => a[0] + a[1] * x + a[2] * x * x + a[3] * x * f + a[4] * f + a[5] * f * f;
  const dTheta = (x: number, f: number) => a[1] + 2 * a[2] * x + a[3] * f;
  const fehOf = (feh: number) => softClamp(feh, fehRange[0], fehRange[1], FEH_HOLD_WIDTH);
  return {
    source: `Casagrande et al. 2010, Table 4 (${name}, dwarfs and subgiants)`,
    teff(x, _logg, feh) {
      return 5040 / theta(x, fehOf(feh));
    },
    dTeffDx(x, _logg, feh) {
      const f = fehOf(feh);
      const t = theta(x, f);
      return (-5040 * dTheta(x, f)) / (t * t);
    },
    colourRange(_logg, _feh, range) {
      range[0] = colour[0];
      range[1] = colour[1];
    },
  };
}

export const casagrande2010 = {
  'B-V': relation('B-V'),
  'V-Rc': relation('V-Rc'),
  'V-Ic': relation('V-Ic'),
} as const satisfies Record<Casagrande2010Colour, ColourTeffRelation>;

export const CASAGRANDE2010_RANGES = TABLE4;
