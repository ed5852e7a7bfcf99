import { InputError, type Location } from '../core/errors.js';
import { nearestNames } from '../core/suggest.js';
import type { ColumnRequest } from './columnTable.js';

/**
 * Find each requested column among a file's column names, before any data is read, so that a typo in the
 * column map fails at once even on a large file. Names match exactly; when they do not, the message lists
 * the nearest names (case-insensitive edit distance) and, failing that, a case-insensitive match.
 * A requested name that occurs twice is ambiguous and refused; unrequested duplicates are left alone,
 * since archive cross-matches often repeat names the fit does not use.
 *
 * Returns the index of each requested name.
 */
export function requireColumns(
  names: readonly string[],
  requests: readonly ColumnRequest[],
  where: Location,
  describeColumn: (index: number) => string = (i) => `column ${i + 1}`,
  extraHint?: string,
): Map<string, number> {
  const found = new Map<string, number>();
  for (const req of requests) {
    if (found.has(req.name)) continue;
    const hits: number[] = [];
    names.forEach((n, i) => {
      if (n === req.name) hits.push(i);
    });
    if (hits.length === 0) {
      const near = nearestNames(req.name, names);
      const caseMatch = names.find((n) => n.toLowerCase() === req.name.toLowerCase());
      const suggestion = caseMatch ? [caseMatch] : near;
      const hintParts: string[] = [];
      if (suggestion.length > 0) hintParts.push(`did you mean ${suggestion.map((s) => `"${s}"`).join(' or ')}? Set ${req.key} to the exact name`);
      else hintParts.push(`set ${req.key} to one of the file's column names`);
      if (extraHint) hintParts.push(extraHint);
      throw new InputError(`the column "${req.name}" (${req.role}, from ${req.key}) is not in the file`, {
        where: { ...where, key: req.key },
        expected: `one of the file's ${names.length} columns: ${listNames(names)}`,
        hint: hintParts.join('; '),
      });
    }
    if (hits.length > 1) {
      throw new InputError(`the column name "${req.name}" (${req.role}) occurs ${hits.length} times, so it is ambiguous`, {
        where: { ...where, field: req.name },
        found: hits.map((i) => describeColumn(i)).join(' and '),
        expected: 'each mapped column name to occur once',
        hint: 'rename the duplicates in the file (e.g. add a suffix), then map the one you mean',
      });
    }
    found.set(req.name, hits[0]);
  }
  return found;
}

function listNames(names: readonly string[]): string {
  const shown = names.slice(0, 40).map((n) => JSON.stringify(n));
  return names.length > 40 ? `${shown.join(', ')}, ... (${names.length - 40} more)` : shown.join(', ');
}
