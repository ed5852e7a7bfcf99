/**
 * Checks of an imported grid as a whole, each problem located at the file and line it comes from:
 * rows with NaN, isochrones too short to use, initial masses or EEPs that run backwards, duplicate
 * (age, metallicity) pairs, ages out of order within a file, and a last isochrone cut short.
 */
import { InputError, type Location } from '../../core/errors.js';
import { locateIsochrone, locateRow, type GridTable } from './gridTable.js';

export interface GridProblem {
  severity: 'error' | 'warning';
  message: string;
  where: Location;
  found?: unknown;
  expected?: string;
  hint?: string;
}

/** Tolerance for two log ages (or two [Fe/H]) to count as the same grid value. */
export const SAME_VALUE = 1e-6;

export function validateGrid(grid: GridTable): GridProblem[] {
  const problems: GridProblem[] = [];
  nanRows(grid, problems);
  perIsochrone(grid, problems);
  duplicatesAndOrder(grid, problems);
  truncatedLast(grid, problems);
  return problems;
}

/** Throw the first error (with a count of the others), or return the warnings. */
export function assertGridValid(problems: GridProblem[], what: string): GridProblem[] {
  const errors = problems.filter((p) => p.severity === 'error');
  if (errors.length === 0) return problems.filter((p) => p.severity === 'warning');
  const e = errors[0];
  const more = errors.slice(1, 6).map((p) => `\n  also: ${fmt(p.where)}: ${p.message}`).join('');
  const rest = errors.length > 6 ? `\n  and ${errors.length - 6} more` : '';
  throw new InputError(`${what}: ${e.message}${more}${rest}`, { where: e.where, found: e.found, expected: e.expected, hint: e.hint });
}

function fmt(w: Location): string {
  return [w.file, w.line ?? (w.row !== undefined ? `row ${w.row}` : undefined)].filter((x) => x !== undefined).join(':');
}

function nanRows(g: GridTable, out: GridProblem[]): void {
  const cols: [string, Float64Array][] = [
    ['mass_initial', g.massInitial],
    ['log_teff', g.logTeff],
    ['log_g', g.logg],
    ['log_l', g.logL],
    ...g.bands.map((b, k) => [`band ${b}`, g.mag[k]] as [string, Float64Array]),
  ];
  if (g.hasMassCurrent) cols.push(['mass_current', g.massCurrent]);
  if (g.phaseValue) cols.push(['phase', g.phaseValue]);
  let reported = 0;
  for (let r = 0; r < g.nRows && reported < 20; r++) {
    for (const [role, a] of cols) {
      if (!Number.isFinite(a[r])) {
        const col = g.meta.columnMap[role] ?? role;
        out.push({
          severity: 'error',
          message: `a row with a missing or non-finite value in the column "${col}" (${role})`,
          where: locateRow(g, r, col),
          found: a[r],
          expected: 'a finite number in every mapped column',
          hint: 'remove or fix the row, map another column, or set drop_nan_rows = true to drop such rows (they are counted in the grid provenance)',
        });
        reported++;
        break;
      }
    }
  }
  g.isochrones.forEach((iso, k) => {
    if (!Number.isFinite(iso.logAgeYr) || !Number.isFinite(iso.feh)) {
      out.push({ severity: 'error', message: 'an isochrone without a finite age or metallicity', where: locateIsochrone(g, k), found: { logAgeYr: iso.logAgeYr, feh: iso.feh, metallicity: iso.metallicityRaw }, expected: 'positive ages, and positive Z when the metallicity is Z' });
    }
  });
}

function perIsochrone(g: GridTable, out: GridProblem[]): void {
  g.isochrones.forEach((iso, k) => {
    if (iso.count < 3) {
      out.push({
        severity: 'error',
        message: `an isochrone with only ${iso.count} row${iso.count === 1 ? '' : 's'}`,
        where: locateIsochrone(g, k),
        expected: 'at least 3 rows per isochrone',
        hint: 'rows are split into isochrones by comment blocks and by changes of age or metallicity: check the age and metallicity columns, and comment lines inside an isochrone',
      });
      return;
    }
    const end = iso.start + iso.count;
    for (let r = iso.start + 1; r < end; r++) {
      if (g.massInitial[r] < g.massInitial[r - 1]) {
        out.push({
          severity: 'error',
          message: 'the initial mass decreases along the isochrone',
          where: locateRow(g, r, g.meta.columnMap.mass_initial),
          found: `${g.massInitial[r - 1]} then ${g.massInitial[r]}`,
          expected: 'rows of each isochrone in order of initial mass (as evolution proceeds along it)',
          hint: 'check that columns.mass_initial names the initial (not the current) mass, and that isochrones are separated by comment lines or by their age column',
        });
        break;
      }
    }
    if (g.phaseValue && g.meta.phaseKind === 'eep') {
      for (let r = iso.start + 1; r < end; r++) {
        if (!(g.phaseValue[r] > g.phaseValue[r - 1])) {
          out.push({
            severity: 'error',
            message: 'the EEP column does not rise along the isochrone',
            where: locateRow(g, r, g.meta.columnMap.phase),
            found: `${g.phaseValue[r - 1]} then ${g.phaseValue[r]}`,
            expected: 'an equivalent-evolutionary-point number that rises strictly along each isochrone',
            hint: 'if the column is a stage label (several rows share a value), set phase_kind = "stage"',
          });
          break;
        }
      }
    }
    if (g.phaseValue && g.meta.phaseKind === 'stage') {
      for (let r = iso.start + 1; r < end; r++) {
        if (g.phaseValue[r] < g.phaseValue[r - 1]) {
          const labels = g.meta.stageLabels ?? [];
          out.push({
            severity: 'error',
            message: 'the stage label goes back to an earlier stage along the isochrone',
            where: locateRow(g, r, g.meta.columnMap.phase),
            found: `${labels[g.phaseValue[r - 1]]} then ${labels[g.phaseValue[r]]}`,
            expected: `stages in the order ${labels.join(', ')} (numeric labels by value, text labels in the order they first appear)`,
          });
          break;
        }
      }
    }
  });
}

function duplicatesAndOrder(g: GridTable, out: GridProblem[]): void {
  const seen = new Map<string, number>();
  const keyOf = (a: number, f: number): string => `${Math.round(a / SAME_VALUE)}:${Math.round(f / SAME_VALUE)}`;
  g.isochrones.forEach((iso, k) => {
    if (!Number.isFinite(iso.logAgeYr) || !Number.isFinite(iso.feh)) return;
    const key = keyOf(iso.logAgeYr, iso.feh);
    const prev = seen.get(key);
    if (prev !== undefined) {
      const w = locateIsochrone(g, prev);
      out.push({
        severity: 'error',
        message: `a duplicate isochrone: log age ${iso.logAgeYr.toFixed(4)} and [Fe/H] ${iso.feh.toFixed(4)} already start at ${fmt(w)}`,
        where: locateIsochrone(g, k),
        expected: 'one isochrone per (age, metallicity)',
        hint: 'remove the repeated block or file; if an isochrone is split by a comment line in its middle, remove that line',
      });
    } else seen.set(key, k);
  });
  // Within one file and one metallicity, ages in file order must run one way.
  const runs = new Map<string, number[]>();
  g.isochrones.forEach((iso, k) => {
    const key = `${iso.source}:${Math.round(iso.feh / SAME_VALUE)}`;
    runs.set(key, [...(runs.get(key) ?? []), k]);
  });
  for (const ks of runs.values()) {
    if (ks.length < 3) continue;
    const dir = Math.sign(g.isochrones[ks[1]].logAgeYr - g.isochrones[ks[0]].logAgeYr);
    for (let j = 2; j < ks.length; j++) {
      const d = Math.sign(g.isochrones[ks[j]].logAgeYr - g.isochrones[ks[j - 1]].logAgeYr);
      if (d !== 0 && dir !== 0 && d !== dir) {
        out.push({
          severity: 'error',
          message: `the ages are out of order: log age ${g.isochrones[ks[j]].logAgeYr.toFixed(4)} follows ${g.isochrones[ks[j - 1]].logAgeYr.toFixed(4)} in a file whose ages ${dir > 0 ? 'rise' : 'fall'}`,
          where: locateIsochrone(g, ks[j]),
          expected: 'the isochrones of one metallicity in one file in order of age',
          hint: 'check that columns.age names the age column and age_unit its unit; a file may have been concatenated twice',
        });
        break;
      }
    }
  }
}

/**
 * The last isochrone of a file ends early when the download was cut short between lines (a cut inside a
 * line is caught by the reader). It is compared with the other isochrones of the same metallicity
 * (nearest in age first): truncated when it has fewer than half their median number of rows and ends
 * below their faintest end (max log L lower by more than 0.5 dex, or, with a phase column, an earlier phase).
 */
function truncatedLast(g: GridTable, out: GridProblem[]): void {
  const lastOfFile = new Map<number, number>();
  // Isochrones computed by coeval (no source file) cannot have been cut short by a download.
  g.isochrones.forEach((iso, k) => {
    if (iso.source >= 0) lastOfFile.set(iso.source, k);
  });
  for (const k of lastOfFile.values()) {
    const iso = g.isochrones[k];
    const others = g.isochrones
      .map((o, j) => ({ o, j }))
      .filter(({ o, j }) => j !== k && Math.abs(o.feh - iso.feh) < SAME_VALUE && Number.isFinite(o.logAgeYr))
      .sort((a, b) => Math.abs(a.o.logAgeYr - iso.logAgeYr) - Math.abs(b.o.logAgeYr - iso.logAgeYr))
      .slice(0, 4);
    if (others.length < 2) continue;
    const counts = others.map(({ o }) => o.count).sort((a, b) => a - b);
    const median = counts[counts.length >> 1];
    const maxL = (s: number, n: number): number => {
      let m = -Infinity;
      for (let r = s; r < s + n; r++) if (g.logL[r] > m) m = g.logL[r];
      return m;
    };
    const endPhase = (s: number, n: number): number => (g.phaseValue ? g.phaseValue[s + n - 1] : Number.NaN);
    const myL = maxL(iso.start, iso.count);
    const theirL = Math.min(...others.map(({ o }) => maxL(o.start, o.count)));
    const shortRows = iso.count < 0.5 * median;
    const earlyEnd = g.phaseValue
      ? endPhase(iso.start, iso.count) < Math.min(...others.map(({ o }) => endPhase(o.start, o.count)))
      : myL < theirL - 0.5;
    if (shortRows && earlyEnd) {
      const lastRow = iso.start + iso.count - 1;
      out.push({
        severity: 'error',
        message: `the last isochrone of the file looks cut short: ${iso.count} rows (its neighbours in age have a median of ${median}) ending at log L = ${g.logL[lastRow].toFixed(3)}${g.phaseValue ? `, an earlier phase than theirs` : ` (theirs reach at least ${theirL.toFixed(3)})`}`,
        where: locateRow(g, lastRow),
        found: `isochrone at log age ${iso.logAgeYr.toFixed(4)}, [Fe/H] ${iso.feh.toFixed(4)}, starting at ${fmt(locateIsochrone(g, k))}`,
        expected: 'every isochrone complete, as published',
        hint: 'the download was probably interrupted: fetch the table again, or delete this last isochrone from the file',
      });
    }
  }
}
