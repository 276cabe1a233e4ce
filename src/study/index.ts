/** The study file: load, validate and resolve to SI. */
export { loadStudy, STUDY_SCHEMA, type LoadOptions } from './load.js';
export { checkSchema, type JsonSchema } from './schema-check.js';
export { buildParameters, runParameterNames, referencedNames, type ParameterSpec } from './parameters.js';
export * from './types.js';
