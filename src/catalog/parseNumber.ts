// Text-to-number rules live in core, shared by the catalogue readers and the isochrone-grid reader.
export { numberHint, parseNumber } from '../core/parseNumber.js';
