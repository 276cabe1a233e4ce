/**
 * Compare two folders of `rateloom demo` outputs (before and after a speed change): every .txt and
 * .md file (what the reports show, with their digits) must be identical; for every .json file the
 * number of values that differ and their largest relative difference are printed (full-precision
 * numbers may move in their last digits), with any other difference (strings: hashes of the hand-off).
 * Exit code 1 when a text file differs or a file is missing.
 * Run: npx tsx bench/demo-outputs.ts <before-dir> <after-dir>
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

/** Numbers that differ, their largest relative difference and where, and the other differences. */
export function jsonDifference(a: unknown, b: unknown): { numbers: number; maxRel: number; at: string; other: string[] } {
  const out = { numbers: 0, maxRel: 0, at: '', other: [] as string[] };
  const walk = (x: unknown, y: unknown, path: string): void => {
    if (typeof x === 'number' && typeof y === 'number') {
      if (x === y) return;
      out.numbers++;
      const rel = Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y));
      if (rel > out.maxRel) Object.assign(out, { maxRel: rel, at: path });
      return;
    }
    if (x && y && typeof x === 'object' && typeof y === 'object') {
      const xo = x as Record<string, unknown>;
      const yo = y as Record<string, unknown>;
      for (const k of new Set([...Object.keys(xo), ...Object.keys(yo)])) walk(xo[k], yo[k], `${path}.${k}`);
      return;
    }
    if (x !== y) out.other.push(path);
  };
  walk(a, b, '');
  return out;
}

function main(before: string, after: string): number {
  let bad = 0;
  for (const name of readdirSync(before).sort()) {
    const [pa, pb] = [join(before, name), join(after, name)];
    let textB: string;
    try {
      textB = readFileSync(pb, 'utf8');
    } catch {
      console.log(`${name}: missing after`);
      bad++;
      continue;
    }
    const textA = readFileSync(pa, 'utf8');
    if (/\.(txt|md)$/.test(name)) {
      const same = textA === textB;
      if (!same) bad++;
      console.log(`${name}: ${same ? 'identical' : 'DIFFERS'}`);
    } else if (name.endsWith('.json')) {
      const d = jsonDifference(JSON.parse(textA), JSON.parse(textB));
      console.log(`${name}: ${d.numbers} numbers differ${d.numbers ? `, largest relative difference ${d.maxRel.toExponential(2)} (${d.at})` : ''}${d.other.length ? `; other: ${d.other.join(', ')}` : ''}`);
    }
  }
  return bad ? 1 : 0;
}

if (process.argv[1]?.endsWith('demo-outputs.ts')) {
  const [before, after] = process.argv.slice(2);
  if (!before || !after) {
    console.error('usage: npx tsx bench/demo-outputs.ts <before-dir> <after-dir>');
    process.exit(2);
  }
  process.exit(main(before, after));
}
