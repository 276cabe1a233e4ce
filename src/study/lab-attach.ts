/**
 * Joins the `labData` and `activity` sections to a loaded study: reads the lab file, appends its
 * observations (numbered after the others), gives runs their time on stream, and adds the
 * activity model's parameters (src/study/activity-params.ts).
 */
import { isAbsolute, resolve } from 'node:path';
import { RateloomError, isRateloomError } from '../core/errors.js';
import { type CsvTable, readCsv } from '../data/csv.js';
import type { AnySourceSpec } from '../data/spec.js';
import { runFileId } from '../data/run-file.js';
import { activityParameters } from './activity-params.js';
import { resolveLabConfig } from './lab-config.js';
import { loadLabRows } from './lab-load.js';
import type { ActivitySpec, LabDataSpec } from './lab-types.js';
import { DEFAULT_ERROR_MODEL, type Observation, type Study } from './types.js';

export interface LabIo {
  /** Folder of the study file (lab file paths are relative to it). */
  baseDir: string;
  readFile: (absPath: string) => string;
  /** Every run id the per-run sources define, rejected runs included (a lab row naming another id is an error). */
  definedRunIds?: ReadonlySet<string>;
}

function readLabTable(spec: LabDataSpec, io: LabIo) {
  const abs = isAbsolute(spec.file) ? spec.file : resolve(io.baseDir, spec.file);
  let text: string;
  try {
    text = io.readFile(abs);
  } catch (e) {
    if (isRateloomError(e)) throw e;
    throw new RateloomError('E_FILE', `lab data file '${spec.file}' cannot be read (${(e as Error).message})`, { path: ['labData', 'file'], location: { file: abs } });
  }
  return readCsv(text, spec.file);
}

/** Every run id written in the run column of the per-run sources, rows rejected later included. */
export function perRunIds(tables: readonly CsvTable[], specs: readonly AnySourceSpec[]): Set<string> {
  const ids = new Set<string>();
  specs.forEach((s, i) => {
    if (s.layout === 'run-file') ids.add(runFileId(s));
    if (s.layout !== 'per-run' && s.layout !== 'stacked') return;
    const col = tables[i].header.indexOf(s.columns.run);
    if (col >= 0) for (const row of tables[i].rows) ids.add((row.cells[col] ?? '').trim());
  });
  return ids;
}

/** The study with its lab data and activity model joined; the study itself is not changed. */
export function attachLabData(study: Study, labSpec: LabDataSpec | undefined, activitySpec: ActivitySpec | undefined, io: LabIo): Study {
  if (!labSpec && !activitySpec) return study;
  let out: Study = study;
  if (labSpec) {
    const kind = study.reactor.kind;
    if (kind === 'batch' || kind === 'semibatch') throw new RateloomError('E_VALUE', `labData reads outlet fractions of a flow reactor, not of a ${kind} reactor`, { path: ['labData'] });
    const cfg = resolveLabConfig(labSpec, study.chemistry, study.keyReactantIndex, study.errorModels, DEFAULT_ERROR_MODEL);
    const runIndex = new Map(study.runs.map((r, i) => [r.id, i]));
    const loaded = loadLabRows(readLabTable(labSpec, io), cfg, study.runs, runIndex, study.chemistry, io.definedRunIds);
    const n0 = study.observations.length;
    const observations: Observation[] = [...study.observations, ...loaded.observations.map((o, k) => ({ ...o, index: n0 + k }) as Observation)];
    const runs = study.runs.map((r, i) => (loaded.times.has(i) ? { ...r, timeOnStream: loaded.times.get(i) as number } : r));
    out = { ...study, runs, observations, lab: loaded.lab };
  }
  return activitySpec ? activityParameters(out, activitySpec) : out;
}
