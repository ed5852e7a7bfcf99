/**
 * Gaia DR3 G, BP, RP and 2MASS J, H, Ks: the calibration, evaluated directly (exact, slow; bcTable.ts
 * tabulates it).
 *
 *   G:  M_G = M_bol - BC_G, BC_G from Andrae et al. 2018 (3300-8000 K).
 *   BP, RP, J, H, Ks: colours G-BP, BP-RP, G-J, G-H, G-Ks from Casagrande et al. 2021 (Gaia DR3 set, with
 *       log g and [Fe/H] terms, dwarfs and giants in one formula), inverted.
 *
 * Beyond the published ranges: BC_G hotter than 8000 K follows Flower's BC_V (G - V is nearly constant,
 * about 0.0-0.02 mag, for B and A dwarfs in the Pecaut & Mamajek sequence) with an offset and the slope
 * matched at the edge; cooler than 3300 K it follows a black body's BC_G with the slope matched. Colours
 * beyond their ranges follow Flower's B-V scaled when hotter and a black body's colour when cooler
 * (edges.ts).
 */
import { ANDRAE2018_TEFF_RANGE, andraeBcG, andraeBcGSlope } from './andrae2018.js';
import { casagrande2021 } from './casagrande2021.js';
import { prepareColour, preparedColour, type PreparedColour } from './colourRelation.js';
import { colourEdges } from './edges.js';
import { FLOWER_BCV_SHAPE } from './flower1996.js';
import { EFFECTIVE_WAVELENGTH_UM as L, extendBeyondEdge, planckBcShape, planckColourShape } from './planckShape.js';
import { pow10 } from './smooth.js';

const scratch = new Float64Array(2);

const G_BP_EDGES = colourEdges(planckColourShape(L.G, L.BP));
const BP_RP_EDGES = colourEdges(planckColourShape(L.BP, L.RP));
const G_J_EDGES = colourEdges(planckColourShape(L.G, L.J));
const G_H_EDGES = colourEdges(planckColourShape(L.G, L.H));
const G_KS_EDGES = colourEdges(planckColourShape(L.G, L.Ks));
const PLANCK_BCG = planckBcShape(L.G);

const LOG_TEFF_BCG_MIN = Math.log10(ANDRAE2018_TEFF_RANGE[0]);
const LOG_TEFF_BCG_MAX = Math.log10(ANDRAE2018_TEFF_RANGE[1]);

/** BC_G at log Teff: Andrae et al. 2018 inside 3300-8000 K, continued beyond (see the module comment). */
export function bcG(logTeff: number): number {
  if (logTeff > LOG_TEFF_BCG_MAX) {
    const e = LOG_TEFF_BCG_MAX;
    return extendBeyondEdge(logTeff, e, andraeBcG(pow10(e)), andraeBcGSlope(e), FLOWER_BCV_SHAPE, 'offset');
  }
  if (logTeff < LOG_TEFF_BCG_MIN) {
    const e = LOG_TEFF_BCG_MIN;
    return extendBeyondEdge(logTeff, e, andraeBcG(pow10(e)), andraeBcGSlope(e), PLANCK_BCG, 'scaled');
  }
  return andraeBcG(pow10(logTeff));
}

export interface GaiaTwoMassPoint {
  bcG: number;
  gBp: number;
  bpRp: number;
  gJ: number;
  gH: number;
  gKs: number;
}

/** The colour relations at one (log g, [Fe/H]), ready for any temperature. */
export interface PreparedGaiaTwoMass {
  gBp: PreparedColour;
  bpRp: PreparedColour;
  gJ: PreparedColour;
  gH: PreparedColour;
  gKs: PreparedColour;
}

export function prepareGaiaTwoMass(logg: number, feh: number): PreparedGaiaTwoMass {
  return {
    gBp: prepareColour(casagrande2021['G-BP'], logg, feh, G_BP_EDGES, scratch),
    bpRp: prepareColour(casagrande2021['BP-RP'], logg, feh, BP_RP_EDGES, scratch),
    gJ: prepareColour(casagrande2021['G-J'], logg, feh, G_J_EDGES, scratch),
    gH: prepareColour(casagrande2021['G-H'], logg, feh, G_H_EDGES, scratch),
    gKs: prepareColour(casagrande2021['G-Ks'], logg, feh, G_KS_EDGES, scratch),
  };
}

/**
 * Colours at logTeff; out.bcG is left for the caller (it depends on log Teff only). The colours already in
 * `out` start the root-finds (warm start along a temperature sweep); pass NaN there to start cold.
 */
export function evaluateGaiaTwoMassColours(p: PreparedGaiaTwoMass, logTeff: number, out: GaiaTwoMassPoint): void {
  out.gBp = preparedColour(p.gBp, logTeff, out.gBp);
  out.bpRp = preparedColour(p.bpRp, logTeff, out.bpRp);
  out.gJ = preparedColour(p.gJ, logTeff, out.gJ);
  out.gH = preparedColour(p.gH, logTeff, out.gH);
  out.gKs = preparedColour(p.gKs, logTeff, out.gKs);
}

/** The Gaia and 2MASS calibration at one point (direct evaluation). */
export function gaiaTwoMassPoint(logTeff: number, logg: number, feh: number): GaiaTwoMassPoint {
  const out = { bcG: bcG(logTeff), gBp: NaN, bpRp: NaN, gJ: NaN, gH: NaN, gKs: NaN };
  evaluateGaiaTwoMassColours(prepareGaiaTwoMass(logg, feh), logTeff, out);
  return out;
}
