/** Units at the edges: parse and convert to SI. */
export * from './quantity.js';
export { checkDisplayUnits, unitDims, displayUnitFor, displayConversion, shownValue, shownDifference, type DisplayUnits, type DisplayConversion } from './display.js';
