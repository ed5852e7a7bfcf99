import type { ModelProvenance } from '../types.js';
import type { GridTable } from './gridTable.js';

/** What a summary must say about a user grid: its citation, its conversions, and how coeval interpolates it. */
export function gridProvenance(g: GridTable): ModelProvenance {
  const m = g.meta;
  const files = m.sources.map((s) => s.path.split(/[\\/]/).pop()).join(', ');
  const bands: ModelProvenance['bands'] = {};
  g.bands.forEach((b) => (bands[b] = `column "${m.columnMap[`band ${b}`] ?? `mag_${b}`}" of the grid tables (${m.citation || 'no citation given'})`));
  const phaseWords =
    m.phaseKind === 'eep'
      ? `the grid's EEP column ("${m.columnMap.phase}")`
      : m.phaseKind === 'stage'
        ? `the grid's stage labels ("${m.columnMap.phase}") plus the arc-length fraction within each stage`
        : 'a phase coordinate derived from each isochrone\'s shape (turning points and the giant-branch knee, then normalised arc length in the log Teff-log L plane)';
  const caveats = [
    `Isochrones between the grid's nodes are interpolated by coeval, linearly in log age and [Fe/H], at equal evolutionary phase given by ${phaseWords}. At the nodes they are the grid's own.`,
    ...m.notes,
  ];
  if (!g.hasMassCurrent) caveats.push('The grid has no current-mass column: current masses are not available (NaN).');
  if (!m.citation) caveats.push('No citation was given for this grid: add one (grid.citation) before publishing.');
  return {
    model: m.name,
    evolution: `${m.citation || 'uncited isochrone grid'} (tables: ${files})`,
    solarZ: m.solarZ ?? Number.NaN,
    alphaFe: m.alphaFe,
    bands,
    caveats,
  };
}
