import { describe, expect, it } from 'vitest';
import { cmdPlotSpec } from '../../src/report/plots/cmdPlot.js';
import { renderSvg, svgToPng } from '../../src/report/render.js';

describe('CMD plot', () => {
  it('renders to SVG with reversed magnitudes and to a PNG of the requested scale', async () => {
    const colour = [0.4, 0.5, 0.7, 1.0];
    const mag = [8, 4, 2, -2];
    const svg = await renderSvg(
      cmdPlotSpec({ xTitle: 'B - V', yTitle: 'M_V', curves: [{ label: 'iso', colour, mag }], stars: { colour, mag }, width: 200, height: 300 }),
    );
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('B - V');
    expect(svg).toContain('M_V');
    // Bright at the top: the y axis labels run from small (bright) magnitudes at the top downwards, so the
    // label "-2" must appear above (smaller y translate) the label "8".
    const tickY = (label: string): number => {
      const m = new RegExp(`translate\\([^,]+,([\\d.]+)\\)"[^>]*>${label}<`).exec(svg);
      return m ? Number(m[1]) : Number.NaN;
    };
    expect(tickY('−2')).toBeLessThan(tickY('8'));
    const png = await svgToPng(svg, 1);
    // PNG signature and IHDR width (bytes 16-19, big-endian).
    expect(Array.from(png.slice(1, 4))).toEqual([0x50, 0x4e, 0x47]);
    const width = (png[16] << 24) | (png[17] << 16) | (png[18] << 8) | png[19];
    expect(width).toBeGreaterThan(200);
  });
});
