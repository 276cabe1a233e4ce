/**
 * Symbolic differentiation of expression trees (forward rules of ordinary calculus, applied once
 * per node and memoised by node id, so a DAG is differentiated in time linear in its size;
 * see Griewank & Walther 2008, "Evaluating Derivatives", ch. 1, for the rules and the DAG view).
 *
 * Rules at the non-smooth or singular points, chosen so that derivatives of rate laws stay finite:
 *  - ppow(u, a) = max(u,0)^a:  d/du = step(u) * a * reg(u)^(a-1) with reg(u) = max(u, 1e-30)
 *    for a fractional or fitted order a (0 for u <= 0, large but finite just above 0); for a
 *    numeric a > 1 the exact a * max(u,0)^(a-1) is used, and step(u) for a = 1.
 *    d/da = max(u,0)^a * ln(u) for u > 0, and 0 for u <= 0.
 *  - pow(u, v): v u^(v-1) u' + u^v lnpos(u) v', lnpos(u) = step(u) ln(reg(u)) (0 for u <= 0).
 *  - abs: sign(u) u'; min/max: the derivative of the selected argument (ties pick the second).
 *  - step and sign: 0; reg(u): step(u - 1e-30) u'.
 */
import { NodeStore, TINY, type Node } from './ast.js';

/** d root / d variable v, built in the same store (so results share nodes with the input). */
export function differentiate(store: NodeStore, root: Node, v: number, memo = new Map<number, Node>()): Node {
  const s = store;
  const zero = s.num(0);
  const one = s.num(1);
  const lnpos = (u: Node): Node => s.mul(s.call('step', [u]), s.call('ln', [s.call('reg', [u])]));

  const d = (n: Node): Node => {
    const hit = memo.get(n.id);
    if (hit) return hit;
    let r: Node;
    switch (n.kind) {
      case 'num':
        r = zero;
        break;
      case 'var':
        r = n.v === v ? one : zero;
        break;
      case 'neg':
        r = s.neg(d(n.a));
        break;
      case 'add':
        r = s.add(d(n.a), d(n.b));
        break;
      case 'sub':
        r = s.sub(d(n.a), d(n.b));
        break;
      case 'mul':
        r = s.add(s.mul(d(n.a), n.b), s.mul(n.a, d(n.b)));
        break;
      case 'div': {
        // (a' - (a/b) b') / b
        const db = d(n.b);
        r = s.div(s.sub(d(n.a), s.mul(n, db)), n.b);
        break;
      }
      case 'pow': {
        const du = d(n.a);
        const dv = d(n.b);
        const t1 = s.mul(s.mul(n.b, s.pow(n.a, s.sub(n.b, one))), du);
        const t2 = dv.kind === 'num' && dv.value === 0 ? zero : s.mul(s.mul(n, lnpos(n.a)), dv);
        r = s.add(t1, t2);
        break;
      }
      case 'ppow': {
        const du = d(n.a);
        const dv = d(n.b);
        let t1 = zero;
        if (!(du.kind === 'num' && du.value === 0)) {
          const a = n.b;
          const dBase =
            a.kind === 'num' && a.value === 1
              ? s.call('step', [n.a])
              : a.kind === 'num' && a.value > 1
                ? s.mul(a, s.ppow(n.a, s.num(a.value - 1)))
                : s.mul(s.mul(s.call('step', [n.a]), a), s.pow(s.call('reg', [n.a]), s.sub(a, one)));
          t1 = s.mul(dBase, du);
        }
        const t2 = dv.kind === 'num' && dv.value === 0 ? zero : s.mul(s.mul(n, lnpos(n.a)), dv);
        r = s.add(t1, t2);
        break;
      }
      case 'call': {
        const [u, w] = n.args;
        const du = d(u);
        switch (n.fn) {
          case 'exp':
            r = s.mul(n, du);
            break;
          case 'ln':
            r = s.div(du, u);
            break;
          case 'log10':
            r = s.div(du, s.mul(u, s.num(Math.LN10)));
            break;
          case 'abs':
            r = s.mul(s.call('sign', [u]), du);
            break;
          case 'min':
          case 'max': {
            const sel = n.fn === 'min' ? s.call('step', [s.sub(w, u)]) : s.call('step', [s.sub(u, w)]);
            r = s.add(s.mul(sel, du), s.mul(s.sub(one, sel), d(w)));
            break;
          }
          case 'step':
          case 'sign':
            r = zero;
            break;
          case 'reg':
            r = s.mul(s.call('step', [s.sub(u, s.num(TINY))]), du);
            break;
        }
        break;
      }
    }
    memo.set(n.id, r);
    return r;
  };
  return d(root);
}
