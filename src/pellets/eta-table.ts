/**
 * A table of effectiveness factors along a bed, keyed by a progress coordinate that grows along
 * the bed (the conversion of the key species), so that a bed integration solves the pellet only
 * every `step` of progress instead of at every right-hand-side call.
 *
 * Method: piecewise-linear interpolation between stored entries no further apart than `step`
 * whose values differ by at most `relTol` (relative);
 * a query past the last entry (or before the first) by less than `step` is extrapolated linearly
 * from the two nearest entries; any other query asks for a new pellet solve at the current state,
 * which is stored. The table therefore holds eta at states the integration actually visited.
 * Once filled, `interpolate` reads it by quadratic Lagrange interpolation through the three nearest
 * entries, with an error of order step^3 |d3 eta/dx3| (interpolation error bound, e.g. K.E.
 * Atkinson, An Introduction to Numerical Analysis, 2nd ed., 1989, sec. 3.2).
 */

export class EtaTable {
  private xs: number[] = [];
  private rows: Float64Array[] = [];
  /** Size coordinate at which each entry was computed (for reports). */
  private where: number[] = [];

  /**
   * @param nR values per entry (one per reaction)
   * @param step largest progress gap bridged by interpolation (default 0.05)
   * @param relTol largest relative difference of neighbouring entries bridged (default 0.25): where
   *   eta changes steeply (a reaction whose surface rate nearly vanishes), entries get denser
   */
  constructor(readonly nR: number, readonly step = 0.05, readonly relTol = 0.25) {}

  /** True when entries i and j are close enough, in progress and in value, to interpolate between. */
  private bridgeable(i: number, j: number): boolean {
    if (Math.abs(this.xs[j] - this.xs[i]) > this.step) return false;
    const a = this.rows[i];
    const b = this.rows[j];
    for (let q = 0; q < this.nR; q++) if (Math.abs(b[q] - a[q]) > this.relTol * Math.max(Math.abs(a[q]), Math.abs(b[q]))) return false;
    return true;
  }

  get size(): number {
    return this.xs.length;
  }

  /** Index of the first entry with xs >= x. */
  private lowerBound(x: number): number {
    let lo = 0;
    let hi = this.xs.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.xs[mid] < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  /** Interpolated (or extrapolated) values at x into out; false when a new solve is needed. */
  lookup(x: number, out: Float64Array): boolean {
    const n = this.xs.length;
    if (n === 0) return false;
    const k = this.lowerBound(x);
    if (k < n && this.xs[k] === x) {
      out.set(this.rows[k]);
      return true;
    }
    let i: number;
    let j: number;
    if (k > 0 && k < n) {
      [i, j] = [k - 1, k];
      if (!this.bridgeable(i, j)) return false;
    } else {
      if (n < 2) return false;
      [i, j] = k === 0 ? [0, 1] : [n - 2, n - 1];
      const edge = k === 0 ? this.xs[0] : this.xs[n - 1];
      if (Math.abs(x - edge) > this.step || !this.bridgeable(i, j)) return false;
    }
    const w = (x - this.xs[i]) / (this.xs[j] - this.xs[i]);
    const a = this.rows[i];
    const b = this.rows[j];
    for (let q = 0; q < this.nR; q++) out[q] = a[q] + w * (b[q] - a[q]);
    return true;
  }

  /**
   * Values at x from the table as it stands, never asking for a solve: quadratic through the
   * three nearest entries (linear with two, the value itself with one), and the end value beyond
   * either end. False when empty.
   */
  interpolate(x: number, out: Float64Array): boolean {
    const n = this.xs.length;
    if (n === 0) return false;
    const k = this.lowerBound(x);
    if (k === 0 || k === n || n === 1) {
      out.set(this.rows[k === 0 ? 0 : n - 1]);
      return true;
    }
    if (n === 2) {
      const w = (x - this.xs[0]) / (this.xs[1] - this.xs[0]);
      for (let q = 0; q < this.nR; q++) out[q] = this.rows[0][q] + w * (this.rows[1][q] - this.rows[0][q]);
      return true;
    }
    // the three nodes around x: k-1, k and the nearer of k-2 and k+1
    const i0 = k + 1 >= n || (k >= 2 && x - this.xs[k - 2] < this.xs[k + 1] - x) ? k - 2 : k - 1;
    const [x0, x1, x2] = [this.xs[i0], this.xs[i0 + 1], this.xs[i0 + 2]];
    const l0 = ((x - x1) * (x - x2)) / ((x0 - x1) * (x0 - x2));
    const l1 = ((x - x0) * (x - x2)) / ((x1 - x0) * (x1 - x2));
    const l2 = ((x - x0) * (x - x1)) / ((x2 - x0) * (x2 - x1));
    const [a, b, c] = [this.rows[i0], this.rows[i0 + 1], this.rows[i0 + 2]];
    for (let q = 0; q < this.nR; q++) out[q] = l0 * a[q] + l1 * b[q] + l2 * c[q];
    return true;
  }

  /**
   * Prediction at x from the last (up to) three entries by Lagrange extrapolation (quadratic with
   * three entries, linear with two, the value itself with one): the predictor of a learning pass
   * that marches past the last entry. False when empty.
   */
  predict(x: number, out: Float64Array): boolean {
    const n = this.xs.length;
    if (n === 0) return false;
    const i0 = Math.max(0, n - 3);
    out.fill(0);
    for (let a = i0; a < n; a++) {
      let w = 1;
      for (let b = i0; b < n; b++) if (b !== a) w *= (x - this.xs[b]) / (this.xs[a] - this.xs[b]);
      for (let q = 0; q < this.nR; q++) out[q] += w * this.rows[a][q];
    }
    return true;
  }

  /** Store values at progress x (computed at size coordinate t). */
  insert(x: number, values: Float64Array, t: number): void {
    const k = this.lowerBound(x);
    if (k < this.xs.length && this.xs[k] === x) {
      this.rows[k] = Float64Array.from(values);
      return;
    }
    this.xs.splice(k, 0, x);
    this.rows.splice(k, 0, Float64Array.from(values));
    this.where.splice(k, 0, t);
  }

  /** The entries in progress order. */
  entries(): { progress: number; at: number; values: Float64Array }[] {
    return this.xs.map((x, k) => ({ progress: x, at: this.where[k], values: this.rows[k] }));
  }

  clear(): void {
    this.xs = [];
    this.rows = [];
    this.where = [];
  }
}
