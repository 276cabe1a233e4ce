/**
 * `rateloom new CSV... --out STUDY [--reactor KIND] [--phase gas|liquid] [--reaction EQ]...
 * [--rate ORDERS]... [--yes] [--force] [--json]`: write a study skeleton from lab CSV files
 * (src/onboard). Exit 0 when the skeleton was written (it loads as written), 2 for bad input
 * (unrecognisable columns, an existing output without --force): nothing is written then.
 */
import type { Command } from 'commander';
import { basename, dirname, relative, resolve } from 'node:path';
import { RateloomError, studySkeleton, type StudySkeleton } from '../src/index.js';
import { displayPath, readText, writeAtomic } from './io.js';
import { runCommand } from './run.js';

const KINDS = ['packed-bed', 'plug-flow', 'stirred-tank', 'batch', 'membrane', 'semibatch'] as const;

const HELP = `
Reads the header and rows of lab CSV files and writes a study file that 'rateloom check' accepts as
written. Recognised header patterns (units in brackets, parentheses, after ' / ', or as a suffix):
  run, run id, exp            run id               Rep, replicate   replicate mark (not needed)
  T [degC], T_K, Temperature  temperature          P [bar], P_bar   pressure
  W / g, m_cat, W_g           catalyst mass        V [L], V_R       reactor volume
  t [min], time               time (batch)         Q (mL/min), v0   volumetric flow
  F_A,in (mol/min), F_A_in    feed molar flow      F_A,out, F_A     outlet molar flow (measured)
  C_A0, C_A,in [mol/L]        inlet/initial conc.  C_A, [A]         outlet concentration
  species + C_in/C_out or F_in/F_out  one row per run and species ('stacked' layout)
  several files, or a file with a time column and no run column: one file per batch run
Units missing from a header are taken from comment lines ('# flows in mmol/min'), else SI is
written and listed to edit. What could not be inferred (reaction, rate law, reactor kind, units,
formulas, error model) is written under "todo" in the study and printed with its line.
The command never asks questions; --yes is accepted for scripts.

Example:
  rateloom new lab/runs.csv --out lab/study.json --reaction "A + B -> C" --rate "A^1 B^0.5"
  rateloom check lab/study.json && rateloom fit lab/study.json --out reports/lab

Study fields: schema/study.schema.json (the "$schema" of the file written); walkthrough: README.md.
Exit codes: 0 written, 2 bad input (nothing written).`;

interface NewFlags {
  out?: string;
  reactor?: string;
  phase?: string;
  reaction?: string[];
  rate?: string[];
  yes?: boolean;
  force?: boolean;
  json?: boolean;
}

const collect = (v: string, prev: string[] = []) => [...prev, v];

function checkChoices(flags: NewFlags): void {
  if (flags.reactor !== undefined && !(KINDS as readonly string[]).includes(flags.reactor)) {
    throw new RateloomError('E_USAGE', `--reactor '${flags.reactor}' is not a reactor kind`, { fix: `Use one of: ${KINDS.join(', ')}.` });
  }
  if (flags.phase !== undefined && flags.phase !== 'gas' && flags.phase !== 'liquid') throw new RateloomError('E_USAGE', `--phase '${flags.phase}' is neither gas nor liquid`);
}

/** Human-readable account: what was read, what was written, what to edit. */
function formatSkeleton(s: StudySkeleton, out: string): string {
  const L: string[] = [];
  L.push(`Study skeleton ${out}: ${s.layout} layout, ${s.reactor.kind} (${s.reactor.phase}), species ${s.species.join(', ')}; it reads ${s.runs} runs and ${s.observations} observations as written.`);
  for (const f of s.columns) {
    L.push(`Columns of ${f.file}:`);
    for (const c of f.recognised) L.push(`  ${c.header.padEnd(22)} ${c.role}${c.unit ? ` [${c.unit}, ${c.unitFrom === 'header' ? 'from the header' : c.unitFrom === 'comment' ? 'from a comment line' : 'NOT GIVEN: SI written'}]` : ''}`);
    if (f.unrecognised.length) L.push(`  not recognised: ${f.unrecognised.join(', ')}`);
  }
  L.push(`To edit in ${out} (line: field: what):`);
  for (const t of s.todo) L.push(`  ${String(t.line ?? '-').padStart(4)}: ${t.what}`);
  L.push(`Next: rateloom check ${out}, then rateloom fit ${out} --out reports/${basename(out).replace(/\.study\.json$|\.json$/, '')}`);
  return L.join('\n');
}

export function registerNew(program: Command): void {
  program
    .command('new')
    .description('Write a study skeleton from lab CSV files (header patterns, units, placeholders to edit)')
    .argument('<csv...>', 'lab CSV file(s): one table, or one file per batch run')
    .option('--out <study>', 'study file to write (default: <first csv name>.study.json beside it)')
    .option('--reactor <kind>', `lab reactor kind: ${KINDS.join(', ')} (default: inferred)`)
    .option('--phase <phase>', 'gas or liquid (default: gas with a pressure and molar flows, else liquid)')
    .option('--reaction <equation>', "reaction equation, 'A + B -> C' or 'A <=> B'; repeat for several (default: a placeholder)", collect)
    .option('--rate <orders>', "power-law orders of the reaction of the same position, 'A^1 B^0.5'; repeat per reaction (default: stoichiometric)", collect)
    .option('--yes', 'never ask (the command asks nothing; accepted for scripts)')
    .option('--force', 'overwrite an existing study file')
    .option('--json', 'print one JSON document')
    .addHelpText('after', HELP)
    .action(async (csvs: string[], flags: NewFlags) => {
      await runCommand(flags.json === true, () => {
        checkChoices(flags);
        const out = flags.out ?? resolve(dirname(csvs[0]), `${basename(csvs[0]).replace(/\.[^.]*$/, '')}.study.json`);
        const files = csvs.map((p) => ({ file: relative(dirname(resolve(out)), resolve(p)).split('\\').join('/'), text: readText(p, 'CSV file') }));
        const s = studySkeleton(files, {
          studyPath: resolve(out),
          ...(flags.reactor ? { reactor: flags.reactor as (typeof KINDS)[number] } : {}),
          ...(flags.phase ? { phase: flags.phase as 'gas' | 'liquid' } : {}),
          ...(flags.reaction ? { reactions: flags.reaction } : {}),
          ...(flags.rate ? { rates: flags.rate } : {}),
        });
        const shown = writeAtomic(out, s.text, { force: flags.force === true });
        const { text: _text, ...rest } = s;
        return { json: { status: 'written', study: shown, ...rest }, text: formatSkeleton(s, displayPath(out)), trustworthy: true };
      });
    });
}
