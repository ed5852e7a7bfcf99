/**
 * A grid from any `IsochroneSource` (the built-in model, in practice) at chosen ages and metallicities, in
 * the same form as an imported grid: so that grids from the built-in model can be cached, inspected, written
 * in the stacked-text layout, and used to test the interpolation against direct computation.
 */
import type { BandId } from '../../core/bands.js';
import { ModelError } from '../../core/errors.js';
import type { Isochrone, IsochroneSource } from '../types.js';
import type { GridTable } from './gridTable.js';

export function buildGrid(source: IsochroneSource, logAges: readonly number[], fehs: readonly number[], bands: readonly BandId[], createdBy = 'coeval'): GridTable {
  const isos: Isochrone[] = [];
  for (const feh of fehs) {
    for (const a of logAges) {
      const iso = source.isochrone(a, feh, { bands });
      if (!iso) {
        throw new ModelError(`the model "${source.provenance.model}" has no isochrone at log age ${a}, [Fe/H] ${feh}`, {
          expected: `log age in ${source.domain.logAgeYr.join(' .. ')} and [Fe/H] in ${source.domain.feh.join(' .. ')}`,
          hint: 'choose ages and metallicities inside the model\'s domain',
        });
      }
      isos.push(iso);
    }
  }
  return gridFromIsochrones(isos, source, bands, createdBy);
}

export function gridFromIsochrones(isos: Isochrone[], source: Pick<IsochroneSource, 'provenance'>, bands: readonly BandId[], createdBy = 'coeval'): GridTable {
  const nRows = isos.reduce((s, i) => s + i.massInitial.length, 0);
  const g: GridTable = {
    meta: {
      name: `${source.provenance.model} grid`,
      citation: source.provenance.evolution,
      ageUnit: 'log_yr',
      metallicityScale: 'fe_h',
      solarZ: source.provenance.solarZ,
      alphaFe: source.provenance.alphaFe,
      phaseKind: 'eep',
      eepEncodesPhase: isos.every((i) => i.phaseCoord.every((u, k) => Math.floor(u) === i.phase[k])),
      columnMap: {},
      sources: [],
      notes: [`built by coeval from ${source.provenance.model}`, ...source.provenance.caveats],
      createdBy,
    },
    bands: [...bands],
    nRows,
    massInitial: new Float64Array(nRows),
    massCurrent: new Float64Array(nRows),
    hasMassCurrent: true,
    phaseValue: new Float64Array(nRows),
    logTeff: new Float64Array(nRows),
    logg: new Float64Array(nRows),
    logL: new Float64Array(nRows),
    mag: bands.map(() => new Float64Array(nRows)),
    rowSource: new Int32Array(nRows).fill(-1),
    rowLine: new Int32Array(nRows),
    isochrones: [],
  };
  let r = 0;
  for (const iso of isos) {
    const n = iso.massInitial.length;
    g.isochrones.push({ logAgeYr: iso.logAgeYr, feh: iso.feh, metallicityRaw: iso.feh, start: r, count: n, source: -1 });
    g.massInitial.set(iso.massInitial, r);
    g.massCurrent.set(iso.massCurrent, r);
    g.phaseValue!.set(iso.phaseCoord, r);
    g.logTeff.set(iso.logTeff, r);
    g.logg.set(iso.logg, r);
    g.logL.set(iso.logL, r);
    bands.forEach((b, k) => {
      const j = iso.bands.indexOf(b);
      g.mag[k].set(iso.absMag[j], r);
    });
    for (let i = 0; i < n; i++) g.rowLine[r + i] = i + 1;
    r += n;
  }
  return g;
}
