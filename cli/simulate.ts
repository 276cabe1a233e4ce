/**
 * `rateloom simulate STUDY [--params FILE] [--profile] [--candidate NAME] [--json]`: solve every
 * run of a study with the study's parameter values (or those in FILE) and print each run's outlet
 * flows, conversion of the key reactant and outlet pressure ratio, with units.
 * Exit 0 all runs solved, 1 some run failed numerically, 2 bad input.
 */
import type { Command } from 'commander';
import { loadStudy, applyParameterValues, simulateStudy, type SimulationResult } from '../src/index.js';
import { readJson, readText } from './io.js';
import { runCommand } from './run.js';
import { studyLoadOptions } from './study-input.js';
import { g } from './format.js';

const EXAMPLE = `
Example:
  rateloom simulate lab/hydrogenation.study.json
  rateloom simulate lab/hydrogenation.study.json --params guess.json --profile

guess.json (SI numbers, or values with units):
  { "k1": 2.0e-4, "E1": { "value": 65, "unit": "kJ/mol" } }
A fit result with "parameters": [{ "name": ..., "value": ... }] (SI) is read as well.
Exit codes: 0 all runs solved, 1 a run failed numerically, 2 bad input.`;


export function formatSimulation(r: SimulationResult, profile: boolean): string {
  const L: string[] = [];
  L.push(`Parameters: ${r.parameters.map((p) => `${p.name} = ${g(p.value, 5)}${p.unit === '1' ? '' : ` ${p.unit}`}`).join('; ')}`);
  L.push(`${r.referenceTemperatureApplies ? `Reference temperature: ${g(r.referenceTemperature)} K; k` : 'K'}ey reactant ${r.keyReactant}`);
  for (const run of r.runs) {
    L.push('');
    L.push(`Run ${run.runId}${run.group !== undefined ? ` (group ${run.group})` : ''}: ${run.status}${run.success ? '' : ` - ${run.message}`}`);
    L.push(`  outlet ${run.outletUnit === 'mol/s' ? 'flows' : 'amounts'}: ${Object.entries(run.outlet).map(([s, v]) => `${s} ${g(v)} ${run.outletUnit}`).join(', ')}`);
    L.push(`  conversion of ${r.keyReactant}: ${run.conversion !== undefined ? `${g(100 * run.conversion, 4)} %` : 'n/a'}${run.measuredConversion !== undefined ? ` (measured ${g(100 * run.measuredConversion, 4)} %)` : ''}`);
    L.push(`  outlet pressure ratio p/p0: ${g(run.pressureRatio, 6)}`);
    for (const [i, st] of (run.steadyStates ?? []).entries()) {
      L.push(`  steady state ${i + 1} of ${run.steadyStates!.length}${st.reported ? ' (reported above)' : ''}, ${st.stability}: ${Object.entries(st.outlet).map(([s, v]) => `${s} ${g(v)} ${run.outletUnit}`).join(', ')}`);
    }
    for (const w of run.warnings) L.push(`  warning: ${w}`);
    if (profile && run.profile) {
      const p = run.profile;
      const step = Math.max(1, Math.floor(p.x.length / 10));
      L.push(`  profile (${p.coordinate} in ${p.unit}; amounts in ${run.outletUnit}):`);
      const rows = [];
      for (let i = 0; i < p.x.length; i += step) rows.push(i);
      if (rows[rows.length - 1] !== p.x.length - 1) rows.push(p.x.length - 1);
      for (const i of rows) {
        L.push(`    ${p.coordinate} = ${g(p.x[i])} ${p.unit}: ${Array.from(p.amounts[i]).map((v, k) => `${Object.keys(run.outlet)[k]} ${g(v)}`).join(', ')}; p/p0 ${g(p.pressureRatio[i], 5)}`);
      }
    }
  }
  L.push('');
  L.push(`Note: ${r.roundOff.note}.`);
  return L.join('\n');
}

export function registerSimulate(program: Command): void {
  program
    .command('simulate')
    .description("Solve every run of a study with the study's (or given) parameter values")
    .argument('<study>', 'study file (JSON)')
    .option('--params <file>', 'parameter values (JSON)')
    .option('--profile', 'print profiles along the reactor (or in time)')
    .option('--candidate <name>', 'use a candidate rate-law set of the study')
    .option('--json', 'print one JSON document')
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: { params?: string; profile?: boolean; candidate?: string; json?: boolean }) => {
      await runCommand(flags.json === true, () => {
        const { study } = loadStudy(readText(studyPath, 'study file'), studyPath, (abs) => readText(abs, 'data file'), studyLoadOptions());
        let params = study.parameters;
        if (flags.candidate !== undefined) {
          const c = study.candidates.find((x) => x.name === flags.candidate);
          if (c) params = c.parameters;
        }
        if (flags.params) params = applyParameterValues(params, readJson(flags.params, 'parameter file'), flags.params);
        const result = simulateStudy(study, params, { profile: flags.profile === true, ...(flags.candidate !== undefined ? { candidate: flags.candidate } : {}) });
        return { json: { status: result.success ? 'ok' : 'run-failed', ...result }, text: formatSimulation(result, flags.profile === true), trustworthy: result.success };
      });
    });
}
