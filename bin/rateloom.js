#!/usr/bin/env node
// Entry point for the `rateloom` command: runs the compiled CLI, bundled into one module in dist/bundle/ (built by `npm run build`,
// which `npm ci` runs through the `prepare` script). `rateloom --version` alone is answered here
// from package.json, without loading the CLI or the library (start-up cost of node itself only).
import { readFileSync } from 'node:fs';

const args = process.argv.slice(2);
if (args.length === 1 && (args[0] === '--version' || args[0] === '-V')) {
  console.log(JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')).version);
} else {
  try {
    await import('../dist/bundle/main.js');
  } catch (e) {
    if (e?.code === 'ERR_MODULE_NOT_FOUND' && String(e.message).includes('dist/bundle/main.js')) {
      console.error('rateloom: the compiled CLI (dist/bundle/main.js) is missing; run `npm run build` in the rateloom folder.');
      process.exit(2);
    }
    throw e;
  }
}
