import { z } from 'zod';
import { BAND_IDS, type BandId } from '../../core/bands.js';

/** A band measured as a magnitude with its error. */
const magnitudeColumns = z.strictObject({
  mag: z.string().min(1),
  err: z.string().min(1),
  /** Extra sentinels for this band only (added to catalogue.missing). */
  missing: z.array(z.number()).default([]),
});

/**
 * A band given as a flux with its error, as archives often deliver it. The magnitude is
 * zero_point - 2.5 log10(flux) and its error (2.5 / ln 10) * flux_err / flux (first-order propagation).
 */
const fluxColumns = z.strictObject({
  flux: z.string().min(1),
  flux_err: z.string().min(1),
  zero_point: z.number(),
  missing: z.array(z.number()).default([]),
});

export const bandColumnsSchema = z.union([magnitudeColumns, fluxColumns]);
export type BandColumns = z.infer<typeof bandColumnsSchema>;

/**
 * `[photometry.<band>]`: one table per band used in the fit; at least two bands. A partial record (not an
 * object with a key per band) so that the parsed value keeps the bands in the order the file lists them.
 */
export const photometrySection = z
  .partialRecord(z.enum(BAND_IDS), bandColumnsSchema)
  .refine((p) => Object.values(p).filter((v) => v !== undefined).length >= 2, {
    message: 'at least two bands are needed to form a colour-magnitude diagram',
  });
export type PhotometryConfig = z.infer<typeof photometrySection>;

/** Bands in the order the config names them (object key order is insertion order in JS). */
export function configuredBands(p: PhotometryConfig): BandId[] {
  return (Object.keys(p) as BandId[]).filter((b) => p[b] !== undefined);
}
