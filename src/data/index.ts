/** Lab data import: CSV reading, column mapping and validation. */
export * from './csv.js';
export * from './spec.js';
export * from './report.js';
export * from './mapping.js';
export * from './validation.js';
export * from './decode.js';
