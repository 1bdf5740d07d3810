/**
 * How fit results read as text on every surface (CLI tables and summary, pane tables, workbook
 * notes): R² with enough digits to tell the models apart, and a parameter the data do not
 * determine shown as what the data support ("≥ 1340 Pa.s, not determined") instead of a number.
 */
import type { FitResult } from "../core/fit/fitModel";
import type { Undetermined } from "../core/fit/determination";

/**
 * Decimal digits that show every R² of `values` distinct from the others and from 1: at least 3,
 * and two significant digits of 1 − R² for each value (0.99999 vs 0.99997 → 6 digits), at most 12.
 * @example r2Digits([0.999987, 0.999968]) // 6
 */
export function r2Digits(values: readonly number[]): number {
  const finite = values.filter((v) => Number.isFinite(v));
  let digits = 3;
  for (const v of finite) {
    const gap = 1 - v;
    if (gap > 0) digits = Math.max(digits, Math.ceil(-Math.log10(gap)) + 1);
  }
  const distinct = [...new Set(finite)];
  while (digits < 12 && new Set(distinct.map((v) => v.toFixed(digits))).size < distinct.length) digits++;
  return Math.min(digits, 12);
}

/**
 * R² as text with `digits` decimals; "—" when undefined (every viscosity equal: R2_UNDEFINED).
 * @example r2Text(0.9999873, 6) // "0.999987"
 */
export function r2Text(value: number, digits: number): string {
  return Number.isFinite(value) ? value.toFixed(digits) : "—";
}

const short = (v: number, digits = 4) => {
  if (!Number.isFinite(v)) return "—";
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(digits - 1);
  return Number(v.toPrecision(digits)).toString();
};
const unitText = (unit: string) => (unit === "1" ? "" : ` ${unit}`);

/**
 * What the data support for an undetermined parameter, in words: "≥ 1340 Pa.s (not determined by
 * the data)" for a value outside the measured rates with a supported bound, else "not determined:
 * <reason>".
 */
export function undeterminedText(u: Undetermined, unit: string): string {
  if (u.bound) return `${u.bound.side === "lower" ? "≥" : "≤"} ${short(u.bound.value)}${unitText(unit)} (not determined by the data)`;
  return `not determined: ${u.reason}`;
}

/**
 * One parameter of a fit as a reader should see it: the value when the data determine it (or it
 * is held), else the bound the data support. `unit` "1" leaves the unit out (a table with a unit
 * column).
 * @example parameterValueText(fit, "eta0", "Pa.s") // "≥ 1340 Pa.s (not determined by the data)"
 */
export function parameterValueText(fit: Pick<FitResult, "parameters" | "undetermined" | "fixed">, name: string, unit: string): string {
  const u = fit.undetermined[name];
  if (u && u.outsideData) return undeterminedText(u, unit);
  const v = fit.parameters[name] as number;
  return `${short(v)}${unitText(unit)}${fit.fixed.includes(name) ? " (held)" : u ? ` (not determined: ${u.reason})` : ""}`;
}
