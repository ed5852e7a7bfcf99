/**
 * Plots are written as vega-lite specifications and rendered headless: vega-lite compiles to vega, vega
 * renders to SVG without a browser or canvas, and resvg rasterises SVG to PNG (for papers and slides).
 * The libraries are loaded on first use, because they are large and most commands never plot.
 */
import type { TopLevelSpec } from 'vega-lite';

export async function renderSvg(spec: TopLevelSpec): Promise<string> {
  const [{ compile }, vega] = await Promise.all([import('vega-lite'), import('vega')]);
  const compiled = compile(spec).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none' });
  try {
    return compactSvg(await view.toSVG());
  } finally {
    view.finalize();
  }
}

/**
 * Round the pixel coordinates in path data and transforms to 0.01 px (vega writes up to 16 digits), which
 * halves the size of plots with thousands of points and changes nothing visible; rgb() colours become hex, and zero stroke widths of unstroked paths go.
 */
export function compactSvg(svg: string): string {
  const round = (s: string): string => s.replace(/-?\d+\.\d{3,}(?:e-?\d+)?/g, (n) => String(Math.round(Number(n) * 100) / 100));
  const hex = (v: string): string => Number(v).toString(16).padStart(2, '0');
  return svg
    .replace(/( d="|transform="translate\()([^"]*)/g, (_m, head: string, body: string) => head + round(body))
    .replace(/="rgb\((\d+), (\d+), (\d+)\)"/g, (_m, r: string, g: string, b: string) => `="#${hex(r)}${hex(g)}${hex(b)}"`)
    // A zero stroke width on an element without a stroke says nothing (nothing is stroked either way).
    .replace(/<path [^>]*>/g, (el) => (el.includes(' stroke="') ? el : el.replace(' stroke-width="0"', '')));
}

/** Rasterise an SVG at `scale` times its size, on a white background. */
export async function svgToPng(svg: string, scale = 2): Promise<Uint8Array> {
  const { Resvg } = await import('@resvg/resvg-js');
  const resvg = new Resvg(svg, {
    background: 'white',
    fitTo: { mode: 'zoom', value: scale },
    font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' },
  });
  return resvg.render().asPng();
}
