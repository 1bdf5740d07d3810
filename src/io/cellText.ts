/**
 * Text that stays text in every file the project writes. A cell or field that comes from the user
 * or from a text column (die labels, file names, notes, messages) must never become a formula or
 * break the file:
 *   - spreadsheet cells: written as strings (never as formulas), with the characters XML 1.0
 *     cannot hold removed (a control character would make the whole xlsx unreadable) and CR as LF;
 *   - CSV fields: text starting with = + - @ tab or CR is prefixed with an apostrophe, the
 *     common defence against formula injection (OWASP "CSV Injection"), and quoted when needed.
 */

/** Characters XML 1.0 forbids (C0 controls except tab, LF, CR; lone surrogates; U+FFFE/U+FFFF). */
// eslint-disable-next-line no-control-regex
const XML_FORBIDDEN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

/**
 * `text` with the characters an xlsx (XML 1.0) cannot store removed, and carriage returns made
 * line feeds (an XML reader turns a stored CR into LF anyway: the cell then reads back as written).
 */
export function xmlSafeText(text: string): string {
  return text.replace(XML_FORBIDDEN, "").replace(/\r\n?/g, "\n");
}

/** True when a spreadsheet would read `text` typed into a cell as a formula (or a sign). */
export function looksLikeFormula(text: string): boolean {
  return /^[=+\-@\t\r]/.test(text);
}

/**
 * One CSV field: numbers as written, text quoted when it holds a separator, quote or line break,
 * and prefixed with an apostrophe when it starts like a formula.
 * @example csvField("=HYPERLINK(\"x\")") // "'=HYPERLINK(""x"")" quoted
 */
export function csvField(value: string | number | boolean | null, separator = ","): string {
  if (value === null) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  const text = looksLikeFormula(value) ? `'${value}` : value;
  return text.includes(separator) || /["\r\n]/.test(text) || text !== text.trim() ? `"${text.replace(/"/g, '""')}"` : text;
}

/** CSV text of a header and rows (LF line ends, one trailing line end). */
export function csvText(header: readonly string[], rows: readonly (readonly (string | number | boolean | null)[])[], separator = ","): string {
  return [header, ...rows].map((r) => r.map((c) => csvField(c, separator)).join(separator)).join("\n") + "\n";
}
