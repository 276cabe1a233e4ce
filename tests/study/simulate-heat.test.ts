/**
 * simulate with heat inputs: lab runs solved with their energy balance, checked against SciPy
 * solve_ivp (tests/reference/scipy/simulate_heat.py, simulate_heat.json) for the cooled plug flow
 * (constant and co-current coolant) and the jacketed batch, and against the SciPy brentq steady
 * states of tests/reference/scipy/cstr_heat.json for the stirred tank.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { simulateWithHeat } from '../../src/design/simulate-heat';
import { simulate } from '../../src/api/study';
import { RateloomError } from '../../src/core/errors';

type Prof = { x: number[]; T: number[]; FA: number[] };
type Tube = { FA: number; T_out: number; hot: { x: number; T: number }; profile: Prof; Ta_out?: number };
const ref = JSON.parse(readFileSync(new URL('../reference/scipy/simulate_heat.json', import.meta.url), 'utf8')) as {
  params: { k_ref: number; E: number; T_ref: number; dH: number; T_h: number; cpA: number; cpB: number; cpS: number; tube: Record<string, number>; batch: Record<string, number> };
  constant_coolant: Tube; co_current: Tube; batch: { NA: number; T_end: number; hot: { x: number; T: number }; profile: Prof };
};
const cstr = JSON.parse(readFileSync(new URL('../reference/scipy/cstr_heat.json', import.meta.url), 'utf8')) as {
  params: Record<string, number>; steady_states: { T: number; X: number; stable: boolean }[];
};
const P = ref.params;

/** An invented liquid study A -> B in an inert solvent S with an Arrhenius rate constant. */
function study(reactor: string, data: unknown[], kRef = P.k_ref): unknown {
  return {
    species: [{ name: 'A' }, { name: 'B' }, { name: 'S', inert: true }],
    reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
    reactor: { kind: reactor, phase: 'liquid' },
    referenceTemperature: { value: P.T_ref, unit: 'K' },
    data,
    parameters: [{ name: 'k', value: kRef, unit: '1/s' }, { name: 'E', value: P.E / 1000, unit: 'kJ/mol' }],
  };
}

const t = P.tube;
const flowData = (kind: string, T0: number, size: number, v0: number, CA0: number, CS0: number) => ({
  file: 'runs.csv', layout: 'per-run',
  columns: {
    run: 'run', temperature: { value: T0, unit: 'K' }, volume: { value: size, unit: 'm3' }, volumetricFlow: { value: v0, unit: 'm3/s' },
    inletConcentrations: { A: { value: CA0, unit: 'mol/m3' }, S: { value: CS0, unit: 'mol/m3' } },
    measured: [{ response: 'outlet-concentration', species: 'A', column: 'CA', unit: 'mol/m3' }],
  },
  kind,
});
const cps = { A: `${P.cpA} J/(mol K)`, B: `${P.cpB} J/(mol K)`, S: `${P.cpS} J/(mol K)` };
const heatBase = { reactionEnthalpy: { r1: `${P.dH / 1000} kJ/mol` }, referenceTemperature: `${P.T_h} K`, heatCapacities: cps, overallCoefficient: `${t.U} W/(m2 K)` };

function pfrStudy() {
  const d = flowData('pfr', t.T0, t.V, t.v0, t.FA0 / t.v0, t.FS0 / t.v0);
  const { kind: _k, ...data } = d;
  return loadStudy(JSON.stringify(study('plug-flow', [data])), '/v/pfr.json', () => 'run,CA\np1,500\n').study;
}

/** Relative error of a against b. */
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('simulate --heat: cooled plug flow against SciPy solve_ivp', () => {
  const s = pfrStudy();
  it('constant coolant: outlet flow and temperature, hot spot position and value, profile', () => {
    const doc = { heat: { ...heatBase, mode: 'constant-coolant', coolant: { temperature: `${t.Ta} K` } }, tubes: { innerDiameter: `${t.D} m` } };
    const r = simulateWithHeat(s, s.parameters, doc, { profile: true });
    const run = r.runs[0];
    expect(run.success).toBe(true);
    const h = run.heat!;
    const c = ref.constant_coolant;
    // Source: SciPy solve_ivp (Radau, rtol 1e-11), simulate_heat.py
    expect(rel(run.outlet.A, c.FA)).toBeLessThan(1e-6);
    expect(rel(h.outletTemperature, c.T_out)).toBeLessThan(1e-6);
    expect(rel(h.hotSpot.temperature, c.hot.T)).toBeLessThan(1e-6);
    expect(Math.abs(h.hotSpot.position! - c.hot.x)).toBeLessThan(1e-4 * t.V);
    expect(h.hotSpot.unit).toBe('m3');
    c.profile.x.forEach((x, i) => {
      expect(Math.abs(h.profile!.x[i] - x)).toBeLessThan(1e-12);
      expect(rel(h.profile!.T[i], c.profile.T[i])).toBeLessThan(1e-6);
    });
    expect(run.conversion!).toBeCloseTo(1 - c.FA / t.FA0, 6);
  });
  it('co-current coolant: outlet temperatures of gas and coolant, hot spot', () => {
    const doc = { heat: { ...heatBase, mode: 'co-current', coolant: { temperature: `${t.Ta} K`, flow: `${t.mc} kg/s`, heatCapacity: `${t.cpc} J/(kg K)` } }, tubes: { innerDiameter: `${t.D} m` } };
    const h = simulateWithHeat(s, s.parameters, doc).runs[0].heat!;
    const c = ref.co_current;
    // Source: SciPy solve_ivp (Radau, rtol 1e-11), simulate_heat.py
    expect(rel(h.outletTemperature, c.T_out)).toBeLessThan(1e-6);
    expect(rel(h.coolant.atOutlet!, c.Ta_out!)).toBeLessThan(1e-6);
    expect(rel(h.hotSpot.temperature, c.hot.T)).toBeLessThan(1e-6);
    expect(Math.abs(h.hotSpot.position! - c.hot.x)).toBeLessThan(1e-4 * t.V);
  });
  it('maxTemperature below the hot spot is reported as exceeded with a warning', () => {
    const doc = { heat: { ...heatBase, mode: 'constant-coolant', coolant: { temperature: `${t.Ta} K` }, maxTemperature: '330 K' }, tubes: { innerDiameter: `${t.D} m` } };
    const run = simulateWithHeat(s, s.parameters, doc).runs[0];
    expect(run.heat!.limit).toEqual({ maxTemperature: 330, exceeded: true });
    expect(run.warnings.join(' ')).toMatch(/exceeds heat.maxTemperature/);
  });
  it('refuses missing inputs with the field and the fix; never isothermal', () => {
    const bad = (doc: unknown) => () => simulateWithHeat(s, s.parameters, doc, { heatFile: 'h.json' });
    expect(bad({ heat: { ...heatBase, mode: 'constant-coolant', coolant: { temperature: '320 K' } } })).toThrow(/tubes\.innerDiameter|innerDiameter/);
    const { B: _b, ...noB } = cps;
    expect(bad({ heat: { ...heatBase, heatCapacities: noB, mode: 'adiabatic' } })).toThrow(/species 'B'.*no heat capacity/);
    expect(bad({ heat: { ...heatBase, mode: 'adiabatic', reactionEnthalpy: {} } })).toThrow(/reaction 'r1' has no reaction enthalpy/);
    expect(bad({ heat: { ...heatBase } })).toThrow(/heat\.mode/);
    try {
      bad({ heat: { ...heatBase, mode: 'adiabatc' } })();
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(RateloomError);
      expect((e as RateloomError).message).toMatch(/h\.json.*adiabatic/);
    }
  });
});

describe('simulate --heat: stirred tank and batch', () => {
  it('stirred tank: the three steady states of SciPy brentq with their stability; the coolest stable one reported', () => {
    const p = cstr.params;
    const data = flowData('tank', p.T0, p.V, p.v0, p.FA0 / p.v0, p.FS0 / p.v0);
    const { kind: _k, ...d } = data;
    const st = loadStudy(JSON.stringify(study('stirred-tank', [d], p.k_ref)), '/v/cstr.json', () => 'run,CA\nc1,500\n').study;
    const heat = {
      heat: {
        mode: 'constant-coolant', reactionEnthalpy: { r1: `${p.dH} J/mol` }, referenceTemperature: `${p.T_ref} K`,
        heatCapacities: { A: `${p.cpA} J/(mol K)`, B: `${p.cpB} J/(mol K)`, S: `${p.cpS} J/(mol K)` },
        overallCoefficient: '1000 W/(m2 K)', exchangeArea: `${p.UA / 1000} m2`, coolant: { temperature: `${p.Ta} K` },
      },
    };
    const run = simulateWithHeat(st, st.parameters, heat).runs[0];
    const states = run.heat!.steadyStates!;
    expect(states).toHaveLength(3);
    states.forEach((x, i) => {
      // Source: SciPy brentq roots of G(T) - R(T), cstr_heat.py
      expect(Math.abs(x.temperature - cstr.steady_states[i].T)).toBeLessThan(1e-6);
      expect(Math.abs(x.conversion! - cstr.steady_states[i].X)).toBeLessThan(1e-7);
      expect(x.stable).toBe(cstr.steady_states[i].stable);
    });
    expect(states.filter((x) => x.reported).map((x) => x.temperature)).toEqual([states[0].temperature]);
    expect(run.heat!.outletTemperature).toBe(states[0].temperature);
    expect(run.conversion!).toBeCloseTo(cstr.steady_states[0].X, 7);
    expect(run.warnings.join(' ')).toMatch(/3 steady states/);
  });
  it('batch with a jacket: final amount, final temperature and the hottest moment', () => {
    const b = P.batch;
    const data = [
      { file: 'conditions.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: b.T0, unit: 'K' }, initialConcentrations: { A: { column: 'CA0', unit: 'mol/m3' }, S: { column: 'CS0', unit: 'mol/m3' } } } },
      { file: 'samples.csv', layout: 'long', response: 'outlet-concentration', unit: 'mol/m3', columns: { run: 'run', position: { column: 't', unit: 's' }, species: 'sp', value: 'C' } },
    ];
    const files: Record<string, string> = { 'conditions.csv': `run,CA0,CS0\nb1,${b.CA0},${b.CS0}\n`, 'samples.csv': `run,t,sp,C\nb1,${b.t_end},A,1\n` };
    const st = loadStudy(JSON.stringify({ ...(study('batch', data) as object), reactor: { kind: 'batch', phase: 'liquid' } }), '/v/b.json', (abs) => files[abs.split('/').pop()!]).study;
    const heat = { heat: { ...heatBase, mode: 'constant-coolant', exchangeArea: `${b.area} m2`, coolant: { temperature: `${b.Ta} K` } } };
    const run = simulate(st, { heat, profile: true }).runs[0];
    const h = run.heat!;
    // Source: SciPy solve_ivp (Radau, rtol 1e-11), simulate_heat.py
    expect(rel(h.outletTemperature, ref.batch.T_end)).toBeLessThan(1e-6);
    expect(rel(h.hotSpot.temperature, ref.batch.hot.T)).toBeLessThan(1e-6);
    expect(Math.abs(h.hotSpot.position! - ref.batch.hot.x)).toBeLessThan(1e-3 * ref.batch.hot.x);
    expect(h.hotSpot.unit).toBe('s');
    expect(run.conversion!).toBeGreaterThan(1 - 1e-8);
    ref.batch.profile.x.forEach((_, i) => expect(rel(h.profile!.T[i], ref.batch.profile.T[i])).toBeLessThan(1e-6));
  });
  it('a vessel refuses tube-only cooling modes', () => {
    const p = cstr.params;
    const { kind: _k, ...d } = flowData('tank', p.T0, p.V, p.v0, p.FA0 / p.v0, p.FS0 / p.v0);
    const st = loadStudy(JSON.stringify(study('stirred-tank', [d])), '/v/cstr.json', () => 'run,CA\nc1,500\n').study;
    expect(() => simulateWithHeat(st, st.parameters, { heat: { ...heatBase, mode: 'co-current', coolant: { temperature: '300 K', flow: '1 kg/s', heatCapacity: '4 kJ/(kg K)' } } })).toThrow(/jacket at one temperature/);
  });
});

describe('rateloom simulate --heat (command line)', () => {
  it('prints the temperatures in text and JSON, exit 0; a bad heat file is exit 2 naming the field', async () => {
    const { spawnSync } = await import('node:child_process');
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const dir = mkdtempSync(join(tmpdir(), 'rl-simheat-'));
    const d = flowData('pfr', t.T0, t.V, t.v0, t.FA0 / t.v0, t.FS0 / t.v0);
    const { kind: _k, ...data } = d;
    writeFileSync(join(dir, 'pfr.study.json'), JSON.stringify(study('plug-flow', [data])));
    writeFileSync(join(dir, 'runs.csv'), 'run,CA\np1,500\n');
    const heat = { heat: { ...heatBase, mode: 'constant-coolant', coolant: { temperature: `${t.Ta} K` } }, tubes: { innerDiameter: `${t.D} m` } };
    writeFileSync(join(dir, 'heat.json'), JSON.stringify(heat));
    const cli = (...a: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'cli/main.ts', 'simulate', join(dir, 'pfr.study.json'), ...a], { encoding: 'utf8', timeout: 60000 });
    const text = cli('--heat', join(dir, 'heat.json'), '--profile');
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/energy balance \(constant-coolant\): feed 330 K/);
    expect(text.stdout).toMatch(/hottest point: 335\.54\d* K/);
    expect(text.stdout).toContain('temperature profile');
    const json = cli('--heat', join(dir, 'heat.json'), '--json');
    expect(json.status).toBe(0);
    const doc = JSON.parse(json.stdout);
    // Source: SciPy solve_ivp (Radau, rtol 1e-11), simulate_heat.py
    expect(rel(doc.runs[0].heat.hotSpot.temperature, ref.constant_coolant.hot.T)).toBeLessThan(1e-6);
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ heat: { ...heat.heat, overallCoefficient: '-5 W/(m2 K)' }, tubes: heat.tubes }));
    const bad = cli('--heat', join(dir, 'bad.json'), '--json');
    expect(bad.status).toBe(2);
    expect(bad.stdout).toMatch(/overallCoefficient/);
  }, 60000);
});
