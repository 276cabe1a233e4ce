/**
 * The `rateloom` command line. Each command lives in its own file and registers itself here.
 * Commands only parse flags, read files, call the library and print.
 */
import { Command } from 'commander';
import { configureUsageErrors, printError, EXIT_BAD_INPUT } from './run.js';
import { checkNumericFlags, describeRanges } from './options.js';
import { setAllowDataOutside } from './study-input.js';
import { registerFit } from './fit.js';
import { registerCompare } from './compare.js';
import { registerSize } from './size.js';
import { registerCheck } from './check.js';
import { registerSimulate } from './simulate.js';
import { registerDemo } from './demo.js';
import { registerPlan } from './plan.js';
import { registerNew } from './new.js';

const program = new Command();
program
  .name('rateloom')
  .description('Chemical kinetics regression and isothermal reactor sizing')
  .version('0.1.0')
  .option('--allow-data-outside', "accept CSV files outside the study file's folder (default: refused)");
configureUsageErrors(program);

// Command registrations (one file per command):
const registrations: Array<(p: Command) => void> = [];
// @register-commands (keep this marker; add one import + push per command)
registrations.push(registerCheck);
registrations.push(registerSimulate);
registrations.push(registerSize);
registrations.push(registerFit);
registrations.push(registerCompare);
registrations.push(registerDemo);
registrations.push(registerPlan);
registrations.push(registerNew);

for (const r of registrations) r(program);
describeRanges(program);

// Every command's --help ends with where the equations and defaults are written down.
const MODEL_REFERENCE = '\nModel reference (every equation, default and source): docs/model-reference.md';
program.addHelpText('after', MODEL_REFERENCE);
for (const c of program.commands) c.addHelpText('after', MODEL_REFERENCE);

// An option that takes a value must not swallow the next flag ('--out --json' would write into a
// folder named '--json'): refuse it as a usage error.
program.hook('preAction', (_root, action) => {
  setAllowDataOutside(action.optsWithGlobals().allowDataOutside === true);
  for (const opt of action.options) {
    const key = opt.attributeName();
    const v = action.getOptionValue(key);
    if (opt.required && typeof v === 'string' && v.startsWith('--')) {
      action.error(`option '${opt.flags}' got '${v}' as its value`, { code: 'commander.optionMissingArgument' });
    }
  }
  // Numeric options (counts, seeds, levels, workers) are checked against their ranges here, once.
  try {
    checkNumericFlags(action);
  } catch (e) {
    printError(process.argv.includes('--json'), e);
    process.exit(EXIT_BAD_INPUT);
  }
});

await program.parseAsync(process.argv);
