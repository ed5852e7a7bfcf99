/**
 * The forward model: draw a synthetic catalogue from exactly the model the likelihood evaluates, so that
 * fits of it can be checked against a known truth (and so that `coeval simulate` can wrap it).
 *
 * Cluster systems: a primary mass from the IMF over the isochrone's masses; with probability f_binary
 * (f counts all systems) a secondary of mass q M with q from the mass-ratio distribution; magnitudes from the
 * likelihood's own model polyline (polyline.ts), flux-summed for binaries, at (dm, E(B-V)). Each band gets
 * intrinsic scatter N(0, sigmaExtra^2) and a photometric error sigma_b(m) = a + b 10^(0.4 (m - mRef))
 * evaluated at the true magnitude; the observed magnitude is drawn with both. A system is kept when its
 * observed magnitudes lie inside the window in the bands it has and it passes the completeness draw;
 * otherwise it is redrawn (rejection sampling, so the kept stars follow the selected density exactly).
 *
 * Catalogue stars are field stars with probability f_field, drawn uniformly over the window in observed
 * magnitudes times the completeness (the likelihood's uniform field), with errors from the same law. With
 * `membership`, each star instead gets a prior probability p from a two-part distribution (U(0.6, 1) or
 * U(0, 0.4), equally likely) and is a member with probability p, as the likelihood assumes.
 *
 * Optional extras: blue stragglers (labelled, not part of the likelihood's model; they should land in the
 * field term) placed on the continuation of the main sequence up to 1.5 mag above the turnoff; parallaxes
 * (cluster: 1000/d + zero point, field: normal), each with a Gaussian error; missing bands at random.
 */
import mt19937 from '@stdlib/random-base-mt19937';
import ziggurat from '@stdlib/random-base-improved-ziggurat';
import type { BandId } from '../core/bands.js';
import { InputError, ModelError } from '../core/errors.js';
import type { Catalog } from '../catalog/types.js';
import { sharedFloat64 } from '../catalog/types.js';
import type { ExtinctionModel, IsochroneSource } from '../stellar/types.js';
import { makeImf, sampleImfMass } from './imf.js';
import { sampleMassRatio } from './massRatio.js';
import { withDefaults, type LikelihoodOptions } from './options.js';
import { ModelPolyline } from './polyline.js';
import { completenessAt } from './selection.js';
import { parallaxMasFromDm, type ClusterParameters } from './theta.js';

export interface SimulationSpec {
  seed: number;
  nStars: number;
  bands: BandId[];
  theta: ClusterParameters;
  /** Photometric error law per band, sigma(m) = a + b 10^(0.4 (m - mRef)). */
  errorLaw: Partial<Record<BandId, { a: number; b: number; mRef: number }>>;
  /** Limits (every band needs both, for the uniform field), completeness, IMF and binaries as the likelihood. */
  likelihood: Partial<LikelihoodOptions>;
  /** Fraction of catalogue stars that are blue stragglers (default 0). */
  blueStragglerFraction?: number;
  /** Give each star a membership prior (see above); f_field is then not used. */
  membership?: boolean;
  /** Parallax error in mas (same for every star); field parallaxes ~ N(mean, sd). */
  parallax?: { errorMas: number; fieldMeanMas: number; fieldSdMas: number };
  /** Probability, per band, that a star's magnitude is missing. */
  missingFraction?: Partial<Record<BandId, number>>;
}

export type ComponentLabel = 0 | 1 | 2 | 3;
export const COMPONENT_NAMES = ['single', 'binary', 'field', 'blue straggler'] as const;

export interface SimulatedCatalog {
  catalog: Catalog;
  truth: {
    theta: ClusterParameters;
    /** 0 single, 1 binary, 2 field, 3 blue straggler. */
    component: Uint8Array;
    massPrimary: Float64Array;
    massRatio: Float64Array;
    /** Fraction of drawn cluster systems that passed the selection. */
    acceptance: number;
  };
}

export function simulateCatalog(spec: SimulationSpec, source: IsochroneSource, extinction: ExtinctionModel): SimulatedCatalog {
  const o = withDefaults(spec.likelihood);
  const nb = spec.bands.length;
  const th = spec.theta;
  // The factory's result has `normalized` (uniform on [0, 1)) at run time; its type declaration omits it.
  const uniform = (mt19937.factory({ seed: spec.seed >>> 0 }) as unknown as { normalized: () => number }).normalized;
  const normal = ziggurat.factory({ prng: uniform });
  const imf = makeImf(o.imf);

  const bright = new Float64Array(nb);
  const faint = new Float64Array(nb);
  spec.bands.forEach((b, k) => {
    const lim = o.limits[b];
    if (lim?.bright === undefined || lim?.faint === undefined) throw new InputError(`simulation needs bright and faint limits in ${b}`, { where: { key: `likelihood.limits.${b}` } });
    bright[k] = lim.bright;
    faint[k] = lim.faint;
  });
  const law = spec.bands.map((b) => {
    const l = spec.errorLaw[b];
    if (!l) throw new InputError(`simulation needs an error law for ${b}`, { where: { key: `simulate.errors.${b}` } });
    return l;
  });
  const sigmaAt = (k: number, m: number) => law[k].a + law[k].b * Math.pow(10, 0.4 * (m - law[k].mRef));
  const cBand = o.completeness ? spec.bands.indexOf(o.completeness.band) : -1;
  const cTable = o.completeness && cBand >= 0 ? { band: cBand, mag: Float64Array.from(o.completeness.mag), fraction: Float64Array.from(o.completeness.fraction) } : undefined;

  const iso = source.isochrone(th.logAgeYr, th.feh, { bands: spec.bands });
  if (!iso) throw new ModelError(`the stellar model has no isochrone at log age ${th.logAgeYr}, [Fe/H] ${th.feh}`);
  const poly = new ModelPolyline(nb);
  const bandIndex = Int32Array.from(spec.bands, (b) => iso.bands.indexOf(b));
  if (poly.build(iso, spec.bands, bandIndex, extinction, th.dm, th.ebv, imf, o.polylineToleranceMag) !== 'ok') throw new ModelError('the isochrone could not be turned into a model sequence');
  const mLo = Math.exp(poly.lnMass[0]);
  const mHi = Math.exp(poly.lnMass[poly.n - 1]);

  const n = spec.nStars;
  const mag = spec.bands.map(() => sharedFloat64(n));
  const err = spec.bands.map(() => sharedFloat64(n));
  const component = new Uint8Array(n);
  const massPrimary = new Float64Array(n).fill(Number.NaN);
  const massRatio = new Float64Array(n).fill(Number.NaN);
  const membership = spec.membership ? sharedFloat64(n) : undefined;
  const plx = spec.parallax ? sharedFloat64(n) : undefined;
  const plxErr = spec.parallax ? sharedFloat64(n) : undefined;
  const trueMag = new Float64Array(nb);
  const present = new Uint8Array(nb);
  let drawn = 0;
  let kept = 0;
  const fBss = spec.blueStragglerFraction ?? 0;
  // Turnoff: the bluest node in the first two bands' colour, among main-sequence masses.
  let kTo = 0;
  for (let k = 1; k < poly.n; k++) if (poly.mag[0][k] - poly.mag[1][k] < poly.mag[0][kTo] - poly.mag[1][kTo]) kTo = k;
  const kRef = poly.locate(poly.lnMass[kTo] - 0.3, 0);

  const observe = (i: number): boolean => {
    for (let k = 0; k < nb; k++) {
      if (!present[k]) {
        mag[k][i] = Number.NaN;
        err[k][i] = Number.NaN;
        continue;
      }
      const s = sigmaAt(k, trueMag[k]);
      const m = trueMag[k] + th.sigmaExtra * normal() + s * normal();
      if (m < bright[k] || m > faint[k]) return false;
      mag[k][i] = m;
      err[k][i] = s;
    }
    if (cTable && present[cBand] && uniform() >= completenessAt(cTable, mag[cBand][i])) return false;
    return true;
  };
  const drawPattern = () => {
    let any = false;
    for (let k = 0; k < nb; k++) {
      const pm = spec.missingFraction?.[spec.bands[k]] ?? 0;
      present[k] = uniform() < pm ? 0 : 1;
      if (present[k]) any = true;
    }
    if (!any) present[0] = 1;
  };

  for (let i = 0; i < n; i++) {
    let isMember: boolean;
    if (membership) {
      const p = uniform() < 0.5 ? 0.6 + 0.4 * uniform() : 0.4 * uniform();
      membership[i] = p;
      isMember = uniform() < p;
    } else isMember = uniform() >= th.fField;
    if (isMember && fBss > 0 && uniform() < fBss) {
      // Blue straggler: on the main sequence's continuation, up to 1.5 mag above the turnoff.
      for (let tries = 0; ; tries++) {
        drawPattern();
        const lnM = poly.lnMass[kTo] + uniform() * Math.log(2);
        for (let k = 0; k < nb; k++) {
          const slope = (poly.mag[k][kTo] - poly.mag[k][kRef]) / (poly.lnMass[kTo] - poly.lnMass[kRef]);
          trueMag[k] = poly.mag[k][kTo] + slope * (lnM - poly.lnMass[kTo]);
        }
        if (observe(i)) break;
        if (tries > 10000) throw new ModelError('blue stragglers fall outside the window');
      }
      component[i] = 3;
      continue;
    }
    if (isMember) {
      for (;;) {
        drawPattern();
        drawn++;
        const M = sampleImfMass(imf, mLo, mHi, uniform());
        const lnM = Math.log(M);
        const kp = poly.locate(lnM, 0);
        const binary = uniform() < th.fBinary;
        const q = binary ? sampleMassRatio({ qMin: o.qMin, gamma: o.qGamma }, uniform()) : Number.NaN;
        const k2 = binary ? poly.locate(lnM + Math.log(q), 0) : 0;
        for (let k = 0; k < nb; k++) {
          const m1 = poly.magAt(k, lnM, kp);
          if (!binary) trueMag[k] = m1;
          else {
            const m2 = poly.magAt(k, lnM + Math.log(q), k2);
            trueMag[k] = -2.5 * Math.log10(Math.pow(10, -0.4 * m1) + Math.pow(10, -0.4 * m2));
          }
        }
        if (observe(i)) {
          component[i] = binary ? 1 : 0;
          massPrimary[i] = M;
          massRatio[i] = q;
          kept++;
          break;
        }
        if (drawn > 1000 * (kept + 10) + 1e6) throw new ModelError('almost no cluster star falls inside the window: check the limits against dm and E(B-V)');
      }
    } else {
      for (let tries = 0; ; tries++) {
        drawPattern();
        let ok = true;
        for (let k = 0; k < nb; k++) {
          if (!present[k]) {
            mag[k][i] = Number.NaN;
            err[k][i] = Number.NaN;
            continue;
          }
          const m = bright[k] + (faint[k] - bright[k]) * uniform();
          mag[k][i] = m;
          err[k][i] = sigmaAt(k, m);
        }
        if (cTable && present[cBand] && uniform() >= completenessAt(cTable, mag[cBand][i])) ok = false;
        if (ok) break;
        if (tries > 100000) throw new ModelError('the completeness table rejects every field star');
      }
      component[i] = 2;
    }
    if (plx && plxErr && spec.parallax) {
      const e = spec.parallax.errorMas;
      const truePlx = component[i] === 2 ? spec.parallax.fieldMeanMas + spec.parallax.fieldSdMas * normal() : parallaxMasFromDm(th.dm) + o.parallax.zeroPointMas;
      plx[i] = truePlx + e * normal();
      plxErr[i] = e;
    }
  }
  const catalog: Catalog = {
    source: { path: `simulated (seed ${spec.seed})`, format: 'csv', rowsRead: n },
    nStars: n,
    bands: [...spec.bands],
    mag,
    err,
    membership,
    parallaxMas: plx,
    parallaxErrorMas: plxErr,
    filters: [],
  };
  return { catalog, truth: { theta: { ...th }, component, massPrimary, massRatio, acceptance: drawn > 0 ? kept / drawn : 1 } };
}
