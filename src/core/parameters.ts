/** A sampled parameter as the outputs describe it: chain-file column name, plot label, unit. */
export interface ParameterInfo {
  /** Column name in chain files and key in summaries, e.g. `log_age`. */
  name: string;
  /** Label for tables and plots, e.g. `log10(age / yr)`. */
  label: string;
  /** Unit, e.g. `dex`, `mag`, or `` for fractions. */
  unit: string;
}
