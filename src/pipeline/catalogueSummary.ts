import type { Catalog } from '../catalog/index.js';
import type { CoevalConfig } from '../config/index.js';
import type { BandId } from '../core/bands.js';
import { quantileSorted } from '../core/quantile.js';

export interface BandSummary {
  band: BandId;
  /** The columns it came from, in words: `Vmag ± e_Vmag`, or `F ± F_err (flux, zp 25.69)`. */
  from: string;
  measured: number;
  missing: number;
  magMin: number;
  magMax: number;
  /** Percentiles 5, 50 and 95 of the 1-sigma errors (Hyndman & Fan type 7), in mag. */
  errP05: number;
  errP50: number;
  errP95: number;
}

export interface CatalogueSummary {
  path: string;
  format: string;
  detail?: string;
  hdu?: number;
  rowsRead: number;
  nStars: number;
  bands: BandSummary[];
  filters: { rule: string; dropped: number }[];
  membership: { column?: string; present: boolean; withValue: number; min?: number; max?: number };
  parallax: { column?: string; errorColumn?: string; present: boolean; withValue: number; medianMas?: number };
  ids: { column?: string; present: boolean; duplicates: number };
  warnings: string[];
}

/** The numbers `coeval check` reports about a catalogue, and warnings about values that look wrong. */
export function summarizeCatalogue(catalog: Catalog, config: CoevalConfig): CatalogueSummary {
  const warnings: string[] = [];
  const bands = catalog.bands.map((band, b) => {
    const spec = config.photometry[band];
    const from = !spec ? band : 'mag' in spec ? `${spec.mag} ± ${spec.err}` : `${spec.flux} ± ${spec.flux_err} (flux, zp ${spec.zero_point})`;
    const mag = catalog.mag[b];
    const errs: number[] = [];
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < catalog.nStars; i++) {
      const m = mag[i];
      if (m !== m) continue;
      if (m < lo) lo = m;
      if (m > hi) hi = m;
      errs.push(catalog.err[b][i]);
    }
    const sorted = Float64Array.from(errs).sort();
    const s: BandSummary = {
      band,
      from,
      measured: errs.length,
      missing: catalog.nStars - errs.length,
      magMin: lo,
      magMax: hi,
      errP05: quantileSorted(sorted, 0.05),
      errP50: quantileSorted(sorted, 0.5),
      errP95: quantileSorted(sorted, 0.95),
    };
    // Outside roughly -2..35 mag no star catalogue lives: a flux or a wrong column is more likely.
    if (hi > 35 || lo < -2) warnings.push(`band ${band}: magnitudes span ${fmt(lo)} to ${fmt(hi)}; if this column holds fluxes, map it as flux, flux_err and zero_point`);
    if (s.errP50 > 1) warnings.push(`band ${band}: the median error is ${fmt(s.errP50)} mag; check that the error column (not a magnitude or flux) is mapped`);
    if (s.missing > 0.5 * catalog.nStars) warnings.push(`band ${band}: ${s.missing} of ${catalog.nStars} stars have no measurement`);
    return s;
  });

  const memb = catalog.membership;
  const membership: CatalogueSummary['membership'] = { column: config.catalogue.membership, present: memb !== undefined, withValue: 0 };
  if (memb) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const p of memb) {
      if (p !== p) continue;
      membership.withValue++;
      lo = Math.min(lo, p);
      hi = Math.max(hi, p);
    }
    if (membership.withValue > 0) Object.assign(membership, { min: lo, max: hi });
  }
  const plx = catalog.parallaxMas;
  const parallax: CatalogueSummary['parallax'] = { column: config.catalogue.parallax, errorColumn: config.catalogue.parallax_error, present: plx !== undefined, withValue: 0 };
  if (plx) {
    const vals = Float64Array.from(plx.filter((x) => x === x)).sort();
    parallax.withValue = vals.length;
    if (vals.length > 0) parallax.medianMas = quantileSorted(vals, 0.5);
    if (!catalog.parallaxErrorMas) warnings.push('a parallax column is mapped without catalogue.parallax_error; the fit needs both');
  }
  let duplicates = 0;
  if (catalog.id) {
    const seen = new Set<string>();
    for (const id of catalog.id) {
      if (seen.has(id)) duplicates++;
      else seen.add(id);
    }
    if (duplicates > 0) warnings.push(`${duplicates} star identifiers occur more than once`);
  }
  return {
    path: catalog.source.path,
    format: catalog.source.format,
    detail: catalog.source.detail,
    hdu: catalog.source.hdu,
    rowsRead: catalog.source.rowsRead,
    nStars: catalog.nStars,
    bands,
    filters: catalog.filters.map((f) => ({ ...f })),
    membership,
    parallax,
    ids: { column: config.catalogue.id, present: catalog.id !== undefined, duplicates },
    warnings,
  };
}

function fmt(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(4))) : String(x);
}
