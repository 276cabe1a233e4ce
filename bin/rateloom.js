#!/usr/bin/env node
// Entry point for the `rateloom` command: runs the compiled CLI in dist/ (built by `npm run build`,
// which `npm ci` runs through the `prepare` script).
try {
  await import('../dist/cli/main.js');
} catch (e) {
  if (e?.code === 'ERR_MODULE_NOT_FOUND' && String(e.message).includes('dist/cli/main.js')) {
    console.error('rateloom: the compiled CLI (dist/cli/main.js) is missing; run `npm run build` in the rateloom folder.');
    process.exit(2);
  }
  throw e;
}
