import type { TopLevelSpec } from 'vega-lite';
import { PLOT_CONFIG, wrapTitle } from './theme.js';

/**
 * Panels side by side (e.g. an observed and a simulated CMD on the same axes), under one title. Each
 * panel is a spec from the plot builders; their own $schema and config are dropped in favour of one.
 */
export function sideBySideSpec(panels: TopLevelSpec[], o: { title?: string; subtitle?: string; widthPx?: number } = {}): TopLevelSpec {
  const inner = panels.map((p) => {
    const { $schema: _s, config: _c, ...rest } = p as unknown as Record<string, unknown>;
    return rest;
  });
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: PLOT_CONFIG,
    ...(o.title ? { title: { text: o.title, ...(o.subtitle ? { subtitle: wrapTitle(o.subtitle, o.widthPx ?? 600, 10), subtitleFontSize: 10, subtitleColor: '#555' } : {}) } } : {}),
    spacing: 24,
    hconcat: inner,
  } as unknown as TopLevelSpec;
}
