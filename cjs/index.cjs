// rateloom is an ES module package. `require('rateloom')` lands here (the "require" condition of
// package.json "exports") and explains what to do, instead of failing inside a dependency.
'use strict';
const err = new Error(
  "rateloom is ESM-only and cannot be loaded with require(). From CommonJS use a dynamic import: " +
    "`const rateloom = await import('rateloom');` (or `import('rateloom').then(...)`), or write your script as an ES module (.mjs, or \"type\": \"module\").",
);
err.code = 'ERR_RATELOOM_ESM_ONLY';
throw err;
