import type { TopLevelSpec } from 'vega-lite';

/** The figures a run can have, in the order plots and the report show them. */
export const FIGURE_NAMES = ['corner', 'trace', 'tau', 'cmd', 'ppc'] as const;
export type FigureName = (typeof FIGURE_NAMES)[number];

/** A figure before rendering: its file name (plots/<name>.svg), a title and caption for the report, and the spec. */
export interface RunFigure {
  name: FigureName;
  title: string;
  caption: string;
  spec: TopLevelSpec;
}
