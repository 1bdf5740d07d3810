/** How the pane's summaries show a number. Pure. */

/** A number as shown: 4 significant digits, exponent outside 1e-3…1e5. */
export function shownNumber(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e5 || a < 1e-3)) return v.toExponential(2).replace("e+", "e");
  return Number(v.toPrecision(4)).toString();
}
