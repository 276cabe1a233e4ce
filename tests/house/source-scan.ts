/**
 * Scans of the TypeScript sources with the compiler API (ts.createSourceFile, no type checking):
 * functions longer than a line limit, and numeric literals of physical constants written outside
 * src/core/constants.ts. Used by tests/house/code-rules.test.ts and `npm run long-functions`.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';

export const ROOT = join(import.meta.dirname, '../..');

/** Every .ts file under the given folders (relative to the repository root), sorted. */
export function sourceFiles(folders: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string): void => {
    for (const name of readdirSync(dir)) {
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (name.endsWith('.ts') && !name.endsWith('.d.ts')) out.push(relative(ROOT, p));
    }
  };
  for (const f of folders) walk(join(ROOT, f));
  return out.sort();
}

function parse(file: string): ts.SourceFile {
  return ts.createSourceFile(file, readFileSync(join(ROOT, file), 'utf8'), ts.ScriptTarget.ES2022, true);
}

/** A function-like node with a body, and the name it is known by. */
function functionName(node: ts.Node): string | undefined {
  if (ts.isFunctionDeclaration(node) || ts.isMethodDeclaration(node)) return node.name?.getText() ?? '(anonymous)';
  if (ts.isConstructorDeclaration(node)) return 'constructor';
  if (ts.isGetAccessorDeclaration(node) || ts.isSetAccessorDeclaration(node)) return node.name.getText();
  if (ts.isArrowFunction(node) || ts.isFunctionExpression(node)) {
    const p = node.parent;
    if (p && (ts.isVariableDeclaration(p) || ts.isPropertyAssignment(p) || ts.isPropertyDeclaration(p))) return p.name.getText();
    return '(anonymous)';
  }
  return undefined;
}

export interface LongFunction {
  /** file:name, the key of the allow-list. */
  key: string;
  lines: number;
}

/** Functions (declarations, methods, arrows, function expressions) spanning more than `limit` lines. */
export function longFunctions(files: readonly string[], limit = 80): LongFunction[] {
  const out: LongFunction[] = [];
  for (const file of files) {
    const sf = parse(file);
    const visit = (node: ts.Node): void => {
      const name = functionName(node);
      if (name !== undefined && (node as ts.FunctionLikeDeclaration).body) {
        const start = sf.getLineAndCharacterOfPosition(node.getStart(sf)).line;
        const end = sf.getLineAndCharacterOfPosition(node.getEnd()).line;
        const lines = end - start + 1;
        if (lines > limit) out.push({ key: `${file}:${name}`, lines });
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return out;
}

/**
 * Values of the physical constants of src/core/constants.ts, which no other source file may write
 * as a literal (common practice: one definition, one source).
 */
export const CONSTANT_VALUES: readonly number[] = [8.314462618, 101325, 273.15, 9.80665, 6.02214076e23, 1.380649e-23];

/** Numeric literals equal to one of CONSTANT_VALUES, as file:line. */
export function constantLiterals(files: readonly string[]): string[] {
  const out: string[] = [];
  for (const file of files) {
    const sf = parse(file);
    const visit = (node: ts.Node): void => {
      if (ts.isNumericLiteral(node) && CONSTANT_VALUES.includes(Number(node.text))) {
        out.push(`${file}:${sf.getLineAndCharacterOfPosition(node.getStart(sf)).line + 1}`);
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return out;
}
