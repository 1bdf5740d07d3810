/**
 * Numeric comparison with an explicit tolerance that prints both values on failure.
 * Passes when |actual − expected| ≤ abs + rel·|expected|.
 */
export function expectClose(
  actual: number,
  expected: number,
  tol: { rel?: number; abs?: number } = { rel: 1e-9 },
  label = "",
): void {
  const rel = tol.rel ?? 0;
  const abs = tol.abs ?? 0;
  const allowed = abs + rel * Math.abs(expected);
  const diff = Math.abs(actual - expected);
  if (!(Number.isFinite(actual) && diff <= allowed)) {
    throw new Error(
      `${label ? label + ": " : ""}expected ${expected} ± ${allowed.toExponential(3)} (rel ${rel}, abs ${abs}), ` +
        `got ${actual} (off by ${diff.toExponential(3)}, relative ${(diff / Math.abs(expected)).toExponential(3)})`,
    );
  }
}
