/**
 * Colour as a function of temperature from a published temperature-colour relation.
 *
 * Calibrations are published as Teff = f(colour, log g, [Fe/H]) because they are fitted to stars of
 * measured colour. A model star has a temperature and needs a colour, so the relation is inverted: on its
 * valid colour interval f is monotone (the tests check this over the whole domain), and the root is found
 * by Newton's method kept inside a bracket (bisection when a Newton step would leave it), to 1e-11 mag.
 * Outside the interval's temperatures the colour continues along a shape from its edge (planckShape.ts), so
 * the colour is continuous in every input (and so is its first derivative, except where a slope ratio had
 * to be bounded).
 *
 * Everything that depends only on (log g, [Fe/H]) (the edges, the slopes there, the far-field slope ratio)
 * is computed once by `prepareColour`; `preparedColour` then costs one root-find or one shape evaluation
 * per temperature. The table builder (bcTable.ts) uses that split; `colourFromTeff` does both for one point.
 */
import { evaluateExtension, prepareExtension, SECANT_DEX, type Extension, type ExtensionMode, type Shape } from './planckShape.js';
import { pow10, smoothstep } from './smooth.js';

export interface ColourTeffRelation {
  /** Short citation, for provenance strings. */
  readonly source: string;
  /** Teff in kelvin of a star of colour x, surface gravity logg and metallicity feh. */
  teff(x: number, logg: number, feh: number): number;
  /** dTeff/dx at the same point. */
  dTeffDx(x: number, logg: number, feh: number): number;
  /** The valid colour interval at (logg, feh): range[0] < range[1]. Must vary continuously with both. */
  colourRange(logg: number, feh: number, range: Float64Array): void;
  /** A temperature window (kelvin) the relation is also restricted to, where its authors state one. */
  readonly teffRange?: readonly [number, number];
}

export interface EdgeSide {
  shape: Shape;
  mode: ExtensionMode;
  /** Bounds on the slope ratio (planckShape.ts); default [1/4, 4]. */
  slopeRatioRange?: readonly [number, number];
  /**
   * A published relation that covers the region beyond the edge: the extension hands over to it
   * smoothly (quintic weight, so value and slope stay continuous) over `widthDex`, starting at the edge or,
   * if given and farther out, at `fromLogTeff` (hot side only).
   */
  blendInto?: { value: (logTeff: number) => number; widthDex: number; fromLogTeff?: number };
  /** Width over which the slope converges from the edge's to the far-field one (default 0.05 dex). */
  saturationDex?: number;
}

export interface EdgeBehaviour {
  hot: EdgeSide;
  cool: EdgeSide;
}

const TOLERANCE = 1e-11;
const MAX_ITERATIONS = 60;

/** The valid temperature interval of a relation at (logg, feh), with the colours at its ends. */
export interface TeffEdges {
  logTeffHot: number;
  logTeffCool: number;
  colourHot: number;
  colourCool: number;
}

export function teffEdges(rel: ColourTeffRelation, logg: number, feh: number, scratch: Float64Array): TeffEdges {
  rel.colourRange(logg, feh, scratch);
  const ta = rel.teff(scratch[0], logg, feh);
  const tb = rel.teff(scratch[1], logg, feh);
  const e =
    ta >= tb
      ? { logTeffHot: Math.log10(ta), logTeffCool: Math.log10(tb), colourHot: scratch[0], colourCool: scratch[1] }
      : { logTeffHot: Math.log10(tb), logTeffCool: Math.log10(ta), colourHot: scratch[1], colourCool: scratch[0] };
  const window = rel.teffRange;
  if (window) {
    // Narrow the colour interval to the stated temperature window (colour found by inversion).
    const lo = Math.log10(window[0]);
    const hi = Math.log10(window[1]);
    const colourHot = e.logTeffHot > hi ? invertRelation(rel, window[1], hi, logg, feh, e) : e.colourHot;
    const colourCool = e.logTeffCool < lo ? invertRelation(rel, window[0], lo, logg, feh, e) : e.colourCool;
    e.colourHot = colourHot;
    e.colourCool = colourCool;
    if (e.logTeffHot > hi) e.logTeffHot = hi;
    if (e.logTeffCool < lo) e.logTeffCool = lo;
  }
  return e;
}

/** One side's extension, fixed for a (logg, feh). */
interface PreparedSide {
  extension: Extension;
  blendInto: EdgeSide['blendInto'];
}

/** A relation at fixed (logg, feh), ready to give colours at any temperature. */
export interface PreparedColour {
  rel: ColourTeffRelation;
  logg: number;
  feh: number;
  edges: TeffEdges;
  hot: PreparedSide;
  cool: PreparedSide;
}

function prepareSide(rel: ColourTeffRelation, logg: number, feh: number, e: TeffEdges, side: EdgeSide, isHot: boolean): PreparedSide {
  const logTeffEdge = isHot ? e.logTeffHot : e.logTeffCool;
  const colourEdge = isHot ? e.colourHot : e.colourCool;
  // dcolour/dlogTeff = (T ln 10) / (dTeff/dcolour)
  const slopeEdge = (pow10(logTeffEdge) * Math.LN10) / rel.dTeffDx(colourEdge, logg, feh);
  let farRatio = 1;
  if (side.mode === 'secant') {
    // Mean slope ratio over the last SECANT_DEX inside the range (or the whole range if narrower).
    const span = Math.min(SECANT_DEX, e.logTeffHot - e.logTeffCool);
    const logTeffInner = logTeffEdge + (isHot ? -span : span);
    const inner = invertRelation(rel, pow10(logTeffInner), logTeffInner, logg, feh, e);
    farRatio = (colourEdge - inner) / (side.shape.value(logTeffEdge) - side.shape.value(logTeffInner));
  }
  return {
    extension: prepareExtension(logTeffEdge, colourEdge, slopeEdge, side.shape, side.mode, side.slopeRatioRange, farRatio, side.saturationDex),
    blendInto: side.blendInto,
  };
}

export function prepareColour(rel: ColourTeffRelation, logg: number, feh: number, edges: EdgeBehaviour, scratch: Float64Array): PreparedColour {
  const e = teffEdges(rel, logg, feh, scratch);
  return {
    rel,
    logg,
    feh,
    edges: e,
    hot: prepareSide(rel, logg, feh, e, edges.hot, true),
    cool: prepareSide(rel, logg, feh, e, edges.cool, false),
  };
}

function extend(p: PreparedSide, logTeff: number): number {
  const q = evaluateExtension(p.extension, logTeff);
  const b = p.blendInto;
  if (!b) return q;
  const edge = p.extension.logTeffEdge;
  const delay = b.fromLogTeff !== undefined && b.fromLogTeff > edge ? b.fromLogTeff - edge : 0;
  const beyond = Math.abs(logTeff - edge) - delay;
  if (beyond <= 0) return q;
  const w = smoothstep(beyond / b.widthDex);
  return (1 - w) * q + w * b.value(logTeff);
}

/**
 * The colour at logTeff of a prepared relation. `guess` (optional) starts the root-find, e.g. the colour
 * at a neighbouring temperature; the root it converges to is the same.
 */
export function preparedColour(p: PreparedColour, logTeff: number, guess = NaN): number {
  const e = p.edges;
  if (logTeff >= e.logTeffHot) return extend(p.hot, logTeff);
  if (logTeff <= e.logTeffCool) return extend(p.cool, logTeff);
  return invertRelation(p.rel, pow10(logTeff), logTeff, p.logg, p.feh, e, guess);
}

/**
 * The colour of a star with this logTeff, logg and feh: the relation inverted inside its valid range,
 * continued as `edges` says outside it. `scratch`: a Float64Array of length >= 2.
 */
export function colourFromTeff(
  rel: ColourTeffRelation,
  logTeff: number,
  logg: number,
  feh: number,
  edges: EdgeBehaviour,
  scratch: Float64Array,
): number {
  return preparedColour(prepareColour(rel, logg, feh, edges, scratch), logTeff);
}

/** The colour inside the valid range at which rel.teff equals teff (bracketed Newton). */
export function invertRelation(rel: ColourTeffRelation, teff: number, logTeff: number, logg: number, feh: number, e: TeffEdges, guess = NaN): number {
  // Bracket [lo, hi] in colour with f(lo) > 0 > f(hi) for f = Teff(x) - teff, whichever way Teff runs.
  let lo = e.colourHot;
  let hi = e.colourCool;
  const inBracket = lo < hi ? guess > lo && guess < hi : guess > hi && guess < lo;
  let x = inBracket ? guess : lo + ((hi - lo) * (logTeff - e.logTeffHot)) / (e.logTeffCool - e.logTeffHot);
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const f = rel.teff(x, logg, feh) - teff;
    if (f === 0) return x;
    if (f > 0) lo = x;
    else hi = x;
    let next = x - f / rel.dTeffDx(x, logg, feh);
    const inside = lo < hi ? next > lo && next < hi : next > hi && next < lo;
    if (!inside || !Number.isFinite(next)) next = 0.5 * (lo + hi);
    if (Math.abs(next - x) < TOLERANCE) return next;
    x = next;
  }
  return x;
}
