/**
 * Dense symmetric positive-definite algebra for the few-parameter systems of the fit (k ≤ ~10).
 * Matrices are row-major Float64Arrays of k·k; written by hand because at this size the
 * allocation of a general matrix library costs more than the arithmetic.
 */

/**
 * Cholesky factorisation A = L·Lᵀ in place (lower triangle holds L; the upper triangle is left
 * as it was). Returns false when A is not numerically positive definite.
 */
export function choleskyInPlace(a: Float64Array, k: number): boolean {
  for (let j = 0; j < k; j++) {
    let d = a[j * k + j] as number;
    for (let s = 0; s < j; s++) d -= (a[j * k + s] as number) ** 2;
    if (!(d > 0) || !Number.isFinite(d)) return false;
    const root = Math.sqrt(d);
    a[j * k + j] = root;
    for (let i = j + 1; i < k; i++) {
      let v = a[i * k + j] as number;
      for (let s = 0; s < j; s++) v -= (a[i * k + s] as number) * (a[j * k + s] as number);
      a[i * k + j] = v / root;
    }
  }
  return true;
}

/** Solves L·Lᵀ·x = b with the factor from {@link choleskyInPlace}; b is overwritten with x. */
export function choleskySolveInPlace(l: Float64Array, k: number, b: Float64Array): void {
  for (let i = 0; i < k; i++) {
    let v = b[i] as number;
    for (let s = 0; s < i; s++) v -= (l[i * k + s] as number) * (b[s] as number);
    b[i] = v / (l[i * k + i] as number);
  }
  for (let i = k - 1; i >= 0; i--) {
    let v = b[i] as number;
    for (let s = i + 1; s < k; s++) v -= (l[s * k + i] as number) * (b[s] as number);
    b[i] = v / (l[i * k + i] as number);
  }
}

/**
 * Inverse of a symmetric positive-definite matrix, or undefined when it is singular.
 * Uses Jacobi (diagonal) scaling first so that parameters of very different magnitude
 * (η0 ~ 1e4 Pa·s next to n ~ 0.3) do not make a well-posed problem look singular.
 */
export function inverseSpd(a: Float64Array, k: number): Float64Array | undefined {
  const buffer = new Float64Array(2 * k * k + 2 * k); // one store for the work arrays and the result
  const scale = buffer.subarray(0, k);
  const column = buffer.subarray(k, 2 * k);
  const l = buffer.subarray(2 * k, 2 * k + k * k);
  const inv = buffer.subarray(2 * k + k * k);
  for (let i = 0; i < k; i++) {
    const d = a[i * k + i] as number;
    if (!(d > 0)) return undefined;
    scale[i] = 1 / Math.sqrt(d);
  }
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) l[i * k + j] = (a[i * k + j] as number) * (scale[i] as number) * (scale[j] as number);
  if (!choleskyInPlace(l, k)) return undefined;
  for (let j = 0; j < k; j++) {
    column.fill(0);
    column[j] = 1;
    choleskySolveInPlace(l, k, column);
    for (let i = 0; i < k; i++) inv[i * k + j] = (column[i] as number) * (scale[i] as number) * (scale[j] as number);
  }
  return inv;
}

/**
 * Aᵀ·A (k×k) and Aᵀ·r (k) of a row-major m×k matrix A. Each entry is one dot product summed in
 * row order, kept in a local accumulator rather than read and written back per row; the products
 * of column a with columns b and b + 1 share one pass (each load of A_ia serves two sums).
 */
export function normalEquations(jac: Float64Array, r: Float64Array, m: number, k: number, ata: Float64Array, atr: Float64Array): void {
  const size = m * k;
  for (let a = 0; a < k; a++) {
    let sr = 0;
    for (let ia = a, i = 0; ia < size; ia += k, i++) sr += (jac[ia] as number) * (r[i] as number);
    atr[a] = sr;
    let b = 0;
    for (; b < a; b += 2) {
      // columns b and b + 1 (b + 1 ≤ a)
      let s0 = 0;
      let s1 = 0;
      for (let ia = a, ib = b; ia < size; ia += k, ib += k) {
        const value = jac[ia] as number;
        s0 += value * (jac[ib] as number);
        s1 += value * (jac[ib + 1] as number);
      }
      ata[a * k + b] = s0;
      ata[b * k + a] = s0;
      ata[a * k + b + 1] = s1;
      ata[(b + 1) * k + a] = s1;
    }
    if (b === a) {
      let s = 0;
      for (let ia = a; ia < size; ia += k) s += (jac[ia] as number) * (jac[ia] as number);
      ata[a * k + a] = s;
    }
  }
}
