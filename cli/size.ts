/**
 * `rateloom size KINETICS CASE`: size the production reactor from fitted kinetics, with the
 * kinetic uncertainty carried through. Prints the size with units, percentiles, tubes, outlet,
 * warnings and always the cautions. Exit 0 sized from a trustworthy hand-off, 1 unreachable or
 * untrustworthy (the result's verdict), 2 bad input (a hand-off refused by its verdict included).
 */
import { formatPelletSizing } from './pellet-text.js';
import type { Command } from 'commander';
import { RateloomError, parseHandoff, kineticsFromHandoff, loadCase, type SizingResult, sizeReactorParallel, AUTO_RULE_TEXT, sizingReportData, type WorkersSetting, shownSizing, type ShownSizing } from '../src/index.js';
import { WORKERS_OPTION } from './fit.js';
import { assertWritable, readJson, writeAll } from './io.js';
import type { OutputFile } from './output.js';
import { basename, join } from 'node:path';
import { renderSizingFiles } from './report-render.js';
import { progressReporter, runCommand, toJson } from './run.js';
import { g, withUnit } from './format.js';

const EXAMPLE = `
Example:
  rateloom size fitted.json plant.case.json --draws 10000 --seed 7 --out sizing.json

plant.case.json:
  {
    "name": "Plant A, line 2",
    "reactor": { "kind": "packed-bed", "phase": "gas" },
    "feed": { "totalFlow": "120 mol/s", "moleFractions": { "A": 0.3, "B": 0.6, "N2": 0.1 } },
    "temperature": "520 K",
    "pressure": "12 bar",
    "target": { "conversion": 0.8, "species": "A" },
    "tubes": { "innerDiameter": "32 mm", "particleDiameter": "4 mm", "voidFraction": 0.42,
               "bulkDensity": "900 kg/m3", "particleDensity": "1550 kg/m3",
               "viscosity": "2.4e-5 Pa s", "allowedPressureDrop": "1.5 bar" },
    "heat": { "reactionEnthalpy": { "r1": "-95 kJ/mol" }, "heatCapacity": "38 J/(mol K)" },
    "uncertainty": { "draws": 10000, "seed": 12345, "levels": [0.9, 0.95], "designLevel": 0.95 }
  }
uncertainty.designLevel (default 0.95): the percentile of the required catalyst mass the tubes are
designed for; the tube count is raised until that catalyst (reported as the catalyst to install)
stays within tubes.allowedPressureDrop, so only parameter sets beyond it may need more.
Targets: { "conversion": X, "species": S } | { "production": "2 mol/s", "species": P } | { "size": "150 kg" }.
Reactor kinds: packed-bed (size in kg catalyst), plug-flow (m3), stirred-tank (m3), batch (s).
Worker threads (Monte Carlo draws): ${AUTO_RULE_TEXT}
The hand-off must come unchanged (content hash) from a trustworthy fit with a positive-definite
covariance; otherwise size refuses it (exit 2) unless --accept-untrustworthy, and then every
output carries a caution saying why and the exit code is 1.
Exit codes: 0 sized, 1 target unreachable or result not trustworthy, 2 bad input.`;

interface SizeFlags {
  /** Numbers checked against OPTION_RANGES by cli/options.ts before the command runs. */
  draws?: number;
  seed?: number;
  json?: boolean;
  out?: string;
  report?: string;
  force?: boolean;
  workers?: WorkersSetting;
  acceptUntrustworthy?: boolean;
}

const pct = (level: number) => `P${g(level * 100, 3)}`;

/** Human-readable report of a sizing result. */
export function formatSizing(r: SizingResult, shown: ShownSizing = shownSizing(r, undefined)): string {
  const L: string[] = [];
  L.push(`Case: ${r.case} (${r.reactor.kind}, ${r.reactor.phase})`);
  L.push(`Status: ${r.status} - ${r.message}`);
  L.push(`Verdict: ${r.verdict.trustworthy ? 'trustworthy' : `NOT TRUSTWORTHY (${r.verdict.status})`}`);
  for (const x of r.verdict.reasons) L.push(`  - [${x.code}] ${x.message}`);
  if (r.equilibrium) {
    const e = r.equilibrium;
    L.push(
      e.method === 'limiting-reactant'
        ? `No equilibrium limit on ${e.species} (largest conversion ${g(e.conversion, 6)}, set by the limiting reactant)`
        : e.method === 'plateau'
          ? `Largest conversion of ${e.species} with all reactions running to a very large size: ${g(e.conversion, 6)} (a side reaction that consumes a product can carry it past the equilibrium of the main reaction)`
          : `Equilibrium conversion of ${e.species}: ${g(e.conversion, 6)}`,
    );
  }
  if (r.size) {
    const s = shown.size;
    const inSI = s && s.unit !== r.size.unit ? ` (${g(r.size.value, 5)} ${r.size.unit})` : '';
    L.push(`${r.size.quantity[0].toUpperCase()}${r.size.quantity.slice(1)} (nominal fit): ${s ? `${g(s.value, 5)} ${s.unit}` : `${g(r.size.value, 5)} ${r.size.unit}`}${inSI}`);
    if (s && shown.percentiles?.length && s.unit !== r.size.unit) L.push(`  in ${s.unit}: ${shown.percentiles.map((p) => `${pct(p.level)} ${g(p.value, 5)}`).join(', ')}`);
    if (r.spaceTime) L.push(`Space time ${r.spaceTime.definition}: ${g(r.spaceTime.value, 5)} ${r.spaceTime.unit}`);
  }
  const u = r.uncertainty;
  if (u) {
    const unit = u.unit === '1' ? '' : ` ${u.unit}`;
    L.push(`Uncertainty of the ${u.quantity} (${u.succeeded} of ${u.draws} Monte Carlo draws, seed ${u.seed}):`);
    L.push(`  median ${g(u.median, 5)}${unit}, mean ${g(u.mean, 5)}${unit}`);
    for (const p of u.percentiles) L.push(`  ${pct(p.level)} ${g(p.value, 5)}${unit}`);
    L.push(`  delta method: sd ${g(u.deltaMethod.sd, 3)}${unit}; ${u.deltaMethod.percentiles.map((p) => `${pct(p.level)} ${g(p.value, 5)}${unit}`).join(', ')}`);
    if (u.failed.count) L.push(`  failed draws: ${u.failed.count} (${Object.entries(u.failed.reasons).map(([k, n]) => `${n} ${k}`).join(', ')})`);
    L.push(`  sensitivities d ln(${u.quantity})/d theta: ${u.sensitivities.map((s) => `${s.transform === 'log' ? `ln ${s.name}` : s.name} ${withUnit(s.dLnQuantity, s.unit, 3)}`).join(', ')}`);
    L.push(`  change of ln(${u.quantity}) for +1 standard error: ${u.sensitivities.map((s) => `${s.name} ${g(s.perStdError, 3)}`).join(', ')}`);
  }
  if (r.tubes) {
    const t = r.tubes;
    const P = t.designedFor.level !== null ? pct(t.designedFor.level) : null;
    L.push(`Tubes: ${t.count} x ${g(t.innerDiameter * 1000, 4)} mm ID, designed for ${t.designedFor.basis}${t.nominalCount !== t.count ? ` (the nominal fit alone needs ${t.nominalCount})` : ''}; ${g(t.flowPerTube, 4)} mol/s per tube, G = ${g(t.superficialMassFlux, 4)} kg/(m2 s)`);
    L.push(`  nominal catalyst mass: bed length ${g(t.length, 4)} m, ${g(t.catalystPerTube, 4)} kg per tube, pressure drop ${g(t.pressureDrop.bar, 4)} bar`);
    if (t.install && P) {
      L.push(`  catalyst to install (${P}): ${g(t.install.catalystMass, 5)} kg, bed length ${g(t.install.length, 4)} m, ${g(t.install.catalystPerTube, 4)} kg per tube, pressure drop ${g(t.install.pressureDrop.bar, 4)} bar (nominal kinetics)`);
    }
    const d = t.draws;
    L.push(
      `  allowed pressure drop ${g(t.allowedPressureDrop / 1e5, 4)} bar` +
        (d ? `; ${d.overAllowed} of ${d.of} parameter sets need more${d.dropAtLevel && P ? ` (${P} of the drops they need: ${g(d.dropAtLevel.bar, 4)} bar)` : ''}` : ''),
    );
  }
  const sp = shown.pressure;
  if (sp) L.push(`Pressure: inlet ${g(sp.inlet, 5)} ${sp.unit}, outlet ${g(sp.outlet, 5)} ${sp.unit}`);
  if (r.outlet) {
    if (r.outlet.conversion) L.push(`Conversion of ${r.outlet.conversion.species}: ${g(r.outlet.conversion.value, 5)}`);
    const o = r.outlet;
    const band = o.lo && o.hi && o.band;
    const so = shown.outlet;
    const f = so ? so.amounts[Object.keys(so.amounts)[0]] : undefined;
    const factor = f && f.valueSI !== 0 ? f.value / f.valueSI : 1;
    L.push(`Outlet at the nominal size (${so?.unit ?? o.amountUnit}; mole fraction${band ? `; P5 and P95 over ${o.band!.draws} parameter sets` : ''}):`);
    for (const [s, v] of Object.entries(o.amounts)) {
      const b = band ? `  ${g(o.lo![s] * factor, 5).padStart(12)} ${g(o.hi![s] * factor, 5).padStart(12)}` : '';
      L.push(`  ${s.padEnd(10)} ${g(so ? so.amounts[s].value : v, 5).padStart(12)}  ${g(o.moleFractions[s], 4).padEnd(8)}${b}`);
    }
  }
  if (r.pellet) L.push(...formatPelletSizing(r.pellet, r.size?.value));
  if (r.thermal) L.push(...thermalLines(r.thermal));
  if (r.heat) L.push(`Adiabatic temperature rise: ${g(r.heat.adiabaticRise, 4)} K; heat to remove ${g(r.heat.heatDuty.value, 4)} ${r.heat.heatDuty.unit} (${r.heat.formula})`);
  if (r.warnings.length) {
    L.push('Warnings:');
    for (const w of r.warnings) L.push(`  - [${w.code}] ${w.message}`);
  }
  L.push('CAUTIONS:');
  for (const c of r.cautions) L.push(`  * ${c}`);
  return L.join('\n');
}

export function registerSize(program: Command): void {
  program
    .command('size')
    .description('Size the production reactor from fitted kinetics, with the uncertainty carried through')
    .argument('<kinetics>', 'fitted-kinetics hand-off file written by `rateloom fit` (JSON)')
    .argument('<case>', 'production case file (JSON; see the example below)')
    .option('--draws <n>', 'Monte Carlo draws (default: the case file, else 10000)')
    .option('--seed <s>', 'random seed (default: the case file, else 20261201)')
    .option('--json', 'print one JSON document')
    .option('--out <file>', 'also write the JSON result to this file')
    .option('--report <dir>', 'also write the sizing report (HTML + Markdown) into this folder')
    .option('--force', 'overwrite --out and report files if they exist')
    .option('--accept-untrustworthy', 'size even a hand-off whose fit is not trustworthy, whose content changed or whose covariance is singular (every output then says so)')
    .option(...WORKERS_OPTION)
    .addHelpText('after', EXAMPLE)
    .action(async (kineticsPath: string, casePath: string, flags: SizeFlags) => {
      const json = !!flags.json;
      await runCommand(json, async () => {
        const { draws, seed, workers = 'auto' } = flags;
        const reportStem = `${basename(casePath).replace(/\.json$/i, '').replace(/\.case$/i, '')}-sizing`;
        const { raw: handoffRaw, handoff: h } = parseHandoffAt(kineticsPath);
        const dk = kineticsFromHandoff(h);
        const { raw: caseRaw, kase } = loadCaseAt(casePath, dk.kinetics.speciesNames, dk.kinetics.reactionIds);
        assertWritable([...(flags.out ? [flags.out] : []), ...(flags.report ? [join(flags.report, `${reportStem}.html`), join(flags.report, `${reportStem}.md`)] : [])], { force: !!flags.force });
        const onProgress = progressReporter(json, 'Monte Carlo');
        const result = await sizeReactorParallel({
          handoff: h,
          kinetics: dk.kinetics,
          kase,
          ...(dk.molarMasses ? { molarMasses: dk.molarMasses } : {}),
          options: {
            ...(draws !== undefined ? { draws } : {}),
            ...(seed !== undefined ? { seed } : {}),
            ...(onProgress ? { onProgress } : {}),
            ...(flags.acceptUntrustworthy ? { acceptUntrustworthy: true } : {}),
          },
        }, { handoff: handoffRaw, case: caseRaw }, { workers });
        // Everything is rendered first, then written together: a kill or a failure leaves no partial set.
        const shown = shownSizing(result, kase.display);
        const files: OutputFile[] = flags.out ? [{ path: flags.out, content: toJson({ ...result, shown }) + '\n' }] : [];
        if (flags.report) files.push(...(await renderSizingFiles(sizingReportData(result, shown), { outDir: flags.report, baseName: reportStem })).files);
        const paths = writeAll(files, { force: !!flags.force });
        const outputs: { result?: string; html?: string; markdown?: string } = {};
        if (flags.out) outputs.result = paths[0];
        if (flags.report) [outputs.html, outputs.markdown] = paths.slice(flags.out ? 1 : 0);
        return { json: Object.keys(outputs).length ? { ...result, shown, outputs } : { ...result, shown }, text: formatSizing(result, shown), trustworthy: result.verdict.trustworthy };
      });
    });
}

function withFile<T>(file: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof RateloomError && !e.location) {
      throw new RateloomError(e.code, e.problem, { path: e.path, fix: e.fix, location: { file }, ...(e.details ? { details: e.details } : {}) });
    }
    throw e;
  }
}

function parseHandoffAt(path: string) {
  const raw = readJson(path, 'fitted-kinetics file');
  return { raw, handoff: withFile(path, () => parseHandoff(raw)) };
}

function loadCaseAt(path: string, species: readonly string[], reactions: readonly string[]) {
  const raw = readJson(path, 'case file');
  return { raw, kase: withFile(path, () => loadCase(raw, species, reactions)) };
}

/** Text lines of the energy-balance result (temperatures in K). */
function thermalLines(t: NonNullable<SizingResult['thermal']>): string[] {
  const d = t.design;
  const pc = (ps?: { level: number; value: number }[]) => (ps ? ` (${ps.map((p) => `P${g(p.level * 100, 3)} ${g(p.value, 5)} K`).join(', ')})` : '');
  const L = [
    `Energy balance (${t.mode}; ${t.model}); U = ${t.heatTransfer.U === null ? 'none' : `${g(t.heatTransfer.U, 4)} W/(m2 K)`}, ${t.heatTransfer.source}`,
    `  design: ${d.count} tubes x ${g(d.innerDiameter * 1000, 4)} mm, length ${g(d.length, 4)} m (max ${g(d.maxTubeLength, 4)} m), pressure drop ${g(d.pressureDrop.bar, 4)} bar; binding constraint: ${d.binding}${d.met ? '' : ' (NOT MET)'}`,
    `  hot spot ${g(t.hotSpot.temperature, 5)} K at ${g(t.hotSpot.position.length, 4)} m${t.hotSpot.limit !== null ? ` (limit ${g(t.hotSpot.limit, 5)} K)` : ''}${pc(t.hotSpot.percentiles)}`,
    `  outlet temperature ${g(t.outletTemperature.value, 5)} K${pc(t.outletTemperature.percentiles)}`,
  ];
  if (t.runaway) {
    const r = t.runaway;
    L.push(`  runaway: critical coolant temperature ${r.criticalCoolantTemperature === null ? 'not located' : `${g(r.criticalCoolantTemperature, 5)} K, margin ${g(r.margin!, 4)} K`} (${r.criterion})`);
  }
  if (t.bvp) L.push(`  counter-current solve: ${t.bvp.converged ? 'converged' : 'NOT converged'} in ${t.bvp.iterations} iterations, residual ${g(t.bvp.residual, 3)} K`);
  return L;
}
