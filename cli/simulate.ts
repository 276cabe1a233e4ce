/**
 * `rateloom simulate STUDY [--params FILE] [--heat FILE] [--profile] [--candidate NAME] [--json]`:
 * solve every run of a study with the study's parameter values (or those in FILE) and print each
 * run's outlet flows, conversion of the key reactant and outlet pressure ratio, with units; with
 * --heat, the runs are solved with their energy balance and the temperatures are printed too.
 * Exit 0 all runs solved, 1 some run failed numerically, 2 bad input.
 */
import type { Command } from 'commander';
import { loadStudy, applyParameterValues, simulateStudy, type SimulationResult, type SimulatedHeat, simulateWithHeat, CELSIUS_ZERO } from '../src/index.js';
import { readJson, readText } from './io.js';
import { runCommand } from './run.js';
import { studyLoadOptions } from './study-input.js';
import { g } from './format.js';

const EXAMPLE = `
Example:
  rateloom simulate lab/hydrogenation.study.json
  rateloom simulate lab/hydrogenation.study.json --params guess.json --profile
  rateloom simulate lab/hydrogenation.study.json --heat heat.json

heat.json (the case file's "heat" block; a cooled tube also gives its inner diameter, a stirred
tank or batch vessel heat.exchangeArea; the run temperature is the feed temperature):
  { "heat": { "mode": "constant-coolant", "reactionEnthalpy": { "r1": "-45 kJ/mol" },
              "heatCapacities": { "A": "150 J/(mol K)", "B": "160 J/(mol K)" },
              "overallCoefficient": "500 W/(m2 K)", "coolant": { "temperature": "320 K" } },
    "tubes": { "innerDiameter": "50 mm" } }

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
    if (run.heat) L.push(...heatLines(run.heat, profile));
    for (const w of run.warnings) L.push(`  warning: ${w}`);
    if (profile && run.profile && !run.heat) {
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
    .option('--heat <file>', 'heat inputs (JSON): solve the energy balance of every run')
    .option('--profile', 'print profiles along the reactor (or in time)')
    .option('--candidate <name>', 'use a candidate rate-law set of the study')
    .option('--json', 'print one JSON document')
    .addHelpText('after', EXAMPLE)
    .action(async (studyPath: string, flags: { params?: string; heat?: string; profile?: boolean; candidate?: string; json?: boolean }) => {
      await runCommand(flags.json === true, () => {
        const { study } = loadStudy(readText(studyPath, 'study file'), studyPath, (abs) => readText(abs, 'data file'), studyLoadOptions());
        let params = study.parameters;
        if (flags.candidate !== undefined) {
          const c = study.candidates.find((x) => x.name === flags.candidate);
          if (c) params = c.parameters;
        }
        if (flags.params) params = applyParameterValues(params, readJson(flags.params, 'parameter file'), flags.params);
        const opts = { profile: flags.profile === true, ...(flags.candidate !== undefined ? { candidate: flags.candidate } : {}) };
        const result = flags.heat !== undefined
          ? simulateWithHeat(study, params, readJson(flags.heat, 'heat file'), { ...opts, heatFile: flags.heat })
          : simulateStudy(study, params, opts);
        return { json: { status: result.success ? 'ok' : 'run-failed', ...result }, text: formatSimulation(result, flags.profile === true), trustworthy: result.success };
      });
    });
}

const K = (T: number | null): string => (T === null ? 'n/a' : `${g(T, 6)} K (${g(T - CELSIUS_ZERO, 5)} degC)`);

/** The energy-balance lines of one run: temperatures, hot spot, coolant, steady states, profile. */
function heatLines(h: SimulatedHeat, profile: boolean): string[] {
  const L: string[] = [];
  const tank = h.steadyStates !== undefined;
  L.push(`  energy balance (${h.mode}): feed ${K(h.feedTemperature)}, ${h.hotSpot.unit === 's' ? 'final' : 'outlet'} ${K(h.outletTemperature)}`);
  if (!tank) L.push(`  hottest point: ${K(h.hotSpot.temperature)} at ${g(h.hotSpot.position ?? NaN, 5)} ${h.hotSpot.unit}${h.hotSpot.unit === 's' ? '' : ' from the inlet'}`);
  if (h.coolant.temperature !== null) L.push(`  coolant: given ${K(h.coolant.temperature)}${h.coolant.atOutlet !== null && h.mode !== 'constant-coolant' ? `; at the gas inlet ${K(h.coolant.atInlet)}, at the gas outlet ${K(h.coolant.atOutlet)}` : ''}`);
  if (h.bvp) L.push(`  counter-current coolant: ${h.bvp.converged ? 'converged' : 'NOT converged'} in ${h.bvp.iterations} iterations (residual ${g(h.bvp.residual, 3)} K)`);
  if (h.limit) L.push(`  limit heat.maxTemperature ${K(h.limit.maxTemperature)}: ${h.limit.exceeded ? 'EXCEEDED' : 'kept'}`);
  for (const [i, s] of (h.steadyStates ?? []).entries()) {
    L.push(`  thermal steady state ${i + 1} of ${h.steadyStates!.length}${s.reported ? ' (reported above)' : ''}: ${K(s.temperature)}, conversion ${s.conversion === null ? 'n/a' : `${g(100 * s.conversion, 5)} %`}, ${s.stable ? 'stable' : 'unstable'}`);
  }
  if (h.stabilityCriterion) L.push(`  stability: ${h.stabilityCriterion}`);
  if (profile && h.profile) {
    const p = h.profile;
    const step = Math.max(1, Math.floor(p.x.length / 10));
    L.push(`  temperature profile (${p.unit === 's' ? 't in s' : `position in ${p.unit}`}):`);
    for (let i = 0; i < p.x.length; i += step) L.push(`    ${g(p.x[i], 5)} ${p.unit}: T ${K(p.T[i])}${p.Ta[i] !== null ? `, coolant ${K(p.Ta[i])}` : ''}`);
  }
  return L;
}
