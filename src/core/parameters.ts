/** A sampled parameter as the outputs describe it: chain-file column name, plot label, unit. */
export interface ParameterInfo {
  /** Column name in chain files and key in summaries, e.g. `log_age`. */
  name: string;
  /** Label for tables and plots, e.g. `log10(age / yr)`. */
  label: string;
  /** Unit, e.g. `dex`, `mag`, or `` for fractions. */
  unit: string;
}

/**
 * The cluster parameters, in the canonical order that full parameter vectors use (design.md section 2).
 * A fit samples some of them and fixes the others; see src/priors/parameterSpace.ts.
 */
export const CLUSTER_PARAMETER_NAMES = ['log_age', 'feh', 'dm', 'ebv', 'f_binary', 'f_field', 'sigma_extra'] as const;
export type ClusterParameterName = (typeof CLUSTER_PARAMETER_NAMES)[number];

export const CLUSTER_PARAMETERS: Readonly<Record<ClusterParameterName, ParameterInfo>> = {
  log_age: { name: 'log_age', label: 'log10(age / yr)', unit: 'dex' },
  feh: { name: 'feh', label: '[Fe/H]', unit: 'dex' },
  dm: { name: 'dm', label: '(m-M)_0', unit: 'mag' },
  ebv: { name: 'ebv', label: 'E(B-V)', unit: 'mag' },
  f_binary: { name: 'f_binary', label: 'binary fraction', unit: '' },
  f_field: { name: 'f_field', label: 'field fraction', unit: '' },
  sigma_extra: { name: 'sigma_extra', label: 'extra scatter', unit: 'mag' },
};
