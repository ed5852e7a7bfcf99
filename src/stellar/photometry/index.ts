export { builtinPhotometry, M_BOL_SUN, tabulatedBc } from './builtinPhotometry.js';
export { bolometricCorrection, isPhotometryBand, PHOTOMETRY_BANDS, type PhotometryBand } from './bolometricCorrections.js';
export { PHOTOMETRY_CAVEATS, PHOTOMETRY_PROVENANCE } from './provenance.js';
export { BC_GRID, bcTable, gridPosition, interpolate, newGridPosition, type GridPosition } from './bcTable.js';
