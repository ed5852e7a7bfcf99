/**
 * A smooth synthetic isochrone family for developing and testing the likelihood before the built-in
 * stellar model lands: a main sequence with a mass-luminosity relation, evolutionary brightening towards a
 * turnoff whose mass falls with age, a subgiant branch and a red giant branch, in B, V, I and J, all smooth
 * in log age and [Fe/H]. It is a toy with no claim to physical accuracy (invented for tests only);
 * likelihood results on it check the statistics and numerics, not stellar physics.
 */
import type { BandId } from '../../src/core/bands.js';
import { Phase, type ExtinctionModel, type Isochrone, type IsochroneRequest, type IsochroneSource, type ModelProvenance } from '../../src/stellar/types.js';

const BANDS: BandId[] = ['B', 'V', 'I', 'J', 'G', 'BP', 'RP'];

const PROVENANCE: ModelProvenance = {
  model: 'synthetic test isochrones (toy)',
  evolution: 'none: invented smooth relations for tests',
  solarZ: 0.02,
  alphaFe: 0,
  bands: { B: 'toy', V: 'toy', I: 'toy', J: 'toy', G: 'toy', BP: 'toy', RP: 'toy' },
  caveats: ['a toy for tests only'],
};

export interface SyntheticOptions {
  /** Main-sequence nodes (log-spaced in mass). */
  nMs?: number;
  /** Post-main-sequence nodes. */
  nPost?: number;
}

export class SyntheticIsochrones implements IsochroneSource {
  readonly provenance = PROVENANCE;
  readonly bands = BANDS;
  readonly domain = { logAgeYr: [8, 10.2] as const, feh: [-2.5, 0.5] as const };
  private readonly nMs: number;
  private readonly nPost: number;

  constructor(o: SyntheticOptions = {}) {
    this.nMs = o.nMs ?? 160;
    this.nPost = o.nPost ?? 240;
  }

  turnoffMass(logAgeYr: number, feh: number): number {
    return Math.pow(Math.pow(10, logAgeYr) / (1e10 * (1 + 0.25 * feh)), -1 / 2.5);
  }

  isochrone(logAgeYr: number, feh: number, request: IsochroneRequest): Isochrone | undefined {
    if (logAgeYr < this.domain.logAgeYr[0] || logAgeYr > this.domain.logAgeYr[1] || feh < this.domain.feh[0] || feh > this.domain.feh[1]) return undefined;
    const mTo = this.turnoffMass(logAgeYr, feh);
    const nMs = this.nMs;
    const nPost = this.nPost;
    const n = nMs + nPost;
    const mass = new Float64Array(n);
    const phase = new Uint8Array(n);
    const phaseCoord = new Float64Array(n);
    const logL = new Float64Array(n);
    const logTeff = new Float64Array(n);
    const logg = new Float64Array(n);
    const V = new Float64Array(n);
    const BV = new Float64Array(n);
    const lo = Math.log(0.1);
    const hi = Math.log(mTo);
    for (let k = 0; k < nMs; k++) {
      const m = Math.exp(lo + ((hi - lo) * k) / (nMs - 1));
      const lm = Math.log10(m);
      const x = m / mTo;
      mass[k] = m;
      phase[k] = Phase.MainSequence;
      phaseCoord[k] = 1 + x;
      V[k] = 4.8 - 8.5 * lm - 1.0 * lm * lm + 0.3 * feh - 0.7 * Math.pow(x, 6);
      BV[k] = 0.62 - 1.0 * lm + 0.1 * lm * lm + 0.12 * feh + 0.05 * Math.pow(x, 6);
      logg[k] = 4.5 - 0.3 * Math.pow(x, 6);
    }
    const vTo = V[nMs - 1];
    const cTo = BV[nMs - 1];
    for (let k = 0; k < nPost; k++) {
      const y = (k + 1) / nPost;
      const i = nMs + k;
      mass[i] = mTo * (1 + 0.06 * y);
      // Subgiant branch (y < 0.25): nearly flat in V, reddening; then the giant branch brightening.
      const sgb = smoothstep(Math.min(1, y / 0.25));
      const rgb = y > 0.25 ? (y - 0.25) / 0.75 : 0;
      phase[i] = y < 0.25 ? Phase.HertzsprungGap : Phase.GiantBranch;
      phaseCoord[i] = 2 + y;
      V[i] = vTo - 0.35 * sgb - 6.5 * Math.pow(rgb, 1.4);
      BV[i] = cTo + 0.45 * sgb + 0.7 * rgb * rgb + 0.15 * rgb + 0.1 * feh * rgb;
      logg[i] = 4.0 - 3.0 * rgb;
    }
    for (let k = 0; k < n; k++) {
      logTeff[k] = 3.76 - 0.25 * (BV[k] - 0.65);
      logL[k] = (4.74 - V[k]) / 2.5;
    }
    const absMag: Float64Array[] = [];
    for (const b of request.bands) {
      const out = new Float64Array(n);
      for (let k = 0; k < n; k++) {
        const c = BV[k];
        const vi = 0.85 * c + 0.05 * c * c;
        const vj = 1.6 * c + 0.1;
        // Toy Gaia magnitudes: G a little brighter than V for red stars, BP - RP about 1.25 (V - I).
        const g = V[k] - 0.02 - 0.25 * vi;
        const bprp = 1.25 * vi;
        switch (b) {
          case 'B': out[k] = V[k] + c; break;
          case 'V': out[k] = V[k]; break;
          case 'I': out[k] = V[k] - vi; break;
          case 'J': out[k] = V[k] - vj; break;
          case 'G': out[k] = g; break;
          case 'BP': out[k] = g + 0.35 * bprp; break;
          case 'RP': out[k] = g - 0.65 * bprp; break;
          default: out[k] = Number.NaN;
        }
      }
      absMag.push(out);
    }
    return { logAgeYr, feh, massInitial: mass, massCurrent: mass.slice(), phase, phaseCoord, logL, logTeff, logg, bands: [...request.bands], absMag, provenance: PROVENANCE };
  }
}

function smoothstep(x: number): number {
  return x * x * (3 - 2 * x);
}

/**
 * A_b / E(B-V) from Cardelli, Clayton & Mathis 1989 at R_V = 3.1: A_lambda/A_V = B 1.32258, V 1, I 0.47803,
 * J 0.28207 (as tabulated in karllark/dust_extinction's CCM89 test; references.md), times R_V.
 */
export const CCM89_RATIOS: Record<string, number> = { B: 3.1 * 1.32258, V: 3.1, I: 3.1 * 0.47803, J: 3.1 * 0.28207 };

/**
 * Constant ratios, or (colourSlope != 0) ratios that vary with the star's log Teff, a toy standing in for
 * the colour-dependent coefficients of broad bands, to exercise the per-node path.
 */
export class TestExtinction implements ExtinctionModel {
  readonly provenance: string;
  constructor(private readonly colourSlope = 0) {
    this.provenance = colourSlope === 0 ? 'CCM89, R_V = 3.1, constant per band' : 'toy colour-dependent ratios';
  }
  ratios(bands: readonly BandId[], logTeff: Float64Array, _logg: Float64Array, _feh: number, out: Float64Array[], n: number): void {
    bands.forEach((b, k) => {
      const r = CCM89_RATIOS[b];
      for (let j = 0; j < n; j++) out[k][j] = r * (1 + this.colourSlope * (logTeff[j] - 3.76));
    });
  }
}

/** Factories, for building the likelihood from a spec in another thread (spec.ts resolves these by name). */
export function syntheticIsochrones(o: SyntheticOptions = {}): SyntheticIsochrones {
  return new SyntheticIsochrones(o);
}
export function testExtinction(colourSlope = 0): TestExtinction {
  return new TestExtinction(colourSlope);
}
