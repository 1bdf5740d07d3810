/**
 * Comparison of fitted model parameters: a lot's fit against a reference fit, using their
 * confidence intervals (fitModel returns 95 % intervals by default).
 *
 * Per parameter: relative difference (lot − ref)/ref, and "consistent" when
 * - both intervals are known: the intervals overlap;
 * - only one is known: the other value lies inside it;
 * - neither: null (not judged).
 * Overlapping 95 % intervals is a lenient test (two estimates can differ significantly while their
 * intervals still overlap); it flags clear shifts, not subtle ones (common practice, no source).
 */
import { RheoError, requireFinite } from "./errors";

/** Parameter values (SI) with optional two-sided confidence intervals, e.g. a FitResult. */
export interface ParameterEstimate {
  parameters: Record<string, number>;
  confidenceIntervals?: Record<string, [number, number]>;
}

export interface ParameterComparisonRow {
  name: string;
  reference: number;
  lot: number;
  /** (lot − ref)/ref; null when ref is 0 */
  relativeDifference: number | null;
  referenceInterval: [number, number] | null;
  lotInterval: [number, number] | null;
  consistent: boolean | null;
}

export interface ParameterComparison {
  rows: ParameterComparisonRow[];
  /** "consistent" when every judged parameter is, "inconsistent" when one is not, "not-judged" when none had an interval */
  verdict: "consistent" | "inconsistent" | "not-judged";
}

function interval(estimate: ParameterEstimate, name: string, argument: string): [number, number] | null {
  const ci = estimate.confidenceIntervals?.[name];
  if (ci === undefined) return null;
  const [lo, hi] = ci;
  requireFinite(lo, `${argument}.${name} interval`);
  requireFinite(hi, `${argument}.${name} interval`);
  if (lo > hi) throw new RheoError("value", `${argument}.${name} interval`, `lower end ${lo} is above upper end ${hi}`);
  return [lo, hi];
}

/**
 * Compares the parameters both estimates share (the reference's names must all be in the lot).
 * @throws RheoError("missing") naming a reference parameter the lot lacks; ("value") for
 *   non-finite values or inverted intervals.
 * @example compareParameters({ parameters: { n: 0.4 } }, { parameters: { n: 0.42 }, confidenceIntervals: { n: [0.38, 0.46] } })
 *   // rows[0].consistent === true
 */
export function compareParameters(reference: ParameterEstimate, lot: ParameterEstimate): ParameterComparison {
  const names = Object.keys(reference.parameters);
  if (names.length === 0) throw new RheoError("missing", "reference", "has no parameters to compare");
  const rows = names.map((name): ParameterComparisonRow => {
    const ref = requireFinite(reference.parameters[name] as number, `reference.${name}`);
    if (lot.parameters[name] === undefined) throw new RheoError("missing", "lot", `has no parameter "${name}"; it has ${Object.keys(lot.parameters).join(", ")}`);
    const value = requireFinite(lot.parameters[name] as number, `lot.${name}`);
    const refCi = interval(reference, name, "reference");
    const lotCi = interval(lot, name, "lot");
    let consistent: boolean | null = null;
    if (refCi && lotCi) consistent = refCi[0] <= lotCi[1] && lotCi[0] <= refCi[1];
    else if (lotCi) consistent = ref >= lotCi[0] && ref <= lotCi[1];
    else if (refCi) consistent = value >= refCi[0] && value <= refCi[1];
    return { name, reference: ref, lot: value, relativeDifference: ref === 0 ? null : value / ref - 1, referenceInterval: refCi, lotInterval: lotCi, consistent };
  });
  const judged = rows.filter((r) => r.consistent !== null);
  const verdict = judged.length === 0 ? "not-judged" : judged.every((r) => r.consistent) ? "consistent" : "inconsistent";
  return { rows, verdict };
}
