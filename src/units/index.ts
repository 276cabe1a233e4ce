/** Units at the edges: parse and convert to SI. */
export * from './quantity.js';
export { checkDisplayUnits, unitDims, displayUnitFor, displayConversion, shownValue, shownDifference, shownQuantity, type DisplayUnits, type DisplayConversion, type ShownQuantity } from './display.js';
