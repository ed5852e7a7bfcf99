import { readGridArrow } from './gridArrow.js';
import { GridSource, type GridSourceOptions } from './gridSource.js';
import { assertGridValid, validateGrid } from './validateGrid.js';

/**
 * Open a grid cache as an `IsochroneSource`. Takes plain arguments, so that worker threads can build their
 * own copy from a module reference ({ modulePath: <this module's index>, exportName: 'loadGridSource',
 * args: [path] }). The grid is checked again (cheap) so that a damaged or hand-edited cache cannot pass.
 */
export function loadGridSource(path: string, options: GridSourceOptions = {}): GridSource {
  const grid = readGridArrow(path);
  assertGridValid(validateGrid(grid), `the grid ${path} has a problem`);
  return new GridSource(grid, options);
}
