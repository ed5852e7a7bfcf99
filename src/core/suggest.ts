import { distance } from 'fastest-levenshtein';

/**
 * Names from `candidates` closest to `wanted`, for "did you mean" hints. Case is ignored, and a candidate
 * that contains the wanted name (or the reverse) counts as close, since catalogue columns often carry
 * prefixes such as `phot_` or suffixes such as `_mag`.
 */
export function nearestNames(wanted: string, candidates: readonly string[], max = 3): string[] {
  const w = wanted.toLowerCase();
  const scored = candidates.map((c) => {
    const lc = c.toLowerCase();
    let d = distance(w, lc);
    if (lc.includes(w) || w.includes(lc)) d = Math.min(d, Math.abs(lc.length - w.length) / 2);
    // Names that differ only in separators (`e_Imag` and `eImag`) rank above other one-letter differences.
    d = Math.min(d, distance(strip(w), strip(lc)) + 0.5);
    return { c, d };
  });
  const limit = Math.max(2, Math.ceil(w.length / 2));
  return scored
    .filter((s) => s.d <= limit)
    .sort((a, b) => a.d - b.d || a.c.localeCompare(b.c))
    .slice(0, max)
    .map((s) => s.c);
}

function strip(s: string): string {
  return s.replace(/[^a-z0-9]/g, '');
}

/** A hint sentence, or undefined when nothing is close. */
export function didYouMean(wanted: string, candidates: readonly string[]): string | undefined {
  const near = nearestNames(wanted, candidates);
  if (near.length === 0) return undefined;
  return `did you mean ${near.map((n) => `"${n}"`).join(' or ')}?`;
}
