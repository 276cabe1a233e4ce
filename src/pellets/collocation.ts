/**
 * Collocation machinery for the pellet problem: nodes, barycentric differentiation matrices and
 * Gauss-Legendre quadrature.
 *
 * Method: orthogonal collocation in the symmetric variable u = x^2 (J. Villadsen, W.E. Stewart,
 * "Solution of boundary-value problems by orthogonal collocation", Chem. Eng. Sci. 22 (1967)
 * 1483-1501), on the Chebyshev-Gauss-Lobatto points of [0, 1] in u, which cluster at the pellet
 * surface where steep profiles live. Differentiation matrices from the barycentric weights
 * (J.-P. Berrut, L.N. Trefethen, "Barycentric Lagrange interpolation", SIAM Rev. 46 (2004)
 * 501-517, eqs. 9.4-9.5 and the negative-sum trick for the diagonal). Gauss-Legendre nodes and
 * weights by Newton's method on the three-term recurrence (Abramowitz & Stegun 25.4.29).
 */

/** A collocation grid of N+1 points in u, with operators. */
export interface CollocationGrid {
  /** Number of intervals N; points u_0 = 0 (centre) ... u_N = 1 (surface). */
  readonly N: number;
  readonly u: Float64Array;
  /** Barycentric weights of the points. */
  readonly w: Float64Array;
  /**
   * Laplacian of shape exponent a in u: (1/x^(a-1)) d/dx (x^(a-1) d/dx) = 4u d2/du2 + 2a d/du,
   * (N+1) x (N+1) row-major.
   */
  readonly L: Float64Array;
}

/** Chebyshev-Gauss-Lobatto points of [0, 1] and their barycentric weights. */
function chebyshevPoints(N: number): { u: Float64Array; w: Float64Array } {
  const u = new Float64Array(N + 1);
  const w = new Float64Array(N + 1);
  for (let k = 0; k <= N; k++) {
    u[k] = (1 - Math.cos((Math.PI * k) / N)) / 2;
    w[k] = (k % 2 === 0 ? 1 : -1) * (k === 0 || k === N ? 0.5 : 1);
  }
  return { u, w };
}

/** First-derivative matrix on points u with barycentric weights w. */
function differentiationMatrix(u: Float64Array, w: Float64Array): Float64Array {
  const n = u.length;
  const D = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    let diag = 0;
    for (let j = 0; j < n; j++) {
      if (j === i) continue;
      const v = w[j] / w[i] / (u[i] - u[j]);
      D[i * n + j] = v;
      diag -= v;
    }
    D[i * n + i] = diag;
  }
  return D;
}

/** The grid with N intervals and the Laplacian of shape exponent a. */
export function collocationGrid(N: number, a: number): CollocationGrid {
  const { u, w } = chebyshevPoints(N);
  const n = N + 1;
  const D = differentiationMatrix(u, w);
  const L = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let d2 = 0;
      for (let k = 0; k < n; k++) d2 += D[i * n + k] * D[k * n + j];
      L[i * n + j] = 4 * u[i] * d2 + 2 * a * D[i * n + j];
    }
  }
  return { N, u, w, L };
}

/**
 * Barycentric interpolation weights of the grid at point t (length N+1, summing to 1), written to
 * `out`; exact at the nodes.
 */
export function interpolationRow(grid: CollocationGrid, t: number, out: Float64Array): void {
  const { u, w } = grid;
  const n = u.length;
  for (let k = 0; k < n; k++) {
    if (t === u[k]) {
      out.fill(0);
      out[k] = 1;
      return;
    }
  }
  let s = 0;
  for (let k = 0; k < n; k++) {
    out[k] = w[k] / (t - u[k]);
    s += out[k];
  }
  for (let k = 0; k < n; k++) out[k] /= s;
}

/** Gauss-Legendre nodes and weights on [0, 1] with m points. */
export function gaussLegendre01(m: number): { x: Float64Array; w: Float64Array } {
  const x = new Float64Array(m);
  const w = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (m + 0.5));
    let dp = 1;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = z;
      for (let k = 2; k <= m; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      const pm = m === 1 ? z : p1;
      const pPrev = m === 1 ? 1 : p0;
      dp = (m * (z * pm - pPrev)) / (z * z - 1);
      const dz = pm / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-16) break;
    }
    x[i] = (1 - z) / 2;
    w[i] = 1 / ((1 - z * z) * dp * dp);
  }
  return { x, w };
}
