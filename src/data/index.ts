/** Lab data import: CSV reading, column mapping and validation. */
export * from './csv';
export * from './spec';
export * from './report';
export * from './mapping';
export * from './validation';
export * from './decode';
