/**
 * Initial mass functions, as number densities dN/dM in pieces, with the pieces' exact cumulative numbers
 * and the per-segment weight coefficients that the closed-form segment integral needs.
 *
 * - Kroupa 2001 (MNRAS 322, 231), eq. 2: dN/dM ∝ M^-alpha with alpha = 0.3 (0.01-0.08 Msun),
 *   1.3 (0.08-0.5) and 2.3 (above 0.5), continuous at the breaks. The default.
 * - Salpeter 1955 (ApJ 121, 161): alpha = 2.35 at all masses.
 * - Chabrier 2003 (PASP 115, 763), Table 1, single objects: dN/dlog10 M ∝ exp(-(log10 M - log10 0.079)^2
 *   / (2 * 0.69^2)) up to 1 Msun, and dN/dlog10 M ∝ M^-1.3 (dN/dM ∝ M^-2.3) above, joined continuously
 *   at 1 Msun (the paper's constants 0.158 and 4.43e-2 are normalisations, which cancel in the likelihood).
 *
 * The overall normalisation never matters: the likelihood divides by the selection integral Z, which
 * carries the same factor.
 */
import erf from '@stdlib/math-base-special-erf';

export type ImfName = 'kroupa2001' | 'salpeter1955' | 'chabrier2003';

interface PowerPiece {
  kind: 'power';
  /** Lower mass bound of the piece (Msun); the piece runs to the next piece's bound. */
  lo: number;
  alpha: number;
  /** log of the coefficient K in dN/dM = K M^-alpha. */
  lnK: number;
}

interface LogNormalPiece {
  kind: 'lognormal';
  lo: number;
  /** dN/dlog10 M = K exp(-(log10 M - log10Mc)^2 / (2 sigma^2)). */
  lnK: number;
  log10Mc: number;
  sigma: number;
}

type Piece = PowerPiece | LogNormalPiece;

export interface Imf {
  readonly name: ImfName;
  readonly citation: string;
  /** Masses where the functional form changes; polylines put a node at each so that weights stay exact. */
  readonly breaks: readonly number[];
  readonly pieces: readonly Piece[];
}

const LN10 = Math.LN10;

function powerPieces(lows: number[], alphas: number[]): PowerPiece[] {
  const out: PowerPiece[] = [];
  let lnK = 0;
  for (let i = 0; i < lows.length; i++) {
    // Continuity at lows[i]: K_i m^-a_i = K_{i-1} m^-a_{i-1}.
    if (i > 0) lnK += (alphas[i] - alphas[i - 1]) * Math.log(lows[i]);
    out.push({ kind: 'power', lo: lows[i], alpha: alphas[i], lnK });
  }
  return out;
}

export function makeImf(name: ImfName): Imf {
  switch (name) {
    case 'kroupa2001':
      return {
        name,
        citation: 'Kroupa 2001, MNRAS 322, 231 (eq. 2: slopes 0.3, 1.3, 2.3; breaks 0.08, 0.5 Msun)',
        breaks: [0.08, 0.5],
        pieces: powerPieces([0, 0.08, 0.5], [0.3, 1.3, 2.3]),
      };
    case 'salpeter1955':
      return { name, citation: 'Salpeter 1955, ApJ 121, 161 (slope 2.35)', breaks: [], pieces: powerPieces([0], [2.35]) };
    case 'chabrier2003': {
      const log10Mc = Math.log10(0.079);
      const sigma = 0.69;
      // dN/dM of the log-normal at 1 Msun: exp(-(0 - log10Mc)^2/(2 sigma^2)) / (1 * ln10); the power law
      // K M^-2.3 matches it there.
      const lnAt1 = -(log10Mc * log10Mc) / (2 * sigma * sigma) - Math.log(LN10);
      return {
        name,
        citation: 'Chabrier 2003, PASP 115, 763 (Table 1: log-normal, m_c = 0.079, sigma = 0.69, below 1 Msun; slope 2.3 above)',
        breaks: [1],
        pieces: [
          { kind: 'lognormal', lo: 0, lnK: 0, log10Mc, sigma },
          { kind: 'power', lo: 1, alpha: 2.3, lnK: lnAt1 },
        ],
      };
    }
  }
}

function pieceIndex(imf: Imf, mass: number): number {
  const p = imf.pieces;
  let i = p.length - 1;
  while (i > 0 && mass < p[i].lo) i--;
  return i;
}

/** log dN/dM at a mass. */
export function logImfDensity(imf: Imf, mass: number): number {
  const piece = imf.pieces[pieceIndex(imf, mass)];
  const lnM = Math.log(mass);
  if (piece.kind === 'power') return piece.lnK - piece.alpha * lnM;
  const d = lnM / LN10 - piece.log10Mc;
  return piece.lnK - (d * d) / (2 * piece.sigma * piece.sigma) - lnM - Math.log(LN10);
}

/**
 * Coefficients of ln w(t) = c0 + c1 t + c2 t^2, the number of stars per unit t on a segment from mass Ma
 * to Mb (Mb > Ma) along which ln M = ln Ma + L t, L = ln(Mb/Ma). Then w(t) = (dN/dM) dM/dt =
 * (dN/dM) M L. For a power-law piece: ln w = lnK + (1 - alpha)(ln Ma + L t) + ln L, exactly linear in t.
 * For the log-normal piece, (dN/dM) M = K exp(-(log10 M - log10Mc)^2/(2 sigma^2)) / ln10, with log10 M =
 * u + v t (u = log10 Ma, v = L / ln10), exactly quadratic in t. The segment must lie in one piece
 * (polylines place nodes at the breaks). Writes [c0, c1, c2] into out at offset k.
 */
export function segmentLogWeight(imf: Imf, lnMa: number, lnMb: number, out0: Float64Array, out1: Float64Array, out2: Float64Array, k: number): void {
  const L = lnMb - lnMa;
  const mid = Math.exp(0.5 * (lnMa + lnMb));
  const piece = imf.pieces[pieceIndex(imf, mid)];
  const lnL = Math.log(L);
  if (piece.kind === 'power') {
    out0[k] = piece.lnK + (1 - piece.alpha) * lnMa + lnL;
    out1[k] = (1 - piece.alpha) * L;
    out2[k] = 0;
    return;
  }
  const s2 = 2 * piece.sigma * piece.sigma;
  const u = lnMa / LN10 - piece.log10Mc;
  const v = L / LN10;
  out0[k] = piece.lnK - Math.log(LN10) + lnL - (u * u) / s2;
  out1[k] = (-2 * u * v) / s2;
  out2[k] = (-v * v) / s2;
}

/** Masses below this are never counted (only differences of cumulative numbers are used). */
const MASS_FLOOR = 0.01;

/**
 * Cumulative number N(M) = int_floor^M dN/dM' dM' from 0.01 Msun (in the IMF's own normalisation), exact
 * for each piece. Differences of it count the stars between two masses.
 */
export function imfCumulative(imf: Imf, mass: number): number {
  let total = 0;
  const p = imf.pieces;
  for (let i = 0; i < p.length; i++) {
    const lo = Math.max(p[i].lo, MASS_FLOOR);
    const hi = i + 1 < p.length ? p[i + 1].lo : Infinity;
    if (mass <= lo) break;
    if (hi <= lo) continue;
    total += pieceIntegral(p[i], lo, Math.min(mass, hi));
  }
  return total;
}

function pieceIntegral(piece: Piece, a: number, b: number): number {
  if (b <= a) return 0;
  if (piece.kind === 'power') {
    const K = Math.exp(piece.lnK);
    const e = 1 - piece.alpha;
    if (a === 0) return e > 0 ? (K * Math.pow(b, e)) / e : Infinity;
    if (Math.abs(e) < 1e-12) return K * Math.log(b / a);
    return (K * (Math.pow(b, e) - Math.pow(a, e))) / e;
  }
  // int K exp(-(l - lc)^2/(2 s^2)) dl over l = log10 M: K s sqrt(2pi) [Phi(.) - Phi(.)].
  const K = Math.exp(piece.lnK);
  const z = (l: number) => (l - piece.log10Mc) / piece.sigma;
  const la = a === 0 ? -Infinity : Math.log10(a);
  return K * piece.sigma * Math.sqrt(2 * Math.PI) * (phi(z(Math.log10(b))) - (la === -Infinity ? 0 : phi(z(la))));
}

function phi(x: number): number {
  // Only used for cumulative counts (simulation, tests), not in the hot loop.
  return 0.5 * (1 + erf(x / Math.SQRT2));
}


/**
 * Draw a mass from the IMF restricted to [mLo, mHi], by inverting the exact cumulative number with
 * bisection in log mass (60 halvings reach double precision; only the simulator calls this).
 */
export function sampleImfMass(imf: Imf, mLo: number, mHi: number, u: number): number {
  const nLo = imfCumulative(imf, mLo);
  const target = nLo + u * (imfCumulative(imf, mHi) - nLo);
  let a = Math.log(mLo);
  let b = Math.log(mHi);
  for (let i = 0; i < 60; i++) {
    const m = 0.5 * (a + b);
    if (imfCumulative(imf, Math.exp(m)) < target) a = m;
    else b = m;
  }
  return Math.exp(0.5 * (a + b));
}
