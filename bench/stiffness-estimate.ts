/**
 * Measures the Dormand-Prince stiffness estimate h*|lambda| (Hairer & Wanner, Solving ODEs II,
 * sec. IV.2) on three stiff problems, and how many steps the automatic switch takes at the
 * threshold in use (AUTO_STIFFNESS_THRESHOLD) and at Hairer's 3.25. The numbers are quoted in
 * src/numerics/ode-workspace.ts. Usage: npx tsx bench/stiffness-estimate.ts
 */
import { Dopri5 } from '../src/numerics/dopri5';
import { newCounters, type StepperSettings } from '../src/numerics/ode-common';
import { AUTO_STIFFNESS_THRESHOLD } from '../src/numerics/ode-workspace';

type F = (t: number, y: Float64Array, out: Float64Array) => void;

const PROBLEMS: { name: string; f: F; y0: number[]; t1: number }[] = [
  { name: 'linear, lambda = -1e4', f: (t, y, o) => void (o[0] = -1e4 * (y[0] - Math.cos(t))), y0: [0], t1: 2 },
  {
    name: 'Robertson',
    f: (_t, y, o) => {
      o[0] = -0.04 * y[0] + 1e4 * y[1] * y[2];
      o[1] = 0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] * y[1];
      o[2] = 3e7 * y[1] * y[1];
    },
    y0: [1, 0, 0],
    t1: 40,
  },
  {
    name: 'van der Pol, mu = 1000',
    f: (_t, y, o) => {
      o[0] = y[1];
      o[1] = 1000 * (1 - y[0] * y[0]) * y[1] - y[0];
    },
    y0: [2, 0],
    t1: 3,
  },
];

function stepper(p: (typeof PROBLEMS)[number], threshold: number): Dopri5 {
  const n = p.y0.length;
  const settings: StepperSettings = { f: p.f, n, rtol: 1e-6, atol: new Float64Array(n).fill(1e-9), hmax: Infinity, maxSteps: 1e6, maxEvaluations: 1e7, counters: newCounters() };
  const dp = new Dopri5(settings, { stiffnessThreshold: threshold });
  dp.start(0, Float64Array.from(p.y0), p.t1);
  return dp;
}

for (const p of PROBLEMS) {
  const dp = stepper(p, Infinity);
  const seen: number[] = [];
  while (dp.t < p.t1 && seen.length < 200000 && dp.step(p.t1) === 'ok') seen.push(dp.hLambda);
  const tail = seen.slice(seen.length >> 1).sort((a, b) => a - b);
  const q = (f: number) => tail[Math.floor(f * (tail.length - 1))].toFixed(3);
  const switchAt = (threshold: number) => {
    const s = stepper(p, threshold);
    let steps = 0;
    while (s.t < p.t1 && !s.stiff && s.step(p.t1) === 'ok') steps++;
    return s.stiff ? `${steps} steps` : 'never';
  };
  process.stdout.write(
    `${p.name}: h|lambda| over the second half of ${seen.length} steps: median ${q(0.5)} (P10 ${q(0.1)}, P90 ${q(0.9)}); ` +
      `switch at ${AUTO_STIFFNESS_THRESHOLD}: ${switchAt(AUTO_STIFFNESS_THRESHOLD)}, at 3.25: ${switchAt(3.25)}\n`,
  );
}
