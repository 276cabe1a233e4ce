/**
 * Thin singular value decomposition A = U diag(s) V' of a small dense matrix by one-sided Jacobi
 * rotations (Hestenes 1958; see Demmel & Veselic 1992, "Jacobi's method is more accurate than QR",
 * SIAM J. Matrix Anal. Appl. 13(4), 1204-1245). One-sided Jacobi computes small singular values to
 * high relative accuracy, which is what least-squares covariance and condition numbers need.
 *
 * Also: pseudo-inverse solves and the symmetric inverse (A'A)^+ built from the SVD, so callers never
 * form A'A explicitly (forming it squares the condition number).
 *
 * Matrices are row-major Float64Arrays. Pure functions, no I/O.
 */

export interface Svd {
  /** Rows of the input. */
  m: number;
  /** Columns of the input. */
  n: number;
  /** Left singular vectors, max(m, n) x n row-major (columns with s = 0 are zero). */
  U: Float64Array;
  /** Singular values, descending, length n. */
  s: Float64Array;
  /** Right singular vectors, n x n row-major (column k is v_k). */
  V: Float64Array;
  /** Number of sweeps used. */
  sweeps: number;
}

/**
 * SVD of the m x n row-major matrix A. When m < n the matrix is padded with zero rows.
 * @param maxSweeps maximum Jacobi sweeps; default 60 (convergence is quadratic, usually < 10).
 */
export function svd(A: Float64Array, m: number, n: number, maxSweeps = 60): Svd {
  const rows = Math.max(m, n);
  // Column-major working copy of A (columns are rotated).
  const W = new Float64Array(rows * n);
  for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) W[j * rows + i] = A[i * n + j];
  const Vc = new Float64Array(n * n);
  for (let j = 0; j < n; j++) Vc[j * n + j] = 1;
  const eps = 2.220446049250313e-16;
  let sweeps = 0;
  for (; sweeps < maxSweeps; sweeps++) {
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        const op = p * rows;
        const oq = q * rows;
        for (let i = 0; i < rows; i++) {
          const a = W[op + i];
          const b = W[oq + i];
          alpha += a * a;
          beta += b * b;
          gamma += a * b;
        }
        if (gamma === 0 || Math.abs(gamma) <= eps * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < rows; i++) {
          const a = W[op + i];
          const b = W[oq + i];
          W[op + i] = c * a - s * b;
          W[oq + i] = s * a + c * b;
        }
        const vp = p * n;
        const vq = q * n;
        for (let i = 0; i < n; i++) {
          const a = Vc[vp + i];
          const b = Vc[vq + i];
          Vc[vp + i] = c * a - s * b;
          Vc[vq + i] = s * a + c * b;
        }
      }
    }
    if (!rotated) break;
  }
  const norms = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let ss = 0;
    for (let i = 0; i < rows; i++) ss += W[j * rows + i] ** 2;
    norms[j] = Math.sqrt(ss);
  }
  const order = Array.from({ length: n }, (_, j) => j).sort((a, b) => norms[b] - norms[a]);
  const U = new Float64Array(rows * n);
  const V = new Float64Array(n * n);
  const s = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const j = order[k];
    s[k] = norms[j];
    if (norms[j] > 0) for (let i = 0; i < rows; i++) U[i * n + k] = W[j * rows + i] / norms[j];
    for (let i = 0; i < n; i++) V[i * n + k] = Vc[j * n + i];
  }
  return { m, n, U, s, V, sweeps };
}

/** Numerical rank: singular values above rtol * s_max (rtol default max(m, n) * eps). */
export function svdRank(d: Svd, rtol?: number): number {
  const tol = (rtol ?? Math.max(d.m, d.n) * 2.220446049250313e-16) * (d.s[0] ?? 0);
  let r = 0;
  for (let k = 0; k < d.n; k++) if (d.s[k] > tol && d.s[k] > 0) r++;
  return r;
}

/** Condition number s_max / s_min (Infinity when s_min = 0). */
export function conditionNumber(d: Svd): number {
  if (d.n === 0) return 1;
  const smin = d.s[d.n - 1];
  return smin > 0 ? d.s[0] / smin : Infinity;
}

/**
 * (A'A)^+ = V diag(1/s^2) V' over the first `rank` singular values, n x n row-major.
 * With full rank this is the inverse of A'A without ever forming A'A.
 */
export function normalInverse(d: Svd, rank = svdRank(d)): Float64Array {
  const n = d.n;
  const out = new Float64Array(n * n);
  for (let k = 0; k < rank; k++) {
    const w = 1 / (d.s[k] * d.s[k]);
    for (let i = 0; i < n; i++) {
      const vik = d.V[i * n + k] * w;
      if (vik === 0) continue;
      for (let j = 0; j < n; j++) out[i * n + j] += vik * d.V[j * n + k];
    }
  }
  return out;
}

/** Leverages h_ii = sum_k U_ik^2 over the first `rank` singular vectors (length m). */
export function leverages(d: Svd, rank = svdRank(d)): Float64Array {
  const h = new Float64Array(d.m);
  for (let i = 0; i < d.m; i++) {
    let sum = 0;
    for (let k = 0; k < rank; k++) sum += d.U[i * d.n + k] ** 2;
    h[i] = sum;
  }
  return h;
}
