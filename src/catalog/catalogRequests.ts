import { configuredBands, type CatalogueConfig, type PhotometryConfig } from '../config/index.js';
import type { ColumnRequest } from './columnTable.js';

/** The columns a config maps, each with the role and config key that named it (for messages). */
export function catalogRequests(cat: CatalogueConfig, phot: PhotometryConfig): ColumnRequest[] {
  const out: ColumnRequest[] = [];
  for (const band of configuredBands(phot)) {
    const b = phot[band];
    if (!b) continue;
    if ('mag' in b) {
      out.push({ name: b.mag, kind: 'number', role: `band ${band} magnitude`, key: `photometry.${band}.mag` });
      out.push({ name: b.err, kind: 'number', role: `band ${band} magnitude error`, key: `photometry.${band}.err` });
    } else {
      out.push({ name: b.flux, kind: 'number', role: `band ${band} flux`, key: `photometry.${band}.flux` });
      out.push({ name: b.flux_err, kind: 'number', role: `band ${band} flux error`, key: `photometry.${band}.flux_err` });
    }
  }
  if (cat.id !== undefined) out.push({ name: cat.id, kind: 'text', role: 'star identifier', key: 'catalogue.id' });
  if (cat.membership !== undefined) out.push({ name: cat.membership, kind: 'number', role: 'membership probability', key: 'catalogue.membership' });
  if (cat.parallax !== undefined) out.push({ name: cat.parallax, kind: 'number', role: 'parallax', key: 'catalogue.parallax' });
  if (cat.parallax_error !== undefined) out.push({ name: cat.parallax_error, kind: 'number', role: 'parallax error', key: 'catalogue.parallax_error' });
  cat.cuts.forEach((c, i) => {
    const key = `catalogue.cuts.${i}.column`;
    if (typeof c.equals === 'string') out.push({ name: c.column, kind: 'text', role: 'a cut', key });
    if (c.min !== undefined || c.max !== undefined || (c.equals !== undefined && typeof c.equals !== 'string')) {
      out.push({ name: c.column, kind: 'number', role: 'a cut', key });
    }
  });
  return out;
}
