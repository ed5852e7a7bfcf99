/**
 * Test scaffolding, not a calibration: a PhotometryModel that returns the absolute bolometric magnitude,
 * M_bol = 4.74 - 2.5 log10(L/Lsun) (IAU 2015 Resolution B2), in every band. It lets the isochrone builder's
 * node placement and smoothness be tested before the real colour-Teff relations land.
 */
import { BAND_IDS, type BandId } from '../../src/core/bands.js';
import type { PhotometryModel } from '../../src/stellar/types.js';

export const bolometricPhotometry: PhotometryModel = {
  bands: BAND_IDS,
  provenance: Object.fromEntries(BAND_IDS.map((b) => [b, 'test scaffolding: M_bol in every band'])) as Record<BandId, string>,
  absoluteMagnitudes(bands, logL, _logTeff, _logg, _feh, out, n) {
    for (let b = 0; b < bands.length; b++) {
      const o = out[b];
      for (let k = 0; k < n; k++) o[k] = 4.74 - 2.5 * logL[k];
    }
  },
};
