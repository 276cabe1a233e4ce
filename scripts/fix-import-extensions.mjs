// Give every relative import in src/ and cli/ its explicit extension, as Node's ES module rules
// (and the NodeNext build) require: './x' -> './x.js', './dir' -> './dir/index.js'.
// Usage: node scripts/fix-import-extensions.mjs   (rewrites the files in place; prints the count)
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const SPEC = /(\bfrom\s*|\bimport\s*\(\s*|\bimport\s+)(['"])(\.{1,2}\/[^'"]*)\2/g;

function* tsFiles(dir) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) yield* tsFiles(p);
    else if (e.name.endsWith('.ts')) yield p;
  }
}

/** The specifier with its extension, or undefined when it names no TypeScript file or folder. */
function withExtension(spec, dir) {
  if (/\.(js|json|mjs|cjs)$/.test(spec)) return spec;
  const abs = path.resolve(dir, spec);
  if (existsSync(`${abs}.ts`)) return `${spec}.js`;
  if (existsSync(abs) && statSync(abs).isDirectory() && existsSync(path.join(abs, 'index.ts'))) return `${spec}/index.js`;
  if (spec.endsWith('.ts')) return `${spec.slice(0, -3)}.js`;
  return undefined;
}

let changed = 0;
for (const top of ['src', 'cli']) {
  for (const file of tsFiles(path.join(root, top))) {
    const text = readFileSync(file, 'utf8');
    const out = text.replace(SPEC, (m, pre, q, spec) => {
      const next = withExtension(spec, path.dirname(file));
      if (next === undefined) console.error(`${path.relative(root, file)}: cannot resolve '${spec}'`);
      if (next === undefined || next === spec) return m;
      changed++;
      return pre + q + next + q;
    });
    if (out !== text) writeFileSync(file, out);
  }
}
console.log(`import specifiers given their extension: ${changed}`);
