/**
 * The extinction model: R_b = A_b/E(B-V) for every band, so that A_b = R_b E(B-V).
 *
 *   Johnson-Cousins and 2MASS: R_b = R_V A_lambda/A_V of the law at the band's effective wavenumber
 *     (core/bands.ts: CCM89 Table 3 values, and for Cousins Rc and Ic their own mean wavenumbers).
 *     The same for every star.
 *   Gaia G, BP, RP: Casagrande et al. 2021 coefficients in the star's intrinsic (BP-RP)_0, which comes from
 *     the built-in photometry at the star's (log Teff, log g, [Fe/H]) (gaiaCoefficients.ts).
 *
 * R_b is evaluated at E(B-V) -> 0 and applied linearly; the curvature of A_G in E(B-V) (the star reddens
 * as it is extinguished) is neglected, which matters only at E(B-V) of order 1.
 */
import { BAND_IDS, BANDS, type BandId } from '../../core/bands.js';
import { ModelError } from '../../core/errors.js';
import type { ExtinctionModel } from '../types.js';
import { bcTable, gridPosition, interpolate, newGridPosition } from '../photometry/bcTable.js';
import { odonnell94 } from './cardelli1989.js';
import { GAIA_COEFFICIENT_COLOUR_RANGE, gaiaExtinctionRatioCod, heldColour, ratioBP, ratioG, ratioRP, type GaiaBand } from './gaiaCoefficients.js';
import { checkRv, EXTINCTION_LAWS, extinctionCurve, LAW_CITATIONS, type ExtinctionLaw } from './laws.js';

export interface ExtinctionOptions {
  /** Default 'odonnell94' (CCM89 with O'Donnell 1994 in the optical), the law the Gaia coefficients assume. */
  law?: ExtinctionLaw;
  /** Default 3.1. */
  rv?: number;
}

export interface BuiltinExtinctionModel extends ExtinctionModel {
  readonly law: ExtinctionLaw;
  readonly rv: number;
  /** R_b of a band whose ratio does not depend on the star (undefined for Gaia bands). */
  fixedRatio(band: BandId): number | undefined;
  /** R_b of a Gaia band for a star of intrinsic colour (BP-RP)_0. */
  gaiaRatio(band: GaiaBand, bpRp0: number): number;
}

const BAND_COUNT = BAND_IDS.length;

function isGaia(band: BandId): band is GaiaBand {
  return band === 'G' || band === 'BP' || band === 'RP';
}

/** Wavenumber (per micrometre) at which a law is evaluated for a band. */
export function extinctionWavenumber(band: BandId): number {
  const info = BANDS[band];
  return info.xExtinctionInvUm ?? info.xInvUm;
}

export function extinctionModel(options: ExtinctionOptions = {}): BuiltinExtinctionModel {
  const law = options.law ?? 'odonnell94';
  const rv = options.rv ?? 3.1;
  if (!(EXTINCTION_LAWS as readonly string[]).includes(law)) {
    throw new ModelError(`unknown extinction law ${String(law)}`, { found: law, expected: EXTINCTION_LAWS.join(', ') });
  }
  checkRv(rv);
  const curve = extinctionCurve(law, rv);

  const fixed = new Map<BandId, number>();
  const gaiaScale = new Map<GaiaBand, number>();
  for (const b of Object.keys(BANDS) as BandId[]) {
    const x = extinctionWavenumber(b);
    if (isGaia(b)) gaiaScale.set(b, (rv * curve(x)) / (3.1 * odonnell94(x, 3.1)));
    else fixed.set(b, rv * curve(x));
  }

  const gaiaRatio = (band: GaiaBand, bpRp0: number) => (gaiaScale.get(band) as number) * gaiaExtinctionRatioCod(band, bpRp0);

  const provenance =
    `${LAW_CITATIONS[law]}, R_V = ${rv}; A_b = R_b E(B-V). ` +
    'Johnson-Cousins and 2MASS: the law at the band\'s effective wavenumber (B 2.27, V 1.82, J 0.80, H 0.63, Ks 0.46 per micron, CCM89 Table 3; ' +
    'Rc 1.533 and Ic 1.248 per micron, Bessell 1990 passbands for a 5772 K black body). ' +
    `Gaia G, BP, RP: Casagrande et al. 2021 CCM89+O'Donnell (R_V = 3.1) coefficients as polynomials in the star's intrinsic (BP-RP)_0 from the built-in photometry, ` +
    `held constant outside ${GAIA_COEFFICIENT_COLOUR_RANGE[0]}-${GAIA_COEFFICIENT_COLOUR_RANGE[1]}` +
    (law === 'odonnell94' && rv === 3.1 ? '.' : `, scaled to ${LAW_CITATIONS[law]} at R_V = ${rv} by the ratio of the laws at each passband's pivot wavelength (approximate).`);

  const pos = newGridPosition();
  // Per call: what each requested band needs (0 fixed ratio, 1 G, 2 BP, 3 RP) and its scale or ratio.
  const kind = new Uint8Array(BAND_COUNT);
  const value = new Float64Array(BAND_COUNT);
  const scaleG = gaiaScale.get('G') as number;
  const scaleBP = gaiaScale.get('BP') as number;
  const scaleRP = gaiaScale.get('RP') as number;

  function ratios(bands: readonly BandId[], logTeff: Float64Array, logg: Float64Array, feh: number, out: Float64Array[], n: number): void {
    const nb = bands.length;
    if (out.length < nb) throw new ModelError(`ratios needs one output array per band: got ${out.length} for ${nb} bands`);
    if (nb > BAND_COUNT) throw new ModelError(`ratios was given ${nb} bands; there are only ${BAND_COUNT}`);
    let anyGaia = false;
    for (let b = 0; b < nb; b++) {
      const band = bands[b];
      const r = fixed.get(band);
      if (r !== undefined) {
        kind[b] = 0;
        out[b].fill(r, 0, n);
      } else if (isGaia(band)) {
        kind[b] = band === 'G' ? 1 : band === 'BP' ? 2 : 3;
        value[b] = band === 'G' ? scaleG : band === 'BP' ? scaleBP : scaleRP;
        anyGaia = true;
      } else {
        throw new ModelError(`no extinction coefficient for band ${band}`);
      }
    }
    if (!anyGaia) return;
    const rpTable = bcTable('RP', feh);
    const bpTable = bcTable('BP', feh);
    for (let k = 0; k < n; k++) {
      // (BP-RP)_0 = M_BP - M_RP = BC_RP - BC_BP.
      const bpRp0 = gridPosition(logTeff[k], logg[k], feh, pos) ? interpolate(rpTable, pos) - interpolate(bpTable, pos) : NaN;
      const x = heldColour(bpRp0);
      for (let b = 0; b < nb; b++) {
        const c = kind[b];
        if (c === 0) continue;
        out[b][k] = value[b] * (c === 1 ? ratioG(x) : c === 2 ? ratioBP(x) : ratioRP(x));
      }
    }
  }

  return { law, rv, provenance, ratios, fixedRatio: (band) => fixed.get(band), gaiaRatio };
}
