/** Units at the edges: parse and convert to SI. */
export * from './quantity.js';
export { parseCompoundUnit, formatSiUnit, sameDims, UnitSyntaxError, type ParsedUnit } from './parse.js';
export { ATOMS, type Dims, type UnitAtom } from './table.js';
