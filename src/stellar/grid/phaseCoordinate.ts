/**
 * Phase coordinates: a number that rises strictly along each isochrone of a grid and marks the same
 * evolutionary point on neighbouring isochrones, so that interpolation combines like with like (a turnoff
 * with a turnoff, a giant-branch tip with a tip) instead of stars of equal mass, which at the turnoff sit in
 * different phases at different ages.
 *
 * Three sources, in order of preference:
 *  1. An EEP column (phase_kind = "eep"): the family's own equivalent evolutionary points; u = EEP.
 *  2. A stage-label column (phase_kind = "stage"): u = stage ordinal + the fraction of the stage's arc
 *     length covered (the arc runs from the stage's first row to the next stage's first row).
 *  3. Neither: u is derived from the curve's shape (below).
 *
 * Derived coordinate. The curve is measured in the plane (X, Y) = (10 log Teff, log L): a factor 10 makes
 * the subgiant branch (about 0.1 dex in Teff) and the giant branch (about 2-3 dex in L) comparable in length,
 * as they are in a colour-magnitude diagram. Each step has length sqrt(dX^2 + dY^2) + 1e-9 (the constant
 * keeps the coordinate strictly rising where a table repeats a point). Ten landmarks split the curve into nine
 * segments; landmark j has u = j, and within a segment u rises with the normalised arc length:
 *   0 START  the first row.
 *   1 FAINT  the faintest point before the turnoff (the start, unless pre-main-sequence stars lead in).
 *   6 TIP    (found first) the tip of the giant branch: the brightest point so far, at the first place where
 *            the curve has fallen from it by more than 0.05 dex in L while turning bluer by more than
 *            0.01 dex in Teff (helium ignition). The subgiant branch fades but turns red, and the bump
 *            neither fades nor turns blue that much. Without such a place, TIP = END.
 *   2 TO     the turnoff: the hottest point before TIP; where the main sequence ends in a hook, the hook's
 *            red end (the maximum before the hook is ill-defined where the upper main sequence is nearly
 *            vertical, while the hook's minimum is sharp).
 *   3 HOOKR  the red end of the hook (= TO), and
 *   4 HOOKB  its blue end. Turning points in log Teff are found by a zigzag filter with a threshold of
 *            0.01 dex (rounding noise and shallow main-sequence wiggles make none); a minimum next to the
 *            hottest point (before it, or before a second maximum after it), within 0.15 dex in Teff and
 *            0.5 dex in L, makes the hook. Without one, TO = HOOKR = HOOKB = the hottest point. A hook
 *            shallower than the threshold counts as none, so where it fades with age the coordinate shifts
 *            by the hook's small arc (a limitation of shape-derived phases; an EEP column has none).
 *   5 KNEE   the base of the giant branch: the point between HOOKB and TIP farthest from the straight line
 *            joining them (the knee where the subgiant branch turns up into the giant branch).
 *   7 LMIN   the faintest point after the tip (the zero-age horizontal branch, or the start of the blue loop).
 *   8 BLUE   the bluest point after LMIN (the blue end of the horizontal branch or of the loop).
 *   9 END    the last row.
 * A landmark that an isochrone does not have (no hook, no post-tip phases) coincides with its neighbour:
 * the segment has zero length, and the curve stays at that point while u crosses the segment. Because
 * such segments shrink continuously as a feature fades (a hook narrows as age increases), corresponding
 * segments stay matched between neighbouring isochrones, which is what interpolation needs. The
 * thresholds are fixed (common practice for turning-point detection; they are far above the rounding of
 * published tables, which give log Teff to 4-5 decimals, and far below real features).
 */
import { Phase } from '../types.js';
import type { GridTable } from './gridTable.js';

/** One isochrone of the grid as the interpolation sees it. */
export interface PreparedCurve {
  /** Phase coordinate of each vertex, strictly rising. */
  u: Float64Array;
  /** Grid row of each vertex (a row repeats where a zero-length segment sits). */
  src: Int32Array;
  /** coeval's phase label per vertex. */
  phase: Uint8Array;
}

export const DERIVED_SEGMENTS = 9;
const TEFF_WEIGHT = 10;
const ZIGZAG_TURNOFF = 0.01;
const TIP_DROP_L = 0.05;
const ZIGZAG_TIP = 0.01;
const HOOK_MAX_DTEFF = 0.15;
const HOOK_MAX_DL = 0.5;
/** coeval phase of each derived segment (approximate: the shape alone does not separate HB from AGB). */
const SEGMENT_PHASE: readonly Phase[] = [
  Phase.MainSequence,
  Phase.MainSequence,
  Phase.MainSequence,
  Phase.MainSequence,
  Phase.HertzsprungGap,
  Phase.GiantBranch,
  Phase.CoreHeliumBurning,
  Phase.CoreHeliumBurning,
  Phase.CoreHeliumBurning,
];

export function prepareCurve(g: GridTable, k: number): PreparedCurve {
  const { start, count } = g.isochrones[k];
  const derived = derivedCoordinate(g.logTeff, g.logL, start, count);
  const kind = g.meta.phaseKind;
  if (kind === 'eep' && g.phaseValue) {
    const u = g.phaseValue.slice(start, start + count);
    const src = new Int32Array(count);
    const phase = new Uint8Array(count);
    const rowPhase = vertexPhases(derived, count);
    for (let i = 0; i < count; i++) {
      src[i] = start + i;
      phase[i] = g.meta.eepEncodesPhase ? clampPhase(Math.floor(u[i])) : rowPhase[i];
    }
    return { u, src, phase };
  }
  if (kind === 'stage' && g.phaseValue) return stageCoordinate(g, start, count, derived);
  return { u: derived.u, src: offset(derived.src, start), phase: derived.phase };
}

function clampPhase(p: number): Phase {
  return Math.min(Phase.ThermallyPulsingAGB, Math.max(Phase.MainSequence, p)) as Phase;
}

function offset(a: Int32Array, by: number): Int32Array {
  const out = new Int32Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i] + by;
  return out;
}

/** Arc length along the curve in the (10 log Teff, log L) plane. */
function arcLength(x: Float64Array, y: Float64Array, start: number, n: number): Float64Array {
  const s = new Float64Array(n);
  for (let i = 1; i < n; i++) {
    const dx = TEFF_WEIGHT * (x[start + i] - x[start + i - 1]);
    const dy = y[start + i] - y[start + i - 1];
    s[i] = s[i - 1] + Math.sqrt(dx * dx + dy * dy) + 1e-9;
  }
  return s;
}

interface Turn {
  idx: number;
  max: boolean;
}

/** Turning points of v[from..to] that the curve leaves by at least delta (a zigzag filter). */
function zigzag(v: (i: number) => number, from: number, to: number, delta: number): Turn[] {
  const out: Turn[] = [];
  let dir = 0;
  let ext = from;
  let hi = from;
  let lo = from;
  for (let i = from + 1; i <= to; i++) {
    const x = v(i);
    if (dir === 0) {
      if (x > v(hi)) hi = i;
      if (x < v(lo)) lo = i;
      if (x - v(lo) >= delta) {
        if (lo > from) out.push({ idx: lo, max: false });
        dir = 1;
        ext = hi = i;
      } else if (v(hi) - x >= delta) {
        if (hi > from) out.push({ idx: hi, max: true });
        dir = -1;
        ext = lo = i;
      }
    } else if (dir > 0) {
      if (x > v(ext)) ext = i;
      else if (v(ext) - x >= delta) {
        out.push({ idx: ext, max: true });
        dir = -1;
        ext = i;
      }
    } else if (x < v(ext)) ext = i;
    else if (x - v(ext) >= delta) {
      out.push({ idx: ext, max: false });
      dir = 1;
      ext = i;
    }
  }
  return out;
}

export interface Landmarks {
  /** Vertex index (0-based, within the curve) of each of the ten landmarks. */
  idx: number[];
}

/** The ten landmarks of one curve (see the module comment). */
export function findLandmarks(x: Float64Array, y: Float64Array, start: number, n: number): Landmarks {
  const X = (i: number): number => x[start + i];
  const Y = (i: number): number => y[start + i];
  const end = n - 1;
  // TIP: the brightest point so far, once the curve has left it downwards (> TIP_DROP_L dex in L) and
  // bluewards (> ZIGZAG_TIP dex in Teff) at once; the subgiant branch fades while it turns red, and the
  // bump neither fades nor turns blue that much, so neither is taken for the tip.
  let tip = end;
  let brightest = 0;
  for (let i = 1; i <= end; i++) {
    if (Y(i) > Y(brightest)) brightest = i;
    else if (Y(brightest) - Y(i) > TIP_DROP_L && X(i) - X(brightest) > ZIGZAG_TIP) {
      tip = brightest;
      break;
    }
  }
  // TO: the hottest point before the tip; a hook is a maximum-minimum-maximum around it.
  let hot = 0;
  for (let i = 0; i <= tip; i++) if (X(i) > X(hot)) hot = i;
  let to = hot;
  let hookR = hot;
  let hookB = hot;
  const turns = zigzag(X, 0, tip, ZIGZAG_TURNOFF);
  const k = turns.findIndex((t) => t.idx === hot && t.max);
  const near = (a: number, b: number): boolean => Math.abs(X(a) - X(b)) < HOOK_MAX_DTEFF && Math.abs(Y(a) - Y(b)) < HOOK_MAX_DL;
  if (k >= 1 && !turns[k - 1].max && near(turns[k - 1].idx, hot)) {
    // The hottest point is the blue end of a hook whose red end comes just before it.
    to = hookR = turns[k - 1].idx;
  } else if (k >= 0 && k + 2 < turns.length && !turns[k + 1].max && turns[k + 2].max && near(turns[k + 1].idx, hot) && near(turns[k + 2].idx, hot)) {
    // The hottest point starts a hook: a minimum, then a (cooler) maximum.
    to = hookR = turns[k + 1].idx;
    hookB = turns[k + 2].idx;
  }
  // Knee: farthest from the chord hookB-tip in the scaled plane.
  let knee = hookB;
  if (tip - hookB >= 2) {
    const ax = TEFF_WEIGHT * X(hookB);
    const ay = Y(hookB);
    const bx = TEFF_WEIGHT * X(tip) - ax;
    const by = Y(tip) - ay;
    const len = Math.hypot(bx, by) || 1;
    let best = -1;
    for (let i = hookB + 1; i < tip; i++) {
      const d = Math.abs((TEFF_WEIGHT * X(i) - ax) * by - (Y(i) - ay) * bx) / len;
      if (d > best) {
        best = d;
        knee = i;
      }
    }
  }
  let lmin = end;
  if (tip < end) {
    for (let i = tip + 1; i <= end; i++) if (Y(i) < Y(lmin)) lmin = i;
  }
  let blue = lmin;
  for (let i = lmin; i <= end; i++) if (X(i) > X(blue)) blue = i;
  let faint = 0;
  for (let i = 0; i <= to; i++) if (Y(i) < Y(faint)) faint = i;
  const idx = [0, faint, to, hookR, hookB, knee, tip, lmin, blue, end];
  for (let j = 1; j < idx.length; j++) if (idx[j] < idx[j - 1]) idx[j] = idx[j - 1];
  return { idx };
}

interface Derived {
  u: Float64Array;
  /** Vertex index within the curve (0-based). */
  src: Int32Array;
  phase: Uint8Array;
  /** Segment of each original vertex (its first occurrence). */
  segmentOf: Int32Array;
}

function derivedCoordinate(x: Float64Array, y: Float64Array, start: number, n: number): Derived {
  const s = arcLength(x, y, start, n);
  const { idx } = findLandmarks(x, y, start, n);
  const u: number[] = [];
  const src: number[] = [];
  const phase: number[] = [];
  const segmentOf = new Int32Array(n).fill(-1);
  for (let j = 0; j < DERIVED_SEGMENTS; j++) {
    const a = idx[j];
    const b = idx[j + 1];
    if (b === a) {
      u.push(j);
      src.push(a);
      phase.push(SEGMENT_PHASE[j]);
      if (segmentOf[a] < 0) segmentOf[a] = j;
      continue;
    }
    const len = s[b] - s[a];
    for (let i = a; i < b; i++) {
      u.push(j + (s[i] - s[a]) / len);
      src.push(i);
      phase.push(SEGMENT_PHASE[j]);
      if (segmentOf[i] < 0) segmentOf[i] = j;
    }
  }
  u.push(DERIVED_SEGMENTS);
  src.push(n - 1);
  phase.push(SEGMENT_PHASE[DERIVED_SEGMENTS - 1]);
  if (segmentOf[n - 1] < 0) segmentOf[n - 1] = DERIVED_SEGMENTS - 1;
  return { u: Float64Array.from(u), src: Int32Array.from(src), phase: Uint8Array.from(phase), segmentOf };
}

/** coeval phase of each original vertex from the derived segmentation. */
function vertexPhases(d: Derived, n: number): Uint8Array {
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) out[i] = SEGMENT_PHASE[Math.max(0, d.segmentOf[i])];
  return out;
}

function stageCoordinate(g: GridTable, start: number, n: number, derived: Derived): PreparedCurve {
  const labels = g.meta.stageLabels ?? [];
  const map = g.meta.stagePhases ?? {};
  const st = g.phaseValue!;
  const s = arcLength(g.logTeff, g.logL, start, n);
  const rowPhase = vertexPhases(derived, n);
  const u: number[] = [];
  const src: number[] = [];
  const phase: number[] = [];
  let i = 0;
  while (i < n) {
    const stage = st[start + i];
    let j = i;
    while (j < n && st[start + j] === stage) j++;
    // This stage spans rows i..j-1 and reaches to row j (the next stage's first row), or ends at the last row.
    const endRow = j < n ? j : n - 1;
    const len = s[endRow] - s[i];
    for (let r = i; r < j; r++) {
      const frac = j < n ? (len > 0 ? (s[r] - s[i]) / len : 0) : len > 0 ? (s[r] - s[i]) / len : 0;
      // The last stage's last row sits at u = stage + 1 exactly; keep fractions below 1 elsewhere.
      u.push(stage + (j < n ? Math.min(frac, 1 - 1e-12) : frac));
      src.push(start + r);
      const label = labels[stage];
      phase.push(map[label] ?? rowPhase[r]);
    }
    // Stages that this isochrone skips between this one and the next: the curve waits at the next row.
    if (j < n) {
      const next = st[start + j];
      for (let skipped = stage + 1; skipped < next; skipped++) {
        u.push(skipped);
        src.push(start + j);
        phase.push(map[labels[skipped]] ?? rowPhase[j]);
      }
    }
    i = j;
  }
  // A single-row last stage has fraction 0; keep u rising.
  for (let k = 1; k < u.length; k++) if (!(u[k] > u[k - 1])) u[k] = u[k - 1] + 1e-9;
  return { u: Float64Array.from(u), src: Int32Array.from(src), phase: Uint8Array.from(phase) };
}
