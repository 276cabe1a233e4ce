/**
 * Correlated measurement errors inside small blocks of observations (generalised least squares by
 * prewhitening; Seber & Wild 1989, Nonlinear Regression, section 2.1.4; Bates & Watts 1988,
 * section 1.3.2, common practice).
 *
 * The scaled residuals e_i = (y_i - f_i) / sigma_i of a block have correlation matrix R = L L'
 * (Cholesky). Replacing e by L^-1 e (and each Jacobian column likewise) turns the objective into
 * e' R^-1 e, the generalised least-squares sum whose minimum and covariance (J'R^-1 J)^-1 are
 * right for correlated errors; with R = I nothing changes. `whitenBlock` builds a block from R,
 * `applyWhitening` transforms a vector or a Jacobian in place without allocating, and
 * `unwhiten` maps whitened residuals back (e = L w), which the finite-difference Jacobian needs.
 */

/** One block of correlated observations. */
export interface WhitenBlock {
  /** Observation indices of the block (ascending, distinct). */
  index: number[];
  /** L^-1, k x k row-major, lower triangular. */
  inverse: Float64Array;
  /** L (R = L L'), k x k row-major, lower triangular. */
  factor: Float64Array;
}

/**
 * Block from the correlation matrix R (k x k row-major) of the observations `index`; undefined
 * when R is not positive definite (a pivot below `tol` times its diagonal: two responses carry the
 * same measurement).
 */
export function whitenBlock(index: number[], R: Float64Array, tol = 1e-10): WhitenBlock | undefined {
  const k = index.length;
  const L = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = R[i * k + j];
      for (let q = 0; q < j; q++) s -= L[i * k + q] * L[j * k + q];
      if (i === j) {
        if (!(s > tol * R[i * k + i])) return undefined;
        L[i * k + i] = Math.sqrt(s);
      } else L[i * k + j] = s / L[j * k + j];
    }
  }
  // Inverse of a lower-triangular matrix by forward substitution, column by column.
  const inv = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let i = c; i < k; i++) {
      let s = i === c ? 1 : 0;
      for (let q = c; q < i; q++) s -= L[i * k + q] * inv[q * k + c];
      inv[i * k + c] = s / L[i * k + i];
    }
  }
  return { index, inverse: inv, factor: L };
}

/**
 * v <- M v on each block, for v with `stride` columns (1: a vector; n: a row-major m x n
 * Jacobian, every column transformed). M = L^-1 (whiten) or L (unwhiten); lower triangular, so the
 * rows are processed last to first and the update is in place.
 */
function applyLower(blocks: readonly WhitenBlock[], v: Float64Array, stride: number, which: 'inverse' | 'factor'): void {
  for (const b of blocks) {
    const M = b[which];
    const k = b.index.length;
    for (let c = 0; c < stride; c++) {
      for (let i = k - 1; i >= 0; i--) {
        let s = 0;
        for (let q = 0; q <= i; q++) s += M[i * k + q] * v[b.index[q] * stride + c];
        v[b.index[i] * stride + c] = s;
      }
    }
  }
}

/** Whiten scaled residuals (stride 1) or a residual Jacobian (stride n) in place. */
export function applyWhitening(blocks: readonly WhitenBlock[], v: Float64Array, stride = 1): void {
  applyLower(blocks, v, stride, 'inverse');
}

/** Undo the whitening of a residual vector in place (e = L w). */
export function unwhiten(blocks: readonly WhitenBlock[], v: Float64Array): void {
  applyLower(blocks, v, 1, 'factor');
}
