/** Units at the edges: parse and convert to SI. */
export * from './quantity';
export { parseCompoundUnit, formatSiUnit, sameDims, UnitSyntaxError, type ParsedUnit } from './parse';
export { ATOMS, type Dims, type UnitAtom } from './table';
