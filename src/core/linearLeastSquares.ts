/**
 * Linear least squares min ‖A·c − y‖₂ for the small, tall systems of the corrections (polynomials
 * of degree ≤ 3 over a few dozen points), by Householder QR: A = Q·R, then R·c = Qᵀ·y
 * (Golub & Van Loan, Matrix Computations, 4th ed. 2013, ch. 5, from memory).
 *
 * Written here rather than taken from a matrix library: at this size the arithmetic is a few
 * hundred operations, and ml-matrix (what ml-regression-polynomial solves with) was about 70 KB
 * of the 150 KB budget of the worksheet-function bundle (measured with `npm run bench`).
 */

/** Relative size below which a column counts as a combination of the columns before it. */
export const RANK_TOLERANCE = 1e-10;

/**
 * Least-squares coefficients c (length k) of A·c ≈ y.
 *
 * Each column is first scaled to unit length (the powers of x differ by orders of magnitude);
 * a column whose part outside the span of the earlier columns is below {@link RANK_TOLERANCE}
 * of its length (e.g. x² when x takes only two distinct values) is left out and gets
 * coefficient 0 — a least-squares solution, not the minimum-norm one.
 *
 * @param columns the k columns of A, each of length m (not modified)
 * @param y the m observations
 * @returns c with Σ_j c_j·columns[j] the least-squares fit to y
 * @example leastSquares([[1, 1, 1], [0, 1, 2]], [1, 3, 5]) // [1, 2] (y = 1 + 2x)
 */
export function leastSquares(columns: readonly (readonly number[])[], y: readonly number[]): number[] {
  const m = y.length;
  const k = columns.length;
  const a = columns.map((col) => {
    let norm = 0;
    for (let i = 0; i < m; i++) norm += (col[i] as number) ** 2;
    norm = Math.sqrt(norm);
    return { values: Float64Array.from(col, (v) => (norm > 0 ? v / norm : 0)), norm };
  });
  const b = Float64Array.from(y);
  const pivotColumns: number[] = [];
  let r = 0; // next row of R
  for (let j = 0; j < k && r < m; j++) {
    const v = (a[j] as { values: Float64Array }).values;
    let norm = 0;
    for (let i = r; i < m; i++) norm += (v[i] as number) ** 2;
    norm = Math.sqrt(norm);
    if (!(norm > RANK_TOLERANCE)) continue; // dependent on the earlier columns: coefficient 0
    // Householder vector h = x − α·e_r with α = −sign(x_r)·‖x‖ (no cancellation); reflect A and b.
    const alpha = (v[r] as number) > 0 ? -norm : norm;
    const h = new Float64Array(m);
    for (let i = r; i < m; i++) h[i] = v[i] as number;
    h[r] = (h[r] as number) - alpha;
    let hh = 0;
    for (let i = r; i < m; i++) hh += (h[i] as number) ** 2;
    const reflect = (target: Float64Array) => {
      let dot = 0;
      for (let i = r; i < m; i++) dot += (h[i] as number) * (target[i] as number);
      const f = (2 * dot) / hh;
      for (let i = r; i < m; i++) target[i] = (target[i] as number) - f * (h[i] as number);
    };
    for (let jj = j; jj < k; jj++) reflect((a[jj] as { values: Float64Array }).values);
    reflect(b);
    pivotColumns.push(j);
    r++;
  }
  // Back substitution on the rows 0..r−1 of R (pivot p sits at row p, column pivotColumns[p]).
  const scaled = new Array<number>(k).fill(0);
  for (let p = pivotColumns.length - 1; p >= 0; p--) {
    const j = pivotColumns[p] as number;
    let s = b[p] as number;
    for (let q = p + 1; q < pivotColumns.length; q++) {
      const jq = pivotColumns[q] as number;
      s -= ((a[jq] as { values: Float64Array }).values[p] as number) * (scaled[jq] as number);
    }
    scaled[j] = s / ((a[j] as { values: Float64Array }).values[p] as number);
  }
  return scaled.map((c, j) => {
    const norm = (a[j] as { norm: number }).norm;
    return norm > 0 ? c / norm : 0;
  });
}
