import { configuredBands, type CatalogueConfig, type CutConfig, type PhotometryConfig } from '../config/index.js';
import type { BandId } from '../core/bands.js';
import { InputError } from '../core/errors.js';
import type { ColumnTable } from './columnTable.js';
import { sharedFloat64, type Catalog, type FilterReport } from './types.js';

/**
 * First-order propagation of a flux error into a magnitude error: d(-2.5 log10 f) = (2.5 / ln 10) df / f,
 * i.e. 1.0857 sigma_f / f (common practice). It understates the error of faint stars, where sigma_f / f is
 * not small; such stars carry little weight in the fit.
 */
export const MAG_PER_RELATIVE_FLUX = 2.5 / Math.LN10;

interface BandData {
  band: BandId;
  mag: Float64Array;
  err: Float64Array;
  /** Columns it came from, for messages. */
  valueColumn: string;
  errorColumn: string;
  flux: boolean;
}

/**
 * Map a table's columns into a Catalog as the config says: magnitudes (or fluxes converted to magnitudes),
 * missing-value sentinels, cuts (each reporting what it dropped), optional membership, parallax and ids.
 * Values are checked on the stars that survive the cuts, so a cut can remove rows the user knows are bad.
 */
export function buildCatalog(table: ColumnTable, cat: CatalogueConfig, phot: PhotometryConfig): Catalog {
  const n = table.nRows;
  const file = table.path;
  const num = (name: string): Float64Array => {
    const a = table.numbers.get(name);
    if (!a) throw new Error(`internal: column ${name} was not read as numbers`);
    return a;
  };

  // Catalogue-wide sentinels apply to every numeric column that was read.
  if (cat.missing.length > 0) for (const a of table.numbers.values()) applySentinels(a, cat.missing);

  const bands: BandData[] = configuredBands(phot).map((band) => {
    const b = phot[band];
    if (!b) throw new Error('internal: configured band without columns');
    if ('mag' in b) {
      // The table's own arrays are used unless this band has sentinels of its own (they must not leak into
      // other uses of the same column); nothing below writes to them.
      const own = b.missing.length > 0;
      const mag = own ? Float64Array.from(num(b.mag)) : num(b.mag);
      const err = own ? Float64Array.from(num(b.err)) : num(b.err);
      applySentinels(mag, b.missing);
      applySentinels(err, b.missing);
      requireSomeValues(mag, b.mag, band, 'magnitude', table);
      requireSomeValues(err, b.err, band, 'magnitude error', table);
      return { band, mag, err, valueColumn: b.mag, errorColumn: b.err, flux: false };
    }
    const own = b.missing.length > 0;
    const f = own ? Float64Array.from(num(b.flux)) : num(b.flux);
    const sf = own ? Float64Array.from(num(b.flux_err)) : num(b.flux_err);
    applySentinels(f, b.missing);
    applySentinels(sf, b.missing);
    requireSomeValues(f, b.flux, band, 'flux', table, (v) => v > 0);
    requireSomeValues(sf, b.flux_err, band, 'flux error', table);
    const mag = new Float64Array(n);
    const err = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const fi = f[i];
      // A non-positive flux has no magnitude: the star is missing in this band.
      if (fi > 0 && Number.isFinite(fi)) {
        mag[i] = b.zero_point - 2.5 * Math.log10(fi);
        err[i] = (MAG_PER_RELATIVE_FLUX * sf[i]) / fi;
      } else {
        mag[i] = Number.NaN;
        err[i] = Number.NaN;
      }
    }
    return { band, mag, err, valueColumn: b.flux, errorColumn: b.flux_err, flux: true };
  });

  // Cuts, in config order; each counts the stars it removes from those still kept.
  const keep = new Uint8Array(n).fill(1);
  let kept = n;
  const filters: FilterReport[] = [];
  cat.cuts.forEach((cut) => {
    const dropped = applyCut(cut, table, keep);
    kept -= dropped;
    filters.push({ rule: describeCut(cut), dropped });
  });

  // Values are checked on the stars the cuts kept.
  for (const b of bands) checkBand(b, table, keep);
  const membership = cat.membership !== undefined ? num(cat.membership) : undefined;
  if (membership && cat.membership !== undefined) checkMembership(membership, cat.membership, table, keep);
  const parallax = cat.parallax !== undefined ? num(cat.parallax) : undefined;
  const parallaxError = cat.parallax_error !== undefined ? num(cat.parallax_error) : undefined;
  if (parallaxError && cat.parallax_error !== undefined) checkPositive(parallaxError, cat.parallax_error, 'parallax error', table, keep, 'catalogue.parallax_error');

  // A star with no magnitude in any band tells the fit nothing.
  let noPhot = 0;
  for (let i = 0; i < n; i++) {
    if (!keep[i]) continue;
    let any = false;
    for (const b of bands) if (measured(b, i)) any = true;
    if (!any) {
      keep[i] = 0;
      noPhot++;
    }
  }
  kept -= noPhot;
  filters.push({ rule: 'no magnitude in any band', dropped: noPhot });

  if (kept === 0) {
    const why = filters.filter((f) => f.dropped > 0).map((f) => `${f.rule}: ${f.dropped}`).join('; ');
    throw new InputError(`no star is left after the filters (of ${n} rows read)`, {
      where: { file },
      found: why,
      hint: 'loosen catalogue.cuts, or check catalogue.missing and the column map',
    });
  }
  for (const b of bands) {
    let any = false;
    for (let i = 0; i < n && !any; i++) if (keep[i] && measured(b, i)) any = true;
    if (!any) {
      throw new InputError(`after the filters, no star has a magnitude in band ${b.band}`, {
        where: { file, field: b.valueColumn },
        found: filters.filter((f) => f.dropped > 0).map((f) => `${f.rule}: ${f.dropped} dropped`).join('; '),
        hint: `loosen the cuts, or leave band ${b.band} out of [photometry]`,
      });
    }
  }

  const pick = (src: Float64Array): Float64Array => {
    const out = sharedFloat64(kept);
    let k = 0;
    for (let i = 0; i < n; i++) if (keep[i]) out[k++] = src[i];
    return out;
  };
  // A band's magnitude and error are both present or both NaN.
  const pickMeasured = (b: BandData, src: Float64Array): Float64Array => {
    const out = sharedFloat64(kept);
    let k = 0;
    for (let i = 0; i < n; i++) if (keep[i]) out[k++] = measured(b, i) ? src[i] : Number.NaN;
    return out;
  };
  const catalog: Catalog = {
    source: { path: file, format: table.format, hdu: table.hdu, rowsRead: n },
    nStars: kept,
    bands: bands.map((b) => b.band),
    mag: bands.map((b) => pickMeasured(b, b.mag)),
    err: bands.map((b) => pickMeasured(b, b.err)),
    filters,
  };
  if (cat.id !== undefined) {
    const ids = table.texts.get(cat.id) ?? [];
    catalog.id = ids.filter((_, i) => keep[i] === 1);
  }
  if (membership) catalog.membership = pick(membership);
  if (parallax) catalog.parallaxMas = pick(parallax);
  if (parallaxError) catalog.parallaxErrorMas = pick(parallaxError);
  return catalog;
}

function applySentinels(a: Float64Array, sentinels: readonly number[]): void {
  if (sentinels.length === 0) return;
  for (let i = 0; i < a.length; i++) if (sentinels.includes(a[i])) a[i] = Number.NaN;
}

function requireSomeValues(a: Float64Array, column: string, band: BandId, what: string, table: ColumnTable, ok: (v: number) => boolean = Number.isFinite): void {
  for (let i = 0; i < a.length; i++) if (ok(a[i]) && Number.isFinite(a[i])) return;
  throw new InputError(`band ${band}: the ${what} column "${column}" has no usable value in any of the ${a.length} rows`, {
    where: { file: table.path, hdu: table.hdu, field: column },
    expected: what === 'flux' ? 'positive fluxes for at least some stars' : 'numbers for at least some stars',
    hint: 'check the column map (is this the right column?) and catalogue.missing / photometry.<band>.missing sentinels',
  });
}

/** Missing or infinite in either magnitude or error: the star has no measurement in this band. */
function measured(b: BandData, i: number): boolean {
  return Number.isFinite(b.mag[i]) && Number.isFinite(b.err[i]);
}

function checkBand(b: BandData, table: ColumnTable, keep: Uint8Array): void {
  for (let i = 0; i < b.mag.length; i++) {
    if (!keep[i] || !measured(b, i)) continue;
    const e = b.err[i];
    if (e <= 0) {
      const raw = table.numbers.get(b.errorColumn)?.[i];
      throw new InputError(`band ${b.band}: the ${b.flux ? 'flux error' : 'magnitude error'} is ${raw === 0 ? 'zero' : 'negative'}`, {
        where: table.locate(i, b.errorColumn),
        found: raw,
        expected: 'a positive 1-sigma error',
        hint: `if ${raw} marks a missing value in this catalogue, add it to catalogue.missing (or photometry.${b.band}.missing); otherwise correct the value or remove the star with a cut`,
      });
    }
  }
}

function checkMembership(p: Float64Array, column: string, table: ColumnTable, keep: Uint8Array): void {
  let max = -Infinity;
  for (let i = 0; i < p.length; i++) if (keep[i] && p[i] > max) max = p[i];
  for (let i = 0; i < p.length; i++) {
    if (!keep[i] || !(p[i] < 0 || p[i] > 1)) continue;
    throw new InputError('a membership probability lies outside [0, 1]', {
      where: table.locate(i, column),
      found: p[i],
      expected: 'a probability between 0 and 1',
      hint: max > 1 && max <= 100 ? 'the column looks like a percentage: divide it by 100 in the file' : 'correct the value, mark it missing (catalogue.missing), or remove the star with a cut',
    });
  }
}

function checkPositive(a: Float64Array, column: string, what: string, table: ColumnTable, keep: Uint8Array, key: string): void {
  for (let i = 0; i < a.length; i++) {
    if (!keep[i] || !(a[i] <= 0)) continue;
    throw new InputError(`the ${what} is ${a[i] === 0 ? 'zero' : 'negative'}`, {
      where: table.locate(i, column),
      found: a[i],
      expected: `a positive ${what} (${key})`,
      hint: `if ${a[i]} marks a missing value, add it to catalogue.missing; otherwise correct it or remove the star with a cut`,
    });
  }
}

function applyCut(cut: CutConfig, table: ColumnTable, keep: Uint8Array): number {
  let dropped = 0;
  const values = table.numbers.get(cut.column);
  const texts = table.texts.get(cut.column);
  const target = typeof cut.equals === 'boolean' ? Number(cut.equals) : cut.equals;
  for (let i = 0; i < keep.length; i++) {
    if (!keep[i]) continue;
    let ok = true;
    if (values && (cut.min !== undefined || cut.max !== undefined)) {
      const v = values[i];
      // NaN fails every comparison, so a star without a value is dropped by a min/max cut.
      if (cut.min !== undefined && !(v >= cut.min)) ok = false;
      if (cut.max !== undefined && !(v <= cut.max)) ok = false;
    }
    if (target !== undefined) {
      if (typeof target === 'string') ok = ok && texts !== undefined && texts[i] === target;
      else ok = ok && values !== undefined && values[i] === target;
    }
    if (!ok) {
      keep[i] = 0;
      dropped++;
    }
  }
  return dropped;
}

export function describeCut(cut: CutConfig): string {
  const parts: string[] = [];
  if (cut.min !== undefined && cut.max !== undefined) parts.push(`${cut.min} <= ${cut.column} <= ${cut.max}`);
  else if (cut.min !== undefined) parts.push(`${cut.column} >= ${cut.min}`);
  else if (cut.max !== undefined) parts.push(`${cut.column} <= ${cut.max}`);
  if (cut.equals !== undefined) parts.push(`${cut.column} == ${JSON.stringify(cut.equals)}`);
  return parts.join(' and ');
}
