/** The study file: load, validate and resolve to SI. */
export { loadStudy, STUDY_SCHEMA, type LoadOptions } from './load';
export { checkSchema, type JsonSchema } from './schema-check';
export { buildParameters, runParameterNames, referencedNames, type ParameterSpec } from './parameters';
export * from './types';
