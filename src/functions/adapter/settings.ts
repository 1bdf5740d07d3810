/**
 * Settings ranges of the worksheet functions: two columns, name | value, one setting per row.
 * Names match case-insensitively and ignore spaces, underscores and hyphens ("Full scale" =
 * "full_scale" = "fullScale"); blank rows are skipped; a name given twice is refused.
 */
import { RheoError } from "../../core/errors";
import { isBlank, readNumber } from "./ranges";

/** Lower case without spaces, underscores or hyphens. */
export function squash(text: string): string {
  return text.toLowerCase().replace(/[\s_-]+/g, "");
}

/** The key of `keys` that `name` spells. @throws RheoError("value") naming `argument` */
export function keyFor(name: string, keys: readonly string[], argument: string): string {
  const found = keys.find((k) => squash(k) === squash(name));
  if (!found) throw new RheoError("value", argument, `unknown name "${name}"; accepted: ${keys.join(", ")}`, undefined, "UNKNOWN_SETTING");
  return found;
}

/** A range as rows of cells. @throws RheoError("missing") when empty */
export function grid(range: unknown, argument: string): unknown[][] {
  if (!Array.isArray(range) || range.length === 0) throw new RheoError("missing", argument, "is required");
  return range.map((row: unknown) => (Array.isArray(row) ? (row as unknown[]) : [row]));
}

/** A cell as an options reader wants it: trimmed text, a number or boolean, or undefined when blank. */
export function cellValue(cell: unknown, argument: string, where: string): unknown {
  if (isBlank(cell)) return undefined;
  if (typeof cell === "string") return cell.trim();
  if (typeof cell === "number" || typeof cell === "boolean") return cell;
  return readNumber(cell, argument, where); // throws for error values
}

/**
 * Reads a name | value settings range into a record keyed by `keys`.
 * @throws RheoError naming `argument` and the row: an unknown or repeated name, a one-column range
 */
export function readSettingsRange(range: unknown, keys: readonly string[], argument = "settings"): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  grid(range, argument).forEach((row, i) => {
    if (isBlank(row[0])) return;
    if (row.length < 2) throw new RheoError("value", argument, "must have two columns: name and value");
    const key = keyFor(String(row[0]), keys, `${argument} row ${i + 1}`);
    if (key in out) throw new RheoError("value", `${argument} row ${i + 1}`, `gives "${key}" a second time`, undefined, "DUPLICATE_KEY");
    out[key] = cellValue(row[1], argument, `row ${i + 1}`);
  });
  return out;
}
