/** The study file: load, validate and resolve to SI. */
export { loadStudy, STUDY_SCHEMA, type LoadOptions } from './load.js';
export { checkSchema } from './schema-check.js';

export * from './types.js';
