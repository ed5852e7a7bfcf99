/**
 * Johnson-Cousins B, V, Rc, Ic: the calibration, evaluated directly (exact, slow; bcTable.ts tabulates it).
 *
 *   V:  M_V = M_bol - BC_V, BC_V from Flower 1996 (Torres 2010 Table 1).
 *   B, Rc, Ic: colours B-V, V-Rc, V-Ic from infrared-flux-method relations, inverted: dwarfs and subgiants
 *       from Casagrande et al. 2010 (Table 4), giants from Ramirez & Melendez 2005 (Tables 3 and 5).
 *
 * Dwarf and giant relations are blended smoothly across log g 3.0-3.6 (weight of the dwarf relation rising
 * from 0 to 1). Each relation holds only on its published colour range (for Ramirez & Melendez, the range
 * of the star's [Fe/H] bin); beyond it a colour continues along a shape (planckShape.ts, edges.ts): B-V
 * along Flower's B-V-Teff relation (all luminosity classes, O to M), handed over to Flower's own values
 * from 7000 K; V-Rc and V-Ic along Flower's B-V scaled when hotter, a black body's colour when cooler.
 * BC_V is Flower's over 3160-45 000 K for giants; for dwarfs below 4250 K, where Flower's giant-dominated
 * calibrators make it too negative, it continues from 4250 K along a black body's BC_V with the slope
 * matched.
 *
 * Output is bolometric corrections BC_b = M_bol - M_b, so M_b = M_bol,sun - 2.5 log L - BC_b.
 */
import { casagrande2010 } from './casagrande2010.js';
import { prepareColour, preparedColour, type EdgeBehaviour, type PreparedColour } from './colourRelation.js';
import { colourEdges } from './edges.js';
import { FLOWER_BCV_DWARF_COOL_EDGE, FLOWER_BCV_RANGE, FLOWER_BV_SHAPE, flowerBcV } from './flower1996.js';
import { EFFECTIVE_WAVELENGTH_UM as L, extendBeyondEdge, planckBcShape, planckColourShape } from './planckShape.js';
import { ramirezMelendez2005Giants } from './ramirezMelendez2005.js';
import { smoothWeight } from './smooth.js';

/** Dwarf relations take over from giant ones across this log g interval. */
export const JC_GIANT_DWARF_LOGG = [3.0, 3.6] as const;

const scratch = new Float64Array(2);

const PLANCK_VR = planckColourShape(L.V, L.R);
const PLANCK_VI = planckColourShape(L.V, L.I);
const PLANCK_BCV = planckBcShape(L.V);

/**
 * B-V: hotter than the relation's edge it follows Flower's shape with the offset it has at the edge (which
 * carries the relation's metallicity dependence), and hands over to Flower's own B-V (all luminosity
 * classes, to O stars) over 0.06 dex from 7000 K or from the edge if that is hotter: metallicity matters
 * little to the colours of A and B stars. Cooler, it follows Flower's shape with an offset (Flower's cool
 * calibrators are giants, so his absolute values are not taken over for dwarfs).
 */
const BV_EDGES: EdgeBehaviour = {
  hot: { shape: FLOWER_BV_SHAPE, mode: 'offset', blendInto: { value: FLOWER_BV_SHAPE.value, widthDex: 0.06, fromLogTeff: Math.log10(7000) } },
  cool: { shape: FLOWER_BV_SHAPE, mode: 'offset' },
};
const VR_EDGES = colourEdges(PLANCK_VR);
const VI_EDGES = colourEdges(PLANCK_VI);

function slopeOf(f: (x: number) => number, x: number): number {
  const h = 1e-5;
  return (f(x + h) - f(x - h)) / (2 * h);
}

/** BC_V for giants: Flower's within 3.50 <= log Teff <= 4.65, black-body continued beyond. */
export function bcVGiant(logTeff: number): number {
  const { logTeffMin, logTeffMax } = FLOWER_BCV_RANGE;
  if (logTeff < logTeffMin) return extendBeyondEdge(logTeff, logTeffMin, flowerBcV(logTeffMin), slopeOf(flowerBcV, logTeffMin), PLANCK_BCV);
  if (logTeff > logTeffMax) return extendBeyondEdge(logTeff, logTeffMax, flowerBcV(logTeffMax), slopeOf(flowerBcV, logTeffMax), PLANCK_BCV);
  return flowerBcV(logTeff);
}

/** BC_V for dwarfs: as for giants, but black-body continued below 4250 K. */
export function bcVDwarf(logTeff: number): number {
  const edge = FLOWER_BCV_DWARF_COOL_EDGE;
  if (logTeff < edge) return extendBeyondEdge(logTeff, edge, flowerBcV(edge), slopeOf(flowerBcV, edge), PLANCK_BCV);
  return bcVGiant(logTeff);
}

/** B-V, V-Rc, V-Ic and BC_V at one point (direct evaluation). */
export interface JohnsonCousinsPoint {
  bcV: number;
  bv: number;
  vr: number;
  vi: number;
}

/** The colour relations of dwarfs or of giants at one [Fe/H], ready for any temperature. */
export interface PreparedJohnsonCousins {
  kind: 'dwarf' | 'giant';
  bv: PreparedColour;
  vr: PreparedColour;
  vi: PreparedColour;
}

/** Neither relation set depends on log g, so preparing at one [Fe/H] serves every gravity. */
export function prepareJohnsonCousins(kind: 'dwarf' | 'giant', feh: number): PreparedJohnsonCousins {
  const set = kind === 'dwarf' ? casagrande2010 : ramirezMelendez2005Giants;
  return {
    kind,
    bv: prepareColour(set['B-V'], 4, feh, BV_EDGES, scratch),
    vr: prepareColour(set['V-Rc'], 4, feh, VR_EDGES, scratch),
    vi: prepareColour(set['V-Ic'], 4, feh, VI_EDGES, scratch),
  };
}

/** Fills out at logTeff; the colours already in `out` start the root-finds (NaN to start cold). */
export function evaluateJohnsonCousins(p: PreparedJohnsonCousins, logTeff: number, out: JohnsonCousinsPoint): void {
  out.bcV = p.kind === 'dwarf' ? bcVDwarf(logTeff) : bcVGiant(logTeff);
  out.bv = preparedColour(p.bv, logTeff, out.bv);
  out.vr = preparedColour(p.vr, logTeff, out.vr);
  out.vi = preparedColour(p.vi, logTeff, out.vi);
}

/** Weight of the dwarf relations at this log g (0 for giants, 1 for dwarfs, smooth between). */
export function dwarfWeight(logg: number): number {
  return smoothWeight(logg, JC_GIANT_DWARF_LOGG[0], JC_GIANT_DWARF_LOGG[1]);
}

export function mixJohnsonCousins(dwarf: JohnsonCousinsPoint, giant: JohnsonCousinsPoint, wd: number, out: JohnsonCousinsPoint): void {
  out.bcV = wd * dwarf.bcV + (1 - wd) * giant.bcV;
  out.bv = wd * dwarf.bv + (1 - wd) * giant.bv;
  out.vr = wd * dwarf.vr + (1 - wd) * giant.vr;
  out.vi = wd * dwarf.vi + (1 - wd) * giant.vi;
}

/** The Johnson-Cousins calibration at one point (direct evaluation). */
export function johnsonCousinsPoint(logTeff: number, logg: number, feh: number): JohnsonCousinsPoint {
  const wd = dwarfWeight(logg);
  const d = { bcV: 0, bv: NaN, vr: NaN, vi: NaN };
  const g = { bcV: 0, bv: NaN, vr: NaN, vi: NaN };
  if (wd > 0) evaluateJohnsonCousins(prepareJohnsonCousins('dwarf', feh), logTeff, d);
  if (wd < 1) evaluateJohnsonCousins(prepareJohnsonCousins('giant', feh), logTeff, g);
  const out = { bcV: 0, bv: 0, vr: 0, vi: 0 };
  if (wd === 1) return d;
  if (wd === 0) return g;
  mixJohnsonCousins(d, g, wd, out);
  return out;
}
