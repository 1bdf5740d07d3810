/**
 * Lot comparison (quality control): a new lot's flow curve against a reference — a fitted model or a
 * reference table — at the reference's rates, with a tolerance band in percent.
 *
 * At each reference rate γ̇_i the lot's viscosity is interpolated piecewise-linearly in
 * (ln γ̇, ln η) between its two neighbouring measured points (interpolate.ts); a rate outside the
 * lot's measured range is reported as not compared (never extrapolated). Deviation
 * d_i = η_lot/η_ref − 1; the point passes when |d_i| ≤ tolerance (edges inclusive, with a 1e-9
 * relative allowance for rounding). Verdict: "fail" when any compared point fails, "pass" when at
 * least one point was compared and all passed, "not-compared" when none could be; the worst point
 * is the compared point of largest |d|.
 *
 * The rates of a model reference are `reference.shearRate` when given, else the lot's own rates.
 */
import { RheoError, requirePositive, warning, type Warning } from "./errors";
import { interpolateLogLog } from "./interpolate";
import { evaluateModel } from "./models";

/** Defaults of the comparison, defined once. */
export const DEFAULT_LOT_COMPARISON_OPTIONS = Object.freeze({
  /** Half-width of the band as a fraction (0.1 = ±10 %); a QC specification sets it. */
  tolerance: 0.1,
});

export type LotComparisonOptions = { tolerance: number };

/** A flow curve as two aligned lists: shear rate (1/s) and viscosity (Pa·s). */
export interface FlowCurveTable {
  shearRate: readonly number[];
  viscosity: readonly number[];
}

/** The reference: a registry model with parameters (SI), or a table. */
export type LotReference =
  | { kind: "model"; model: string; parameters: Record<string, number>; temperature?: number; shearRate?: readonly number[] }
  | ({ kind: "table" } & FlowCurveTable);

export type LotPointStatus = "pass" | "fail" | "not-compared";

/** One comparison rate. */
export interface LotPoint {
  shearRate: number;
  referenceViscosity: number;
  /** band edges η_ref(1 ∓ tolerance), Pa·s */
  lower: number;
  upper: number;
  /** interpolated lot viscosity, null when outside the lot's range */
  lotViscosity: number | null;
  /** η_lot/η_ref − 1, null when not compared */
  deviation: number | null;
  status: LotPointStatus;
}

export interface LotComparison {
  points: LotPoint[];
  verdict: LotPointStatus;
  /** the compared point of largest |deviation|, null when none was compared */
  worst: LotPoint | null;
  compared: number;
  failed: number;
  notCompared: number;
  tolerance: number;
  warnings: Warning[];
}

/** Relative allowance at the band edges for floating-point rounding. */
const EDGE_ALLOWANCE = 1e-9;

/**
 * Checks a flow-curve table: equal lengths, at least `min` points, positive finite values, no
 * repeated rate. Returns it.
 */
export function validateFlowCurve(table: FlowCurveTable, argument: string, min = 1): FlowCurveTable {
  if (table.shearRate.length !== table.viscosity.length) {
    throw new RheoError("value", argument, `has ${table.shearRate.length} shear rates but ${table.viscosity.length} viscosities`);
  }
  if (table.shearRate.length < min) throw new RheoError("missing", argument, `needs at least ${min} point${min > 1 ? "s" : ""}, got ${table.shearRate.length}`);
  table.shearRate.forEach((r, i) => requirePositive(r, `${argument} shear rate`, i + 1));
  table.viscosity.forEach((v, i) => requirePositive(v, `${argument} viscosity`, i + 1));
  const sorted = [...table.shearRate].sort((a, b) => a - b);
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i] === sorted[i - 1]) throw new RheoError("value", argument, `has the shear rate ${sorted[i]} 1/s twice; average the repeats first`);
  }
  return table;
}

function referencePoints(reference: LotReference, lot: FlowCurveTable): { rates: number[]; viscosities: number[] } {
  if (reference.kind === "table") {
    validateFlowCurve(reference, "reference", 1);
    return { rates: [...reference.shearRate], viscosities: [...reference.viscosity] };
  }
  if (reference.kind !== "model") throw new RheoError("value", "reference", `kind must be "model" or "table"`);
  const rates = [...(reference.shearRate ?? lot.shearRate)];
  if (rates.length === 0) throw new RheoError("missing", "reference", "no rates to compare at");
  return { rates, viscosities: evaluateModel(reference.model, reference.parameters, rates, reference.temperature) };
}

/**
 * Compares a lot's flow curve with a reference (see the module comment).
 * @param lot measured flow curve (≥ 1 point; interpolation needs ≥ 2)
 * @param options tolerance as a fraction (> 0), default {@link DEFAULT_LOT_COMPARISON_OPTIONS}
 * @throws RheoError for bad tables, unknown models or parameters, a non-positive tolerance.
 * @example compareLot({ kind: "table", shearRate: [10, 100], viscosity: [1000, 300] },
 *   { shearRate: [10, 100], viscosity: [1050, 280] }).verdict // "pass"
 */
export function compareLot(reference: LotReference, lot: FlowCurveTable, options: Partial<LotComparisonOptions> = {}): LotComparison {
  const tolerance = requirePositive(options.tolerance ?? DEFAULT_LOT_COMPARISON_OPTIONS.tolerance, "tolerance");
  validateFlowCurve(lot, "lot", 1);
  const ref = referencePoints(reference, lot);
  const xs = [...lot.shearRate];
  const ys = [...lot.viscosity];
  const points = ref.rates.map((rate, i): LotPoint => {
    const eta = ref.viscosities[i] as number;
    const value = interpolateLogLog(xs, ys, rate);
    const base = { shearRate: rate, referenceViscosity: eta, lower: eta * (1 - tolerance), upper: eta * (1 + tolerance) };
    if (value === undefined) return { ...base, lotViscosity: null, deviation: null, status: "not-compared" };
    const deviation = value / eta - 1;
    const pass = Math.abs(deviation) <= tolerance * (1 + EDGE_ALLOWANCE);
    return { ...base, lotViscosity: value, deviation, status: pass ? "pass" : "fail" };
  });
  const compared = points.filter((p) => p.status !== "not-compared");
  const failed = compared.filter((p) => p.status === "fail").length;
  let worst: LotPoint | null = null;
  for (const p of compared) if (worst === null || Math.abs(p.deviation as number) > Math.abs(worst.deviation as number)) worst = p;
  const warnings: Warning[] = [];
  const skipped = points.filter((p) => p.status === "not-compared");
  if (skipped.length > 0) {
    warnings.push(
      warning(
        "LOT_POINTS_NOT_COMPARED",
        `${skipped.length} reference rate${skipped.length > 1 ? "s" : ""} (${skipped.map((p) => p.shearRate.toPrecision(4)).join(", ")} 1/s) ${skipped.length > 1 ? "lie" : "lies"} outside the lot's measured range (${Math.min(...xs).toPrecision(4)}–${Math.max(...xs).toPrecision(4)} 1/s) and ${skipped.length > 1 ? "were" : "was"} not compared`,
      ),
    );
  }
  const verdict: LotPointStatus = compared.length === 0 ? "not-compared" : failed > 0 ? "fail" : "pass";
  if (verdict === "not-compared") warnings.push(warning("LOT_NOTHING_COMPARED", "no reference rate lies inside the lot's measured range; the lot was not judged"));
  return { points, verdict, worst, compared: compared.length, failed, notCompared: skipped.length, tolerance, warnings };
}
