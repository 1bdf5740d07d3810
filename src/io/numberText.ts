/**
 * Numbers and quantities typed by a person into one field (a pane field, a command-line value, a
 * settings cell): "15", "0,25", "1 234,5", "1,234.5", "1.234,5", "2.5e5", "15 mm", "700 bar".
 *
 * One field carries no context to decide its separators, so the rule is: read every form that has
 * one reading, refuse a form that has two. A single "," or "." followed by exactly three digits
 * after a non-zero integer part ("1,000", "2.500") is either a thousands separator or a decimal
 * separator; it is refused with both readings named. Files decide their separators once for the
 * whole file (src/io/csv.ts), never cell by cell.
 */
import { RheoError } from "../core/errors";

const SIGNED = /^[-+]?/;
const EXPONENT = /[eE][-+]?\d+$/;

/** The readings of a separator-bearing numeral, most likely first; more than one means ambiguous. */
function readings(body: string): number[] {
  const commas = (body.match(/,/g) ?? []).length;
  const dots = (body.match(/\./g) ?? []).length;
  const grouped = (sep: string) => new RegExp(`^\\d{1,3}(\\${sep}\\d{3})+$`);
  if (commas === 0 && dots === 0) return /^\d+$/.test(body) ? [Number(body)] : [];
  if (commas > 0 && dots > 0) {
    // both: the last one is the decimal separator, the other groups thousands
    const decimal = body.lastIndexOf(",") > body.lastIndexOf(".") ? "," : ".";
    const thousands = decimal === "," ? "." : ",";
    const [intPart, frac, ...rest] = body.split(decimal);
    if (rest.length > 0 || frac === undefined || !/^\d*$/.test(frac) || !grouped(thousands).test(intPart ?? "")) return [];
    return [Number(`${(intPart ?? "").split(thousands).join("")}.${frac}`)];
  }
  const sep = commas > 0 ? "," : ".";
  const count = commas + dots;
  if (count > 1) return grouped(sep).test(body) ? [Number(body.split(sep).join(""))] : [];
  const [intPart = "", frac = ""] = body.split(sep);
  if (!/^\d*$/.test(intPart) || !/^\d*$/.test(frac) || (intPart === "" && frac === "")) return [];
  const decimal = Number(`${intPart === "" ? "0" : intPart}.${frac === "" ? "0" : frac}`);
  const couldGroup = frac.length === 3 && /^[1-9]\d{0,2}$/.test(intPart);
  return couldGroup ? [decimal, Number(intPart + frac)] : [decimal];
}

/**
 * Reads a number typed by a person (see the module comment). Spaces and no-break spaces between
 * digit groups are thousands separators.
 * @throws RheoError("value") naming `argument`: not a number, or a form with two readings.
 * @example readNumberText("1.234,5", "fullScale") // 1234.5
 */
export function readNumberText(text: string, argument: string): number {
  const t = text.trim().replace(/(\d)[\s\u00a0\u202f](?=\d{3}\b)/g, "$1");
  const sign = SIGNED.exec(t)?.[0] ?? "";
  const exp = EXPONENT.exec(t)?.[0] ?? "";
  const body = t.slice(sign.length, t.length - exp.length);
  const found = body === "" ? [] : readings(body);
  const apply = (v: number) => (sign === "-" ? -1 : 1) * v * (exp === "" ? 1 : 10 ** Number(exp.slice(1)));
  if (found.length === 0) throw new RheoError("value", argument, `expected a number, got "${excerpt(text)}"`, undefined, "NOT_A_NUMBER");
  if (found.length > 1) {
    throw new RheoError(
      "value",
      argument,
      `"${excerpt(text)}" can be read as ${apply(found[0] as number)} or as ${apply(found[1] as number)}; write it without a thousands separator (e.g. "${apply(found[1] as number)}") or with more decimals`,
      undefined,
      "AMBIGUOUS_NUMBER",
    );
  }
  const value = apply(found[0] as number);
  if (!Number.isFinite(value)) throw new RheoError("value", argument, `"${excerpt(text)}" is too large to represent`, undefined, "NOT_A_NUMBER");
  return value;
}

/**
 * Splits "value unit" text ("15 mm", "15mm", "0,25 %", "1 234,5 bar") into its number (read by
 * {@link readNumberText}) and its unit text ("" when none).
 * @throws RheoError("value") naming `argument` when the text does not start with a number.
 */
export function readQuantityText(text: string, argument: string): { value: number; unit: string } {
  // digits with "." and "," inside, and space-separated groups of exactly three digits ("1 234,5")
  const m = /^\s*([-+]?(?:\d[\d.,]*(?:[ \u00a0\u202f]\d{3}(?!\d)[\d.,]*)*|[.,]\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$/.exec(text);
  if (!m) throw new RheoError("value", argument, `expected a number with a unit, e.g. "15 mm", got "${excerpt(text)}"`, undefined, "NOT_A_NUMBER");
  return { value: readNumberText(m[1] as string, argument), unit: m[2] ?? "" };
}

/** At most 40 characters of `text`, control characters removed, for quoting in a message. */
export function excerpt(text: string, max = 40): string {
  // eslint-disable-next-line no-control-regex
  const clean = String(text).replace(/[\u0000-\u001f\u007f-\u009f]/g, " ");
  return clean.length > max ? `${clean.slice(0, max - 1)}…` : clean;
}
