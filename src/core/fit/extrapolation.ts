/**
 * A fitted curve is a description of the data only over the rates it was fitted to
 * (FitResult.shearRateRange; the reduced rates of a fit across temperatures): evaluated outside
 * them it is an extrapolation, of the model's shape rather than of the material. Surfaces that
 * evaluate a fit at other rates (a planner using the last fit, a chart drawn past the data) call
 * this to flag it.
 */
import { warning, type Warning } from "../errors";

/** The rates of `rates` outside `range` (1/s), and an EXTRAPOLATED warning naming them; null warning when none. */
export function extrapolationCheck(range: readonly [number, number], rates: readonly number[], what = "the fitted curve"): { outside: boolean[]; warning: Warning | null } {
  const [lo, hi] = range;
  const tolerance = 1e-9;
  const outside = rates.map((g) => g < lo * (1 - tolerance) || g > hi * (1 + tolerance));
  const count = outside.filter((x) => x).length;
  if (count === 0) return { outside, warning: null };
  const fmt = (v: number) => Number(v.toPrecision(3)).toString();
  const beyond = rates.filter((_, i) => outside[i]);
  return {
    outside,
    warning: warning(
      "EXTRAPOLATED",
      `${what} is used at ${count} rate${count === 1 ? "" : "s"} (${fmt(Math.min(...beyond))}–${fmt(Math.max(...beyond))} 1/s) outside the ${fmt(lo)}–${fmt(hi)} 1/s it was fitted to: there it is an extrapolation of the model, not a measurement`,
    ),
  };
}
