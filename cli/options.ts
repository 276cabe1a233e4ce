/**
 * Numeric command-line options, checked in one place before any command runs (main.ts calls
 * checkNumericFlags from its preAction hook): every flag that takes a count, a seed, a level or a
 * number of workers is read strictly (decimal notation only: no hex, no 'Infinity', no blank) and
 * checked against the library's one table of ranges (OPTION_RANGES); a bad value is E_USAGE naming
 * the flag, the allowed range and an example, before any file is read. The commands then receive
 * numbers. Each such option's help line ends with its range (describeRanges).
 */
import type { Command } from 'commander';
import { OPTION_RANGES, RateloomError, optionProblem, rangeText, type OptionName } from '../src/index.js';

/** Plain decimal numbers: 12, -3, 0.95, .5, 1e4. */
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** The range of option `attr` (commander's attribute name) of command `command`, when numeric. */
export function numericOptionOf(command: string, attr: string): OptionName | undefined {
  if (command === 'plan' && attr === 'draws') return 'planDraws';
  return Object.hasOwn(OPTION_RANGES, attr) ? (attr as OptionName) : undefined;
}

/** The allowed values of a flag in words (with 'auto' for --workers). */
export function flagRangeText(name: OptionName): string {
  return `${rangeText(OPTION_RANGES[name])}${name === 'workers' ? " or 'auto'" : ''}`;
}

/**
 * Read one flag value: the number, or 'auto' for --workers. Anything else throws E_USAGE with the
 * flag as its path and the range in `details`.
 */
export function parseNumericFlag(flag: string, name: OptionName, raw: string): number | 'auto' {
  if (name === 'workers' && raw === 'auto') return 'auto';
  const n = DECIMAL.test(raw.trim()) ? Number(raw) : Number.NaN;
  const problem = optionProblem(name, n);
  if (problem === undefined) return n;
  const r = OPTION_RANGES[name];
  throw new RateloomError('E_USAGE', `got '${raw.length > 40 ? `${raw.slice(0, 40)}...` : raw}': ${problem}${name === 'workers' ? " or 'auto'" : ''}`, {
    path: [flag],
    fix: `Give ${flag} ${flagRangeText(name)}, for example ${flag} ${r.example}.`,
    details: { option: flag, min: r.min, max: r.max, integer: r.integer },
  });
}

/** Check every numeric option of the command about to run and turn its value into a number. */
export function checkNumericFlags(action: Command): void {
  for (const opt of action.options) {
    const attr = opt.attributeName();
    const name = numericOptionOf(action.name(), attr);
    const raw: unknown = action.getOptionValue(attr);
    if (!name || typeof raw !== 'string') continue;
    action.setOptionValueWithSource(attr, parseNumericFlag(opt.long ?? `--${attr}`, name, raw), action.getOptionValueSource(attr) ?? 'cli');
  }
}

/** End the help line of every numeric option with its allowed range. */
export function describeRanges(program: Command): void {
  for (const c of program.commands) {
    for (const o of c.options) {
      const name = numericOptionOf(c.name(), o.attributeName());
      if (name) o.description += ` (${flagRangeText(name)})`;
    }
  }
}
