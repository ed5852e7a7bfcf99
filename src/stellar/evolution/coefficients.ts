/**
 * The metallicity-dependent coefficients of the analytic evolution formulae, evaluated at one Z.
 *
 * Sources: Tout et al. 1996 (MNRAS 281, 257), Tables 1-2, for the ZAMS; Hurley, Pols & Tout 2000
 * (HPT2000; MNRAS 315, 543), Appendix, for a_n (n = 1..81) and b_n (n = 1..57). The polynomial parts live
 * in `data/coefficients.json` (with their provenance); the clamps, transformations and the coefficients
 * that the Appendix defines by explicit formulae are applied here, each with its source. zeta =
 * log10(Z/0.02) and sigma = log10(Z), as in the paper.
 */
import data from './data/coefficients.json' with { type: 'json' };

export interface Coefficients {
  readonly Z: number;
  readonly zeta: number;
  /** a[n] for n = 1..81 (a[0] unused). */
  readonly a: Float64Array;
  /** b[n] for n = 1..57 (b[0] unused). */
  readonly b: Float64Array;
  /** Tout et al. 1996 luminosity coefficients alpha, beta, gamma, delta, epsilon, zeta, eta. */
  readonly zamsL: Float64Array;
  /** Tout et al. 1996 radius coefficients theta, iota, kappa, lambda, mu, nu, xi, omicron, pi. */
  readonly zamsR: Float64Array;
}

type PolyTable = Record<string, number[]>;

function poly(c: readonly number[], x: number): number {
  let v = 0;
  for (let i = c.length - 1; i >= 0; i--) v = v * x + c[i];
  return v;
}

/** The fitted branch of alpha_R (HPT2000 eq. 21), needed when the Appendix resets a64 to alpha_R(a66). */
function alphaRFormula(a: Float64Array, m: number): number {
  return (a[58] * m ** a[60]) / (a[59] + m ** a[61]);
}

/**
 * The JSON tables as (index, polynomial) pairs, read once: a sampler that moves [Fe/H] builds a model at
 * every call, and walking the JSON objects by their string keys cost more than the polynomials.
 */
interface CompiledTable {
  index: Int32Array;
  coef: (readonly number[])[];
}

function compile(tab: PolyTable): CompiledTable {
  const entries = Object.entries(tab);
  return { index: Int32Array.from(entries, ([k]) => Number(k)), coef: entries.map(([, c]) => c) };
}

const A_TABLE = compile(data.hpt2000.a as PolyTable);
const B_TABLE = compile(data.hpt2000.b as PolyTable);
const ZAMS_L_TABLE: (readonly number[])[] = Object.values(data.tout1996.luminosity);
const ZAMS_R_TABLE: (readonly number[])[] = Object.values(data.tout1996.radius);

function fillFrom(t: CompiledTable, zeta: number, out: Float64Array): void {
  for (let i = 0; i < t.index.length; i++) out[t.index[i]] = poly(t.coef[i], zeta);
}

export function computeCoefficients(Z: number): Coefficients {
  const zeta = Math.log10(Z / 0.02);
  const sigma = Math.log10(Z);
  // One backing store for the four tables (a new model is built whenever a sampler moves [Fe/H]).
  const nL = ZAMS_L_TABLE.length;
  const store = new ArrayBuffer(8 * (82 + 58 + nL + ZAMS_R_TABLE.length));
  const a = new Float64Array(store, 0, 82);
  const b = new Float64Array(store, 8 * 82, 58);
  fillFrom(A_TABLE, zeta, a);
  fillFrom(B_TABLE, zeta, b);

  // --- HPT2000 Appendix: a_n transformations and explicit definitions ---
  a[11] *= a[14];
  a[12] *= a[14];
  a[17] = 10 ** Math.max(0.097 - 0.1072 * (sigma + 3), Math.max(0.097, Math.min(0.1461, 0.1461 + 0.1237 * (sigma + 2))));
  a[18] *= a[20];
  a[19] *= a[20];
  a[29] = a[29] ** a[32];
  // a33 has no polynomial in the table; a57 is the same mass scale with the same clamps.
  const hookMassScale = (v: number): number => Math.max(0.6355 - 0.4192 * zeta, Math.max(1.25, Math.min(1.4, v)));
  a[33] = hookMassScale(1.5135 + 0.3769 * zeta);
  a[57] = hookMassScale(a[57]);
  a[42] = Math.min(1.25, Math.max(1.1, a[42]));
  a[44] = Math.min(1.3, Math.max(0.45, a[44]));
  a[49] = Math.max(a[49], 0.145);
  a[50] = Math.min(a[50], 0.306 + 0.053 * zeta);
  a[51] = Math.min(a[51], 0.3625 + 0.062 * zeta);
  a[52] = Math.max(a[52], 0.9);
  a[53] = Math.max(a[53], 1.0);
  if (Z > 0.01) {
    a[52] = Math.min(a[52], 1.0);
    a[53] = Math.min(a[53], 1.1);
  }
  a[62] = Math.max(0.065, a[62]);
  if (Z < 0.004) a[63] = Math.min(0.055, a[63]);
  a[64] = Math.max(0.091, Math.min(0.121, a[64]));
  a[66] = Math.max(a[66], Math.min(1.6, -0.308 - 1.046 * zeta));
  a[66] = Math.max(0.8, Math.min(0.8 - 2.0 * zeta, a[66]));
  a[68] = Math.max(0.9, Math.min(a[68], 1.0));
  if (a[68] > a[66]) {
    a[68] = a[66];
    a[64] = alphaRFormula(a, a[66]);
  }
  if (Z > 0.01) a[72] = Math.max(a[72], 0.95);
  a[74] = Math.max(1.4, Math.min(1.6, a[74]));
  a[75] = Math.max(1.0, Math.min(1.27, a[75]), 0.6355 - 0.4192 * zeta);
  a[76] = Math.max(a[76], -0.1015564 - 0.2161264 * zeta - 0.05182516 * zeta * zeta);
  a[77] = Math.max(-0.3868776 - 0.5457078 * zeta - 0.1463472 * zeta * zeta, Math.min(0.0, a[77]));
  a[78] = Math.max(0.0, Math.min(a[78], 7.454 + 9.046 * zeta));
  a[79] = Math.min(a[79], Math.max(2.0, -13.3 - 18.6 * zeta));
  a[80] = Math.max(0.0585542, a[80]);
  a[81] = Math.min(1.5, Math.max(0.4, a[81]));

  // --- HPT2000 Appendix: b_n transformations and explicit definitions ---
  // b1-b3 (R_GB, eq. 46; also R_AGB, eq. 74) switch branches in Z, as published: b2's linear floor takes
  // over from its power law at Z = 0.00100 while b3 is near its maximum (0.971 at Z = 0.00103), and b1 leaves
  // its 0.54 cap at Z = 0.00277. Between Z of about 0.0012 and 0.0037 this makes the upper giant branch up to
  // 1000 K cooler than at both lower and higher Z (checked against independent evaluations of the Appendix;
  // tests/stellar/isochroneMagnitudes.test.ts and smoothness.test.ts give the figures). Not a copying slip: the numbers match the paper.
  b[1] = Math.min(0.54, b[1]);
  b[2] = 10 ** (-4.6739 - 0.9394 * sigma);
  b[2] = Math.min(Math.max(b[2], -0.04167 + 55.67 * Z), 0.4771 - 9329.21 * Z ** 2.94);
  b[3] = 10 ** Math.max(-0.1451, -2.2794 - 1.5175 * sigma - 0.254 * sigma * sigma);
  if (Z > 0.004) b[3] = Math.max(b[3], 0.7307 + 14265.1 * Z ** 3.395);
  b[11] = b[11] ** 2;
  b[13] = b[13] ** 2;
  b[14] = b[14] ** b[15];
  b[16] = b[16] ** b[15];
  b[17] = zeta > -1 ? 1 - 0.3880523 * (zeta + 1) ** 0.637176 : 1;
  b[24] = b[24] ** b[28];
  b[26] = 5 - 0.09138012 * Z ** -0.3671407;
  b[27] = b[27] ** (2 * b[28]);
  b[31] = b[31] ** b[33];
  b[34] = b[34] ** b[33];
  b[36] = b[36] ** 4;
  b[37] = 4 * b[37];
  b[38] = b[38] ** 4;
  b[40] = Math.max(b[40], 1.0);
  b[41] = b[41] ** b[42];
  b[44] = b[44] ** 5;
  const rho = zeta + 1;
  b[45] = rho > 0 ? 1 - rho * (2.47162 + rho * (-5.401682 + rho * 3.247361)) : 1;
  b[47] = 1 - rho * (1.127733 + rho * (0.2344416 - rho * 0.3793726));
  b[55] = Math.min(0.99164 - 743.123 * Z ** 2.83, b[55]);
  b[50] = b[55] * b[3];

  const zamsL = new Float64Array(store, 8 * (82 + 58), nL);
  for (let i = 0; i < zamsL.length; i++) zamsL[i] = poly(ZAMS_L_TABLE[i], zeta);
  const zamsR = new Float64Array(store, 8 * (82 + 58 + nL), ZAMS_R_TABLE.length);
  for (let i = 0; i < zamsR.length; i++) zamsR[i] = poly(ZAMS_R_TABLE[i], zeta);
  return { Z, zeta, a, b, zamsL, zamsR };
}
