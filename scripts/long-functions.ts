/**
 * Print the functions over 80 lines in src/ and cli/ (longest first), found with the TypeScript
 * compiler API (tests/house/source-scan.ts). Usage: npm run long-functions
 */
import { longFunctions, sourceFiles } from '../tests/house/source-scan';

const found = longFunctions(sourceFiles(['src', 'cli'])).sort((a, b) => b.lines - a.lines);
for (const f of found) process.stdout.write(`${String(f.lines).padStart(4)}  ${f.key}\n`);
process.stdout.write(`${found.length} function(s) over 80 lines\n`);
