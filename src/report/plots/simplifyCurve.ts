/**
 * Fewer nodes for a curve that is drawn, not computed with: isochrones carry a thousand or more nodes,
 * and a band of a hundred of them would bloat an SVG to megabytes. The Ramer-Douglas-Peucker
 * simplification (simplify-js) drops nodes whose removal moves the drawn line by less than a tolerance
 * measured in pixels, so the picture is unchanged at the size it is drawn.
 */
import simplify from 'simplify-js';
import type { CmdCurve } from './cmdPlot.js';

export interface PixelScale {
  /** Pixels per unit of colour (x) and of magnitude (y). */
  xPerUnit: number;
  yPerUnit: number;
}

interface Node {
  x: number;
  y: number;
  k: number;
}

/** The curve with nodes dropped where the line moves by less than `tolerancePx` (default 0.25 px). */
export function simplifyCurve(c: CmdCurve, scale: PixelScale, tolerancePx = 0.25): CmdCurve {
  const seg = c.segment;
  const kept: number[] = [];
  let start = 0;
  // Segments are simplified one by one so that their ends (the breaks) survive.
  for (let k = 1; k <= c.mag.length; k++) {
    if (k < c.mag.length && (!seg || seg[k] === seg[k - 1])) continue;
    const nodes: Node[] = [];
    for (let j = start; j < k; j++) {
      if (Number.isFinite(c.colour[j]) && Number.isFinite(c.mag[j])) nodes.push({ x: c.colour[j] * scale.xPerUnit, y: c.mag[j] * scale.yPerUnit, k: j });
    }
    for (const n of simplify(nodes, tolerancePx, true) as Node[]) kept.push(n.k);
    start = k;
  }
  return {
    ...c,
    colour: kept.map((k) => c.colour[k]),
    mag: kept.map((k) => c.mag[k]),
    segment: seg ? kept.map((k) => seg[k]) : undefined,
  };
}

/** Pixels per data unit of a plot `width` x `height` showing `xDomain` x `yDomain`. */
export function pixelScale(width: number, height: number, xDomain: [number, number], yDomain: [number, number]): PixelScale {
  return { xPerUnit: width / Math.abs(xDomain[1] - xDomain[0] || 1), yPerUnit: height / Math.abs(yDomain[1] - yDomain[0] || 1) };
}
