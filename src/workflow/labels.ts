/**
 * Labels and SI units of responses and run conditions, shared by reports and command output.
 */
import type { Observation, Study, StudyRun } from '../study/types.js';
import { spaceTime as studySpaceTime } from '../study/summary.js';

/** Label and SI unit of an observation's response, e.g. { label: 'F_A out', unit: 'mol/s' }. */
export function responseLabel(o: Pick<Observation, 'response' | 'species' | 'lab'>, study: Pick<Study, 'reactor'>): { label: string; unit: string } {
  const s = o.species ?? '';
  const batch = study.reactor.kind === 'batch' || study.reactor.kind === 'semibatch';
  switch (o.response) {
    case 'outlet-flow':
      return batch ? { label: `N_${s}`, unit: 'mol' } : { label: `F_${s} out`, unit: 'mol/s' };
    case 'outlet-concentration':
      return { label: batch ? `C_${s}` : `C_${s} out`, unit: 'mol/m3' };
    case 'conversion':
      return { label: `X_${s}`, unit: '1' };
    case 'outlet-pressure':
      return { label: 'P out', unit: 'Pa' };
    case 'rate':
      return { label: `-r_${s}`, unit: rateUnit(study) };
    case 'outlet-fraction':
      return { label: `y_${s} out${o.lab?.removed?.some(Boolean) ? ' (dry)' : ''}`, unit: '1' };
    case 'fraction-ratio':
      return { label: `y_${s}/y_std`, unit: '1' };
    case 'selectivity':
      return { label: `S_${s}`, unit: '1' };
    case 'yield':
      return { label: `Y_${s}`, unit: '1' };
    default:
      return { label: String(o.response), unit: '1' };
  }
}

function rateUnit(study: Pick<Study, 'reactor'>): string {
  return study.reactor.kind === 'packed-bed' ? 'mol/(kg s)' : 'mol/(m3 s)';
}

/** Space time of a run, labelled: W/F_A0 (kg s/mol), tau = V/v0 (s), or batch time t (s). */
export function spaceTime(run: StudyRun, study: Study): { label: string; unit: string; value: number } | null {
  const kind = study.reactor.kind;
  if (kind === 'batch' || kind === 'semibatch') return { label: 't', unit: 's', value: run.size };
  const value = studySpaceTime(study, run);
  if (value === undefined) return null;
  return kind === 'packed-bed' ? { label: `W/F_${study.keyReactant},0`, unit: 'kg s/mol', value } : { label: 'tau', unit: 's', value };
}

/**
 * Feed ratio: the second reactant of the first reaction over the key reactant (mol/mol), when
 * the first reaction has a second reactant.
 */
export function feedRatio(run: StudyRun, study: Study): { label: string; unit: string; value: number } | null {
  const nS = study.chemistry.speciesNames.length;
  const key = study.keyReactantIndex;
  const a = run.feed ?? run.initialConcentrations;
  if (!a || !(a[key] > 0)) return null;
  for (let j = 0; j < nS; j++) {
    if (j !== key && study.chemistry.reactantCoefficients[j] > 0) {
      return { label: `${study.chemistry.speciesNames[j]}/${study.keyReactant}`, unit: 'mol/mol', value: a[j] / a[key] };
    }
  }
  return null;
}
