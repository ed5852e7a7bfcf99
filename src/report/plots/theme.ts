import type { Config } from 'vega-lite';

/** coeval's plot look: quiet axes, a serif-free font that every Debian machine has, journal-size text. */
export const PLOT_CONFIG: Config = {
  font: 'DejaVu Sans',
  background: 'white',
  view: { stroke: '#444' },
  axis: { labelFontSize: 11, titleFontSize: 12, grid: false, tickColor: '#444', domainColor: '#444', titleFontWeight: 'normal' },
  legend: { labelFontSize: 11, titleFontSize: 11, titleFontWeight: 'normal' },
  title: { fontSize: 13, fontWeight: 'normal', anchor: 'start' },
};

/** Line colours for isochrones drawn together (colour-blind-safe set from Okabe & Ito 2008). */
export const LINE_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000'];
