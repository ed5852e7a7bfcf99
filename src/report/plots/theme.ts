import type { Config } from 'vega-lite';

/** coeval's plot look: quiet axes, a serif-free font that every Debian machine has, journal-size text. */
export const PLOT_CONFIG: Config = {
  font: 'DejaVu Sans',
  // No ARIA attributes on every mark: they triple the size of a plot of thousands of stars, and a screen
  // reader gains nothing from them; the report's captions describe each figure.
  aria: false,
  background: 'white',
  view: { stroke: '#444' },
  axis: { labelFontSize: 11, titleFontSize: 12, grid: false, tickColor: '#444', domainColor: '#444', titleFontWeight: 'normal' },
  legend: { labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'normal' },
  title: { fontSize: 13, fontWeight: 'normal', anchor: 'start' },
};

/** Line colours for isochrones drawn together (colour-blind-safe set from Okabe & Ito 2008). */
export const LINE_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000'];

/**
 * Break a title into lines that fit `widthPx`. Vega renders headless without a canvas, so it sizes text
 * by an estimate of 0.8 font sizes per character (vega-scenegraph); a long one-line subtitle would widen
 * the figure by hundreds of empty pixels. Lines are broken at spaces to fit that estimate.
 */
export function wrapTitle(text: string, widthPx: number, fontSizePx: number): string[] {
  const maxChars = Math.max(20, Math.floor(widthPx / (0.8 * fontSizePx)));
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line && line.length + 1 + word.length > maxChars) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}
