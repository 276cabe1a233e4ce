/**
 * Benchmark: the energy balance. (1) One cooled (co-current) packed-bed tube solve against the
 * isothermal solve of the same tube (the same model with the energy term off), averaged over
 * repeated solves; (2) Monte Carlo sizing of an invented cooled multitubular bed with the energy
 * balance (size per draw, installed tube rated per draw, runaway margin on the first 100 draws by a local scan).
 * Run: npx tsx bench/heat-sizing.ts [draws]
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { kineticsFromHandoff } from '../src/design/kinetics';
import { loadCase } from '../src/design/case';
import { sizeReactor } from '../src/design/size';
import { ThermalTube } from '../src/reactors/thermal/thermal-tube';
import { parameterMap, parseHandoff } from '../src/design/handoff-load';
import { buildSystem } from '../src/design/system';
import { resolveEnthalpies } from '../src/design/thermal-design';
import { HeatSizer } from '../src/design/heat-size';

const root = new URL('../tests/design/fixtures/', import.meta.url);
const h = parseHandoff(JSON.parse(readFileSync(new URL('bed.kinetics.json', root), 'utf8')));
const dk = kineticsFromHandoff(h);
const raw = JSON.parse(readFileSync(new URL('bed.case.json', root), 'utf8'));
raw.name = 'invented cooled bed (dilute feed)';
raw.feed = { totalFlow: '50 mol/s', moleFractions: { A: 0.05, B: 0.05, N2: 0.9 } };
raw.temperature = '480 K';
raw.target = { conversion: 0.7, species: 'A' };
raw.heat = {
  mode: 'co-current', reactionEnthalpy: { r1: '-90 kJ/mol' }, referenceTemperature: '480 K',
  heatCapacities: { A: '40 J/(mol K)', B: '35 J/(mol K)', C: '80 J/(mol K)', N2: '29.1 J/(mol K)' },
  overallCoefficient: '150 W/(m2 K)', coolant: { temperature: '478 K', flow: '30 kg/s', heatCapacity: '2.2 kJ/(kg K)' }, maxTemperature: '540 K',
};
const kase = loadCase(raw, dk.kinetics.speciesNames, dk.kinetics.reactionIds);

/** Run both parts; returns the timings (ms) and the lines to print. */
export function runHeatSizing(draws = 10000, repeats = 200): { lines: string[]; thermalMs: number; isothermalMs: number; ratio: number; drawsMs: number; draws: number } {
  const nominal = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws: 0 } });
  const th = nominal.thermal!;
  const map = parameterMap(h, dk.kinetics.parameterNames);
  const sys = buildSystem(dk.kinetics, kase, map.theta);
  const en = resolveEnthalpies(dk.kinetics, h, kase, kase.heat!.thermal!);
  const trial = new HeatSizer(sys, dk.kinetics, kase.heat!.thermal!, en.values, dk.molarMasses!).trial(th.design.count, 0, 0.7);
  const time = (mode: 'co-current' | 'isothermal'): number => {
    const tube = new ThermalTube({ ...trial.tube.spec, mode }, dk.kinetics, Float64Array.from(map.theta));
    tube.solve(trial.W);
    const t0 = performance.now();
    for (let i = 0; i < repeats; i++) tube.solve(trial.W);
    return (performance.now() - t0) / repeats;
  };
  const thermalMs = time('co-current');
  const isothermalMs = time('isothermal');
  const t1 = performance.now();
  const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses!, options: { draws } });
  const drawsMs = performance.now() - t1;
  const d = r.thermal?.draws;
  const lines = [
    `case: ${kase.name}; status ${nominal.status}; ${th.design.count} tubes x ${(th.design.length).toFixed(2)} m; binding ${th.design.binding}; hot spot ${th.hotSpot.temperature.toFixed(1)} K`,
    `one tube solve: co-current ${thermalMs.toFixed(3)} ms, isothermal ${isothermalMs.toFixed(3)} ms, ratio ${(thermalMs / isothermalMs).toFixed(2)} (mean of ${repeats})`,
    `${draws} Monte Carlo draws with the energy balance (sizing + rating + runaway margin on 100): ${(drawsMs / 1000).toFixed(2)} s; hot spot P50/P90/P95 ${d ? d.hotSpot.percentiles.map((p) => p.value.toFixed(1)).join('/') : '-'} K`,
  ];
  return { lines, thermalMs, isothermalMs, ratio: thermalMs / isothermalMs, drawsMs, draws };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  for (const l of runHeatSizing(Number(process.argv[2] ?? 10000)).lines) console.log(l);
}
