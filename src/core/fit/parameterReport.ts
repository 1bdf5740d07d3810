/**
 * What a fit reports about each parameter: standard error, interval in the parameter's own
 * coordinates (intervals.ts), whether the data determine it (determination.ts) and the warnings
 * that say why not. Shared by the single-curve fit (fitModel.ts) and the fit across temperatures
 * (temperature/masterFit.ts), so both judge parameters by the same rules.
 */
import { warning, type Warning } from "../errors";
import type { ParameterSpec } from "../models";
import { relativeStandardError, type Undetermined } from "./determination";
import { domainInterval } from "./intervals";

/** One parameter as the fit left it. */
export interface ParameterEntry {
  spec: ParameterSpec;
  value: number;
  /** false for a held (fixed) parameter */
  free: boolean;
  /** NaN when held or when the covariance is singular */
  standardError: number;
  /** ended on a bound of its range (or has no influence on the curve) */
  atBound: boolean;
  /** the plateau test's finding for this parameter (determination.ts), when it fails */
  plateau?: Undetermined;
}

/** The per-parameter results of a fit. */
export interface ParameterReport {
  /** free parameters only */
  standardErrors: Record<string, number>;
  confidenceIntervals: Record<string, [number, number]>;
  /** every parameter: false for held ones and for free ones the data do not determine */
  determined: Record<string, boolean>;
  undetermined: Record<string, Undetermined>;
  warnings: Warning[];
}

const shortNumber = (v: number) => Number(v.toPrecision(3)).toString();
const unitText = (unit: string) => (unit === "1" ? "" : ` ${unit}`);

/**
 * Judges each parameter: on a bound (PARAMETER_AT_BOUND), relative standard error above `limit`
 * (POORLY_DETERMINED), no standard error (singular covariance), or outside the measured window
 * (ZERO_SHEAR_NOT_DETERMINED for the plateau parameter, ONSET_NOT_DETERMINED for the onset one).
 * @param t quantile of Student's t for the interval (e.g. t(0.975, n − p))
 * @param plateauName the model's zero-shear parameter (its plateau finding gets the ZERO_SHEAR code)
 */
export function reportParameters(entries: readonly ParameterEntry[], t: number, limit: number, plateauName?: string): ParameterReport {
  const report: ParameterReport = { standardErrors: {}, confidenceIntervals: {}, determined: {}, undetermined: {}, warnings: [] };
  for (const e of entries) {
    const { spec, value, standardError: se } = e;
    const name = spec.name;
    report.determined[name] = false;
    if (!e.free) continue;
    report.standardErrors[name] = se;
    report.confidenceIntervals[name] = domainInterval(spec, value, se, t);
    const relative = relativeStandardError(value, se);
    if (e.atBound) {
      const bound = Number.isFinite(spec.max) && value > (spec.min + spec.max) / 2 ? spec.max : spec.min;
      report.warnings.push(warning("PARAMETER_AT_BOUND", `${name} is at its bound ${bound} (${value.toPrecision(3)}): the data do not call for it; its interval is one-sided`));
      report.undetermined[name] = { reason: `at its bound ${bound}`, outsideData: false };
    } else if (relative > limit) {
      report.warnings.push(warning("POORLY_DETERMINED", `${name} = ${value.toPrecision(4)} has a standard error of ${se.toPrecision(3)} (${(100 * relative).toPrecision(2)} % of the value, above the ${100 * limit} % limit)`));
      report.undetermined[name] = { reason: `its standard error is ${(100 * relative).toPrecision(2)} % of the value (limit ${100 * limit} %)`, outsideData: false };
    } else if (!Number.isFinite(se)) {
      report.undetermined[name] = { reason: "it has no standard error (singular covariance)", outsideData: false };
    }
    const u = e.plateau;
    if (u) {
      report.undetermined[name] = u;
      const bound = u.bound ? ` (the data support ${name} ${u.bound.side === "lower" ? "≥" : "≤"} ${shortNumber(u.bound.value)}${unitText(spec.unit)})` : "";
      const message = `${name} is not determined by the data: ${u.reason}${bound}`;
      if (name === plateauName) report.warnings.push(warning("ZERO_SHEAR_NOT_DETERMINED", message));
      else report.warnings.push(warning("ONSET_NOT_DETERMINED", message));
    }
    report.determined[name] = !(name in report.undetermined);
  }
  return report;
}
