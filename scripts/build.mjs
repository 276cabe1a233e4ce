// Build the package: compile src/ and cli/ to ESM JavaScript with .d.ts declarations in dist/
// (tsconfig.build.json, NodeNext module rules), then bundle the CLI into dist/bundle/ (bundle-cli.mjs). Run by `npm run build` and by `prepare` (npm ci).
import { execFileSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bundleCli } from './bundle-cli.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
rmSync(join(root, 'dist'), { recursive: true, force: true });
try {
  execFileSync(process.execPath, [tsc, '-p', join(root, 'tsconfig.build.json')], { cwd: root, stdio: 'inherit' });
} catch {
  console.error('rateloom build failed: see the TypeScript errors above. Relative imports in src/ and cli/ need their .js extension: import specifiers given their extension: 0 adds them.');
  process.exit(1);
}
await bundleCli(root);
