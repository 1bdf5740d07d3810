/**
 * Significant figures for every surface that shows a result: the Excel number format of a cell in
 * the results workbook and the text of the same number in the HTML report agree digit for digit.
 * The stored value always keeps full precision; only what is shown is rounded.
 *
 * Rule (one for all quantities; the column chooses the number of figures): whole numbers below
 * 10⁶ are shown whole; other values with `digits` significant figures in fixed notation between
 * 10⁻³ and 10⁶, in scientific notation outside.
 */

/** Significant figures shown when a column does not say (ResultColumn.digits). */
export const DEFAULT_DIGITS = 4;

const SCIENTIFIC_BELOW = 1e-3;
const SCIENTIFIC_FROM = 1e6;

function clampDigits(digits: number): number {
  return Math.min(15, Math.max(1, Math.round(digits)));
}

/** Shown in scientific notation (a finite, non-zero value outside 10⁻³ … 10⁶). */
function scientific(value: number): boolean {
  const a = Math.abs(value);
  return a !== 0 && (a < SCIENTIFIC_BELOW || a >= SCIENTIFIC_FROM);
}

/** Decimals that give `digits` significant figures for `value` in fixed notation (0 for whole numbers). */
export function fixedDecimals(value: number, digits = DEFAULT_DIGITS): number {
  if (value === 0 || (Number.isInteger(value) && Math.abs(value) < SCIENTIFIC_FROM)) return 0;
  const d = clampDigits(digits);
  // the exponent after rounding: 9.9996 to 4 figures is 10.00, one decimal fewer
  const { digits: all, exponent } = decimalDigits(value);
  const e = exponent + (roundDigits(all, d).carried ? 1 : 0);
  return Math.max(0, d - 1 - e);
}

/**
 * The Excel number format that shows `value` with `digits` significant figures, e.g. 24.13133 →
 * "0.00" (24.13), 0.0001234 → "0.000E+00", 190 → "0".
 * @example excelNumberFormat(24.131330976438928, 4) // "0.00"
 */
export function excelNumberFormat(value: number, digits = DEFAULT_DIGITS): string {
  if (!Number.isFinite(value)) return "General";
  if (scientific(value) && !(Number.isInteger(value) && Math.abs(value) < SCIENTIFIC_FROM)) {
    const d = clampDigits(digits);
    return d > 1 ? `0.${"0".repeat(d - 1)}E+00` : "0E+00";
  }
  const decimals = fixedDecimals(value, digits);
  return decimals === 0 ? "0" : `0.${"0".repeat(decimals)}`;
}

/**
 * The decimal digits of |value| to 15 significant figures (what a spreadsheet works with) and the
 * power of ten of the first: 61.025 → { digits: "610250000000000", exponent: 1 }.
 */
function decimalDigits(value: number): { digits: string; exponent: number } {
  const [mantissa, exp] = Math.abs(value).toExponential(14).split("e") as [string, string];
  return { digits: mantissa.replace(".", ""), exponent: Number(exp) };
}

/**
 * Rounds decimal digits half away from zero (as spreadsheets display numbers) to `keep` digits;
 * returns the kept digits and whether rounding carried into a new leading digit.
 */
function roundDigits(digits: string, keep: number): { kept: string; carried: boolean } {
  if (keep <= 0) return { kept: Number(digits[0]) >= 5 && keep === 0 ? "1" : "", carried: keep === 0 && Number(digits[0]) >= 5 };
  const head = digits.slice(0, keep).padEnd(keep, "0").split("").map(Number);
  if (Number(digits[keep] ?? "0") >= 5) {
    let i = keep - 1;
    for (; i >= 0; i--) {
      if ((head[i] as number) < 9) {
        head[i] = (head[i] as number) + 1;
        break;
      }
      head[i] = 0;
    }
    if (i < 0) return { kept: "1" + head.join(""), carried: true };
  }
  return { kept: head.join(""), carried: false };
}

/**
 * The text of `value` as {@link excelNumberFormat} shows it in a spreadsheet (the HTML report, the
 * widths of workbook columns): "24.13", "1.234E-04", "190". Rounded half away from zero on the
 * value's 15 significant decimal digits, as Excel and LibreOffice display (61.025 → "61.03",
 * where binary toFixed gives "61.02").
 */
export function formatSignificant(value: number, digits = DEFAULT_DIGITS): string {
  if (!Number.isFinite(value)) return "";
  const sign = value < 0 ? "-" : "";
  const { digits: all, exponent } = decimalDigits(value);
  if (scientific(value) && !(Number.isInteger(value) && Math.abs(value) < SCIENTIFIC_FROM)) {
    const d = clampDigits(digits);
    const r = roundDigits(all, d);
    const e = exponent + (r.carried ? 1 : 0);
    const m = r.kept.slice(0, d);
    return `${sign}${m[0]}${d > 1 ? "." + m.slice(1) : ""}E${e < 0 ? "-" : "+"}${String(Math.abs(e)).padStart(2, "0")}`;
  }
  const decimals = fixedDecimals(value, digits);
  if (value === 0) return decimals > 0 ? `0.${"0".repeat(decimals)}` : "0";
  // digits kept: those before the point (exponent + 1) and `decimals` after it
  const keep = exponent + 1 + decimals;
  const r = roundDigits(all, keep);
  let text = r.kept;
  const intLength = exponent + 1 + (r.carried ? 1 : 0);
  if (intLength <= 0) text = "0".repeat(1 - intLength) + text;
  const point = Math.max(1, intLength);
  const whole = text.slice(0, point) || "0";
  const fraction = text.slice(point).padEnd(decimals, "0").slice(0, decimals);
  const out = decimals > 0 ? `${whole}.${fraction}` : whole;
  return /[1-9]/.test(out) ? sign + out : out;
}
