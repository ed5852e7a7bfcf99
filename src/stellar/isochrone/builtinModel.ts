/**
 * The built-in model as an `IsochroneSource`: Hurley, Pols & Tout 2000 evolution with the built-in
 * photometric calibration (src/stellar/photometry) or another one passed in, over ages 10^8-10^10.15 yr and
 * the [Fe/H] range that maps onto the fits' Z range for the configured [alpha/Fe].
 */
import type { BandId } from '../../core/bands.js';
import type { Isochrone, IsochroneRequest, IsochroneSource, ModelProvenance, PhotometryModel } from '../types.js';
import { zToFeh } from '../evolution/metallicity.js';
import { DEFAULT_REIMERS_ETA } from '../evolution/massLoss.js';
import { Z_MAX_ACCEPTED, Z_RANGE } from '../evolution/model.js';
import { builtinPhotometry } from '../photometry/index.js';
import { isochrone, LOG_AGE_RANGE, type IsochroneOptions } from './isochrone.js';
import { builtinProvenance } from './provenance.js';

export interface BuiltinModelOptions {
  /** The photometric calibration; the built-in one (src/stellar/photometry) by default. */
  photometry?: PhotometryModel;
  /** [alpha/Fe] for [Fe/H] -> [M/H] (Salaris et al. 1993); 0 by default. */
  alphaFe?: number;
  /** Reimers eta; 0.5 (HPT2000) by default. */
  eta?: number;
  maxStepMag?: number;
  maxStepMagSparse?: number;
}

export function builtinModel(options: BuiltinModelOptions = {}): IsochroneSource {
  const alphaFe = options.alphaFe ?? 0;
  const eta = options.eta ?? DEFAULT_REIMERS_ETA;
  const photometry = options.photometry ?? builtinPhotometry();
  const provenance: ModelProvenance = builtinProvenance(alphaFe, photometry, eta);
  // The [Fe/H] domain is the fits' Z range mapped back, rounded inwards to 1e-6 dex so that its ends build.
  const fehLo = Math.ceil(zToFeh(Z_RANGE[0], alphaFe) * 1e6) / 1e6;
  const fehHi = Math.floor(zToFeh(Z_MAX_ACCEPTED, alphaFe) * 1e6) / 1e6;
  const domain = { logAgeYr: LOG_AGE_RANGE, feh: [fehLo, fehHi] as const };
  return {
    provenance,
    bands: photometry.bands,
    domain,
    isochrone(logAgeYr: number, feh: number, request: IsochroneRequest): Isochrone | undefined {
      if (!(logAgeYr >= domain.logAgeYr[0] && logAgeYr <= domain.logAgeYr[1] && feh >= fehLo && feh <= fehHi)) return undefined;
      const opts: IsochroneOptions = {
        photometry,
        bands: request.bands as readonly BandId[],
        alphaFe,
        eta,
        maxStepMag: options.maxStepMag,
        maxStepMagSparse: options.maxStepMagSparse,
      };
      return isochrone(logAgeYr, feh, opts);
    },
  };
}
