/**
 * Every publication and reference implementation that the diagnostics follow, in one place. Modules refer
 * to these by name (e.g. "see VEHTARI_2021") instead of repeating the citation.
 */
export const CITATIONS = {
  /** Rank-normalised split-R-hat, folding, bulk and tail ESS, MCSE of quantiles, the thresholds. */
  VEHTARI_2021:
    'Vehtari, Gelman, Simpson, Carpenter & Buerkner 2021, "Rank-normalization, folding, and localization: an improved R-hat for assessing convergence of MCMC", Bayesian Analysis 16, 667',
  /** The reference implementation of VEHTARI_2021 that our numbers are checked against. */
  POSTERIOR_R: "R package posterior (Buerkner, Gabry, Kay & Vehtari), as packaged by Debian (r-cran-posterior 1.4.0): rhat, ess_bulk, ess_tail, ess_quantile, mcse_mean, mcse_quantile",
  /** Initial monotone sequence estimator of the autocorrelation sum, used by the ESS. */
  GEYER_1992: 'Geyer 1992, "Practical Markov chain Monte Carlo", Statistical Science 7, 473',
  /** Integrated autocorrelation time with the automatic window M >= c tau, c about 5; its variance. */
  SOKAL_1997:
    'Sokal 1997, "Monte Carlo methods in statistical mechanics: foundations and new algorithms", in Functional Integration (Cargese 1996), NATO ASI Series B 361, 131',
  /** The estimator of tau that our numbers are checked against: walkers' autocorrelations averaged, then Sokal's window. */
  EMCEE:
    'Foreman-Mackey, Hogg, Lang & Goodman 2013, PASP 125, 306, and the emcee documentation; reference implementation emcee.autocorr.integrated_time (Debian python3-emcee 3.1.4)',
  /** The normal quantile used for rank normalisation (and by R's qnorm). */
  WICHURA_1988: 'Wichura 1988, "Algorithm AS 241: the percentage points of the normal distribution", Applied Statistics 37, 477',
  /** Split-R-hat's ancestor, between- and within-chain variances. */
  GELMAN_RUBIN_1992: 'Gelman & Rubin 1992, "Inference from iterative simulation using multiple sequences", Statistical Science 7, 457',
} as const;

/**
 * Thresholds used by the verdict, each with where it comes from.
 */
export const THRESHOLDS = {
  /** R-hat below this (VEHTARI_2021, its recommendations). */
  rhat: 1.01,
  /** Bulk and tail ESS above this, for the whole run (VEHTARI_2021, its recommendations: 100 per chain for 4 chains). */
  ess: 400,
  /** Chain length of at least this many tau: common practice, documented with emcee (EMCEE). */
  tauMultiple: 50,
  /** Burn-in suggested as this many tau_max: common practice, emcee's monitoring tutorial discards 2 tau_max (from memory). */
  burnInTauMultiple: 2,
} as const;
