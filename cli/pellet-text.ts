/**
 * Plain-text lines of the plant pellet part of a sizing (size command).
 */
import { type PelletSizing } from '../src/index.js';
import { g } from './format.js';

export function formatPelletSizing(p: PelletSizing, size: number | undefined): string[] {
  const L: string[] = [];
  const eta = Object.entries(p.profile.eta).map(([id, e]) => `${id} ${g(e[0], 3)} -> ${g(e[e.length - 1], 3)}`).join(', ');
  L.push(`Plant pellet: ${p.shape}, ${g(p.diameter * 1000, 4)} mm (${p.method === 'numerical' ? 'pellet solved numerically' : "Bischoff's generalized modulus"}, ${p.pelletSolves} pellet solves)`);
  L.push(`  effectiveness factor inlet -> outlet: ${eta}`);
  if (p.intrinsicSize !== null && size !== undefined) L.push(`  catalyst mass ${g(size, 5)} kg with the pellet, ${g(p.intrinsicSize, 5)} kg with intrinsic kinetics (x${g(size / p.intrinsicSize, 3)})`);
  if (p.film) L.push(`  film at the inlet (Re ${g(p.film.reynolds, 3)}): overall ${Object.entries(p.film.overall).map(([id, v]) => `${id} ${g(v, 3)}`).join(', ')} vs internal ${Object.entries(p.film.internal).map(([id, v]) => `${id} ${g(v, 3)}`).join(', ')}`);
  L.push('  trade-off: diameter mm, catalyst kg, pressure drop bar, eta at inlet');
  for (const r of p.tradeOff.rows) {
    L.push(`    ${g(r.diameter * 1000, 3).padStart(6)}  ${(r.catalystMass === null ? r.status : g(r.catalystMass, 5)).padStart(12)}  ${(r.pressureDrop === null ? 'n/a' : g(r.pressureDrop / 1e5, 4)).padStart(8)}  ${g(r.etaInlet, 3)}`);
  }
  return L;
}
