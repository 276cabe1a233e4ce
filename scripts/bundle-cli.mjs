// Bundle the compiled CLI (dist/cli/main.js and everything it imports from dist/) into one ES
// module, dist/bundle/main.js, that bin/rateloom.js runs. Why: Node 20 spends most of a short
// command's start-up resolving, reading and compiling ~250 separate modules (measured with
// `node --cpu-prof`: `rateloom check` 0.52 s CPU unbundled, 0.24 s bundled, `node -e 0` 0.10 s).
// Called by scripts/build.mjs after tsc; the library entry (exports: dist/src/index.js) stays
// unbundled, with its .d.ts.
//
// Kept out of the bundle: vega and vega-lite (loaded only when a report is rendered; the report
// code itself is a lazily loaded chunk) and odex (loaded through createRequire). Every other
// dependency is bundled; CommonJS ones (commander) get a `require` made by createRequire.
//
// `import.meta.url` is rewritten in each bundled module to the URL that module had in dist/, so
// code that finds files beside itself keeps finding them: the worker pool's worker and job modules
// (the unbundled dist/src/parallel/*.js, which the worker threads load), the demo data folder and
// createRequire(import.meta.url).
//
// The worker threads' modules (dist/src/parallel/worker.js and the job modules study-jobs.js and
// mc-jobs.js) are bundled too, into dist/bundle/parallel/; the pool (src/parallel/pool.ts,
// workerModule) starts its worker threads on these copies when they exist, for the CLI and the
// library alike.
// Why: each worker thread otherwise loads ~250 separate modules before its first job (measured:
// importing the two job modules costs 0.23-0.39 s CPU unbundled against 0.12-0.17 s bundled,
// `node -e 0` 0.08 s).
import { readFile } from 'node:fs/promises';
import { dirname, join, relative } from 'node:path';

/** esbuild plugin: `import.meta.url` of each bundled dist/ module becomes the URL that module had in dist/, relative to `outdir`. */
function keepUrl(outdir) {
  return {
    name: 'keep-import-meta-url',
    setup(b) {
      b.onLoad({ filter: /[\\/]dist[\\/].*\.js$/ }, async (args) => {
        const text = await readFile(args.path, 'utf8');
        if (!text.includes('import.meta.url')) return undefined;
        const rel = relative(outdir, args.path).split('\\').join('/');
        const url = `new URL(${JSON.stringify(rel)}, import.meta.url).href`;
        return { contents: text.replaceAll('import.meta.url', url), loader: 'js', resolveDir: dirname(args.path) };
      });
    },
  };
}

/** The esbuild options shared by the CLI bundle and the worker bundle. */
function bundleOptions(entryPoints, outdir) {
  return {
    entryPoints,
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    external: ['vega', 'vega-lite', 'odex'],
    banner: { js: "import { createRequire as __rateloomRequire } from 'node:module'; const require = __rateloomRequire(import.meta.url);" },
    plugins: [keepUrl(outdir)],
    minifyWhitespace: true,
    minifySyntax: true,
    logLevel: 'warning',
  };
}

/** Bundle dist/cli/main.js into dist/bundle/ and the worker modules into dist/bundle/parallel/ (root: the package folder). */
export async function bundleCli(root) {
  const { build } = await import('esbuild');
  const outdir = join(root, 'dist', 'bundle');
  await build(bundleOptions([join(root, 'dist', 'cli', 'main.js')], outdir));
  const parallel = join(root, 'dist', 'src', 'parallel');
  await build(bundleOptions(['worker.js', 'study-jobs.js', 'mc-jobs.js'].map((f) => join(parallel, f)), join(outdir, 'parallel')));
}
