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
    return await view.toSVG();
  } finally {
    view.finalize();
  }
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
