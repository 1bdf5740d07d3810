/**
 * The account of a run's input rows: every row read is either used or counted under the reason it
 * was not (blank, a comment line, a needed cell blank; the reduction adds rows merged as repeats
 * and the like). The reader fills it first; later stages move rows from "used" to a reason with
 * {@link skipRows}. The invariant `rowsRead = rowsUsed + Σ rowsSkipped` always holds.
 *
 * Every reason has a warning that says which rows (see the reader and the reduction); the summary
 * prints {@link rowAccountText}.
 */

/** Why rows were not used. Keys are stable (they appear in the JSON); add new reasons, never rename. */
export const ROW_SKIP_REASONS = Object.freeze({
  blank: "blank",
  comment: "comment line",
  incomplete: "a needed cell blank",
  repeat: "merged as a repeated reading",
  outsideRange: "outside the range used",
  // the reduction's reasons (src/core/reduceGroup.ts); each is explained by the warning in REDUCTION_SKIP_WARNINGS
  duplicate: "exact duplicate",
  drifted: "drifted repeat",
  instability: "above a flow instability",
  oneDie: "at a rate only one die reached",
  nonRising: "on a Bagley line that does not rise",
  notNeeded: "not needed by any line or point",
  noEndCorrection: "shorter die without end correction",
  orificeOutside: "outside the orifice die's rates",
  orificeTooHigh: "orifice pressure at or above the long die's",
} satisfies Record<string, string>);

/** The warning that lists the rows of each reason the reduction uses. */
export const REDUCTION_SKIP_WARNINGS = Object.freeze({
  repeat: "REPEATS_AVERAGED",
  duplicate: "DUPLICATE_ROWS",
  drifted: "REPEAT_DRIFT",
  instability: "FLOW_INSTABILITY",
  oneDie: "BAGLEY_RATE_DROPPED",
  nonRising: "BAGLEY_NONPOSITIVE_SLOPE",
  notNeeded: "READINGS_NOT_USED",
  noEndCorrection: "END_CORRECTION_NONE",
  orificeOutside: "ORIFICE_RATE_OUTSIDE",
  orificeTooHigh: "ORIFICE_PRESSURE_TOO_HIGH",
} satisfies Partial<Record<keyof typeof ROW_SKIP_REASONS, string>>);

export type RowSkipReason = keyof typeof ROW_SKIP_REASONS | (string & {});

/** Rows read, used and skipped (by reason) in one run. */
export interface RowAccount {
  /** data rows (lines) seen below the header, blank and comment lines included */
  rowsRead: number;
  /** rows that reached the calculation */
  rowsUsed: number;
  /** rows not used, by reason (only reasons with a count) */
  rowsSkipped: Record<string, number>;
}

/** An account with nothing read. */
export function emptyRowAccount(): RowAccount {
  return { rowsRead: 0, rowsUsed: 0, rowsSkipped: {} };
}

/**
 * Moves `count` rows from used to `reason` (a later stage dropping or merging rows).
 * @throws Error when more rows would be skipped than are used (a programming error)
 */
export function skipRows(account: RowAccount, reason: RowSkipReason, count: number): void {
  if (count <= 0) return;
  if (count > account.rowsUsed) throw new Error(`skipRows: ${count} rows to skip but only ${account.rowsUsed} used`);
  account.rowsUsed -= count;
  account.rowsSkipped[reason] = (account.rowsSkipped[reason] ?? 0) + count;
}

/** What the reduction did with one row: used, or skipped for a reason ("repeat": averaged into another reading). */
export type RowFate = "used" | { skipped: keyof typeof REDUCTION_SKIP_WARNINGS };

/**
 * The account of the rows a reduction was handed, from each row's fate.
 * @example tallyRows(["used", { skipped: "drifted" }]) // { rowsRead: 2, rowsUsed: 1, rowsSkipped: { drifted: 1 } }
 */
export function tallyRows(fates: readonly RowFate[]): RowAccount {
  const account: RowAccount = { rowsRead: fates.length, rowsUsed: 0, rowsSkipped: {} };
  for (const f of fates) {
    if (f === "used") account.rowsUsed++;
    else account.rowsSkipped[f.skipped] = (account.rowsSkipped[f.skipped] ?? 0) + 1;
  }
  return account;
}

/** The sum of several accounts (a run's groups). */
export function addRowAccounts(accounts: readonly RowAccount[]): RowAccount {
  const total = emptyRowAccount();
  for (const a of accounts) {
    total.rowsRead += a.rowsRead;
    total.rowsUsed += a.rowsUsed;
    for (const [reason, n] of Object.entries(a.rowsSkipped)) total.rowsSkipped[reason] = (total.rowsSkipped[reason] ?? 0) + n;
  }
  return total;
}

/**
 * The reader's account with the reduction's skips moved out of "used" (a copy): the run's whole
 * account, rowsRead = rowsUsed + Σ rowsSkipped over the file's rows.
 * @param input the reader's account; reduction the reduction's (its rowsRead = the rows the reader used)
 */
export function withReduction(input: RowAccount, reduction: RowAccount): RowAccount {
  const out: RowAccount = { rowsRead: input.rowsRead, rowsUsed: input.rowsUsed, rowsSkipped: { ...input.rowsSkipped } };
  for (const [reason, n] of Object.entries(reduction.rowsSkipped)) skipRows(out, reason, n);
  return out;
}

/** Total rows skipped. */
export function rowsSkippedTotal(account: RowAccount): number {
  return Object.values(account.rowsSkipped).reduce((s, n) => s + n, 0);
}

/**
 * A count with its thousands grouped by commas: "1,048,575" (written out: toLocaleString loads the
 * locale data, about 0.1 s at the first call, too slow for a command line's start).
 */
export function countText(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

const plural = (n: number, word: string) => `${countText(n)} ${word}${n === 1 ? "" : "s"}`;

/**
 * One line for a summary: "1,204 rows read: 1,200 used, 3 blank, 1 comment line."
 * @example rowAccountText({ rowsRead: 10, rowsUsed: 9, rowsSkipped: { blank: 1 } }) // "10 rows read: 9 used, 1 blank."
 */
export function rowAccountText(account: RowAccount, word = "row"): string {
  const parts = Object.entries(account.rowsSkipped)
    .filter(([, n]) => n > 0)
    .map(([reason, n]) => `${countText(n)} ${ROW_SKIP_REASONS[reason as keyof typeof ROW_SKIP_REASONS] ?? reason}`);
  return `${plural(account.rowsRead, word)} read: ${countText(account.rowsUsed)} used${parts.length ? ", " + parts.join(", ") : ""}.`;
}

/**
 * A bounded list of row numbers for a message: the first `max` kept as ranges, the rest counted.
 * @example const l = new RowList(); [4, 5, 6, 9].forEach((r) => l.add(r)); l.text("line") // "lines 4–6, 9"
 */
export class RowList {
  private readonly ranges: [number, number][] = [];
  private kept = 0;
  count = 0;
  constructor(private readonly max = 10) {}

  add(row: number): void {
    this.count++;
    const last = this.ranges[this.ranges.length - 1];
    if (last && row === last[1] + 1) {
      last[1] = row;
      return;
    }
    if (this.kept >= this.max) return;
    this.ranges.push([row, row]);
    this.kept++;
  }

  /** "line 4", "lines 4–6, 9 and 12 more" */
  text(word: string): string {
    const listed = this.ranges.reduce((s, [a, b]) => s + (b - a + 1), 0);
    const body = this.ranges.map(([a, b]) => (a === b ? String(a) : `${a}–${b}`)).join(", ");
    const more = this.count - listed;
    return `${this.count === 1 ? word : word + "s"} ${body}${more > 0 ? ` and ${countText(more)} more` : ""}`;
  }
}
