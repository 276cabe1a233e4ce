/** Units at the edges: parse and convert to SI. */
export * from './quantity.js';

