/**
 * The range of conditions a study's data covered, carried in the fitted-kinetics hand-off so that
 * sizing can warn when a production case extrapolates.
 */
import type { FittedKinetics, Range } from '../design/handoff.js';
import type { Study } from '../study/types.js';
import { measuredConversions } from '../study/summary.js';

function range(values: number[], unit: string): Range | undefined {
  let min = Infinity;
  let max = -Infinity;
  // A loop, not Math.min(...values): spreading a million runs overflows the call stack.
  for (const x of values) {
    if (!Number.isFinite(x)) continue;
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return min <= max ? { min, max, unit } : undefined;
}

export function studyCoverage(study: Study): FittedKinetics['coverage'] {
  const names = study.chemistry.speciesNames;
  const temperature = range(study.runs.map((r) => r.temperature), 'K') ?? { min: NaN, max: NaN, unit: 'K' };
  const pressure = range(study.runs.map((r) => r.pressure ?? NaN), 'Pa');
  const feedMoleFraction: Record<string, Range> = {};
  const fractions = study.runs.map((r) => {
    const a = r.feed ?? r.initialConcentrations;
    if (!a) return undefined;
    let t = 0;
    for (const x of a) t += x;
    return t > 0 ? Array.from(a, (x) => x / t) : undefined;
  });
  names.forEach((name, j) => {
    const rg = range(fractions.map((f) => (f ? f[j] : NaN)), '1');
    if (rg && rg.max > 0) feedMoleFraction[name] = rg;
  });
  const conv = [...measuredConversions(study).values()];
  const conversion = range(conv, '1');
  return {
    temperature,
    ...(pressure ? { pressure } : {}),
    ...(Object.keys(feedMoleFraction).length ? { feedMoleFraction } : {}),
    ...(conversion ? { conversion: { ...conversion, species: study.keyReactant } } : {}),
  };
}
