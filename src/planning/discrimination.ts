/**
 * Discrimination mode: choose the runs where the rival rate-law sets' predictions differ most
 * relative to the prediction variance (Box & Hill 1967, Technometrics 9, 57-71) or differ most
 * outright (Hunter & Reiner 1965, Technometrics 7, 307-323), criteria in divergence.ts, by greedy
 * construction and exchange (exchange.ts), and report today's model probabilities (Akaike
 * weights) beside the expected posterior probabilities after the runs (posterior.ts).
 */
import type { StudyFit } from '../workflow/fit-study.js';
import type { PlanContext } from './context.js';
import { discriminationValue, type DiscriminationBlocks, type DiscriminationKind } from './divergence.js';
import { exchangeSearch, spacedApart, type ExchangeResult } from './exchange.js';
import { expectedPosteriors } from './posterior.js';
import { discriminationBlocks, setupRivals, type RivalSetup } from './rivals.js';
import type { DiscriminationSummary } from '../report/types.js';

export interface DiscriminationOptions {
  /** Runs to plan. */
  n: number;
  criterion: DiscriminationKind;
  /** Simulated outcomes per rival behind the expected posterior probabilities. */
  posteriorDraws: number;
  seed: number;
}

export interface DiscriminationPlan {
  /** Chosen candidate indices (into ctx.candidates). */
  chosen: number[];
  exchange: ExchangeResult;
  reasons: string[];
  contributions: number[];
  summary: DiscriminationSummary;
  /** No candidate separates the rivals (criterion zero everywhere). */
  indistinguishable: boolean;
  warnings: string[];
}

/** The set `chosen` without position `skip`, plus `extra`. */
function designSet(chosen: readonly number[], extra: number, skip: number): number[] {
  const set = chosen.filter((_, k) => k !== skip);
  if (extra >= 0) set.push(extra);
  return set;
}

/** Why a run: the pair of rivals and the measured column that differ most there (in sigma). */
function whyRun(rs: RivalSetup, blocks: DiscriminationBlocks, k: number, columns: readonly string[], kind: DiscriminationKind): string {
  let best = { text: '', size: -1 };
  for (const pair of blocks.pairs) {
    if (kind === 'box-hill' && !(rs.prior[pair.i] * rs.prior[pair.j] > 0)) continue;
    const a = rs.at[pair.i][k].mu;
    const b = rs.at[pair.j][k].mu;
    for (let r = 0; r < rs.q; r++) {
      const d = Math.abs(a[r] - b[r]);
      if (d > best.size) best = { text: `'${rs.names[pair.i]}' and '${rs.names[pair.j]}' predict ${columns[r] ?? `response ${r + 1}`} ${d.toPrecision(3)} measurement sigma apart`, size: d };
    }
  }
  return best.text;
}

function explainRuns(rs: RivalSetup, blocks: DiscriminationBlocks, ex: ExchangeResult, kind: DiscriminationKind, columns: readonly string[]): { reasons: string[]; contributions: number[] } {
  const full = discriminationValue(kind, blocks, ex.chosen);
  const contributions = ex.chosen.map((_, k) => full - discriminationValue(kind, blocks, designSet(ex.chosen, -1, k)));
  const label = kind === 'box-hill' ? 'Box-Hill' : 'Hunter-Reiner';
  const reasons = ex.chosen.map((k, i) => `${label}: without it the criterion would drop by ${contributions[i].toPrecision(3)}; ${whyRun(rs, blocks, k, columns, kind)}`);
  return { reasons, contributions };
}

/** Plan n runs to tell the rivals (every fit in `fits`) apart. */
export function planDiscrimination(ctx: PlanContext, fits: readonly StudyFit[], prior: readonly number[], o: DiscriminationOptions): DiscriminationPlan {
  const rs = setupRivals(ctx, fits, prior);
  const blocks = discriminationBlocks(rs);
  const points = rs.usable.map((c) => ctx.candidates.points[c]);
  const exchange = exchangeSearch({
    count: rs.usable.length,
    n: o.n,
    value: (chosen, extra, skip) => discriminationValue(o.criterion, blocks, designSet(chosen, extra, skip)),
    admissible: (chosen, c, skip) => spacedApart(points, ctx.limits.minSpacing, chosen, c, skip),
  });
  let top = 0;
  for (let k = 0; k < rs.usable.length; k++) top = Math.max(top, discriminationValue(o.criterion, blocks, [k]));
  const indistinguishable = !(top > 1e-9);
  const columns = (ctx.src.columns.measured ?? []).map((m) => m.column);
  const { reasons, contributions } = explainRuns(rs, blocks, exchange, o.criterion, columns);
  const expected = exchange.chosen.length ? expectedPosteriors(rs, exchange.chosen, o.posteriorDraws, o.seed) : rs.names.map(() => [...rs.prior]);
  const summary: DiscriminationSummary = {
    criterion: o.criterion,
    models: rs.names.map((model, i) => ({ model, now: rs.prior[i], expectedIfTrue: expected[i][i] })),
    expected,
    draws: o.posteriorDraws,
  };
  return { chosen: exchange.chosen.map((k) => rs.usable[k]), exchange, reasons, contributions, summary, indistinguishable, warnings: rs.warnings };
}
