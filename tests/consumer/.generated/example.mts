import { buildHandoff, fitStudy, loadStudy, sizeReactor, type StudyFit } from 'rateloom';

// Load the demo packed-bed study (CSV rows checked, units converted to SI).
const { study, report } = loadStudy('datasets-demo/pbr/pbr.study.json');
console.log(`${report.rowsUsed} rows used, ${report.rowsRejected} rejected`);

// Fit its rate law; numerical trouble is a status, never an exception.
const result: StudyFit = fitStudy(study);
console.log(`fit: ${result.fit.status}`);
for (const p of result.fit.parameters) {
  console.log(`  ${p.name} = ${p.value.toPrecision(4)} ${p.unit}, 95% [${p.ci.linear?.map((v) => v.toPrecision(4)).join(", ") ?? "n/a"}]`);
}

// Size the plant reactor from the fitted kinetics, uncertainty carried by Monte Carlo.
const sizing = sizeReactor(buildHandoff(study, result), 'datasets-demo/pbr/plant.case.json', { draws: 500 });
console.log(`${sizing.status}: ${sizing.size?.quantity} ${sizing.size?.value.toPrecision(4)} ${sizing.size?.unit}`);
console.log(sizing.cautions[0]);

import type { StudyFit as Probe } from 'rateloom';
// @ts-expect-error status is a string union, not a number
export const probe: Probe['fit']['status'] = 1;
