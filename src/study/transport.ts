/**
 * The study's `transport` block: the lab pellet (src/pellets/load.ts), the lab tube diameter and
 * the reaction enthalpies, read into SI for the transport diagnostics of the runs.
 */
import { RateloomError } from '../core/errors.js';
import { loadPellet, pelletQuantity } from '../pellets/load.js';
import type { StudyTransport } from './types.js';

export function loadTransport(raw: unknown, species: readonly string[], reactionIds: readonly string[]): StudyTransport {
  const path = ['transport'];
  const o = raw as Record<string, unknown>;
  let tubeDiameter: number | undefined;
  if (o.tubeDiameter !== undefined) {
    tubeDiameter = pelletQuantity(o.tubeDiameter, 'length', [...path, 'tubeDiameter']);
    if (!(tubeDiameter > 0)) throw new RateloomError('E_VALUE', 'the tube diameter must be positive', { path: [...path, 'tubeDiameter'] });
  }
  const { pellet, fluid } = loadPellet(o.pellet, species, [...path, 'pellet'], tubeDiameter);
  const reactionEnthalpy: Record<string, number> = {};
  for (const [id, q] of Object.entries((o.reactionEnthalpy ?? {}) as Record<string, unknown>)) {
    if (!reactionIds.includes(id)) {
      throw new RateloomError('E_VALUE', `reaction '${id}' is not in the study`, { path: [...path, 'reactionEnthalpy', id], fix: `Use one of: ${reactionIds.join(', ')}.` });
    }
    reactionEnthalpy[id] = pelletQuantity(q, 'molar-energy', [...path, 'reactionEnthalpy', id]);
  }
  return { pellet, fluid, ...(tubeDiameter !== undefined ? { tubeDiameter } : {}), reactionEnthalpy };
}
