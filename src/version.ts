/** The rateloom version written into hand-off files and reports (kept equal to package.json). */
export const VERSION = '0.1.0';
