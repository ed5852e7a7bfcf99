import type { Coefficients } from './coefficients.js';

/**
 * Everything about the analytic evolution model that depends on Z alone: the coefficients, the three
 * mass limits of HPT2000 eqs. (1)-(3), and the continuity constants that the paper fixes at M_HeF and
 * M_FGB. Built once per Z by `evolutionModel` and cached.
 */
export interface EvolutionModel {
  readonly Z: number;
  readonly coef: Coefficients;
  /** Mass above which the main sequence shows a hook (eq. 1). */
  readonly mHook: number;
  /** Maximum initial mass for a degenerate helium flash (eq. 2). */
  readonly mHeF: number;
  /** Maximum initial mass for helium ignition on the first giant branch (eq. 3). */
  readonly mFGB: number;
  /** x of eq. (6): t_MS >= x t_BGB. */
  readonly xMS: number;
  /** log10 D for M <= M_HeF (eq. 38): D0 = 5.37 + 0.135 zeta. */
  readonly logD0: number;
  readonly derived: DerivedConstants;
}

/** Constants that make the low- and intermediate-mass branches of the formulae meet (HPT2000 section 5). */
export interface DerivedConstants {
  /** L_HeI(M_HeF) from the intermediate-mass branch of eq. (49), and alpha_1 of its low-mass branch. */
  lHeIAtHeF: number;
  alpha1: number;
  /** L_BAGB(M_HeF) from eq. (56), and the low-mass continuity constant. */
  lBagbAtHeF: number;
  alpha3: number;
  /** Eq. (44): C = Mc(L_BGB(M_HeF))^4 - c1 M_HeF^c2, and the same with L_HeI (end of section 5.3). */
  cBGB: number;
  cHeI: number;
  /** t_He(M_HeF) (eq. 57) and the low-mass continuity constant alpha_4. */
  tHeAtHeF: number;
  alpha4: number;
  /** The constant c of eq. (51) for L_min,He, and L_min,He(M_HeF), which the ZAHB meets (eq. 53). */
  cMinHe: number;
  lMinHeAtHeF: number;
  /** R_mHe(M_HeF) / R_GB(M_HeF, L_ZAHB(M_HeF)): scales the low-mass R_mHe (eq. 55). */
  rMinHeRatioLM: number;
  /** Blue-loop fraction constants of eq. (58). */
  tblAlpha: number;
  tblLogExponent: number;
  tblHighNorm: number;
  /** AGB radius prefactor at M_HeF - 0.2 and at M_HeF (eq. 74), between which it is interpolated. */
  agbALow: number;
  agbAHigh: number;
}
