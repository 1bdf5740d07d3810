/**
 * Column headers of raw data: `quantity [unit]` (also `quantity (unit)`), shared by the CLI, the
 * worksheet functions and the task pane so that all three read a table the same way.
 */
import { Quantity, isUnitOf, acceptedUnits } from "../core/units";

/** The column quantities Rheoledger reads, with the physical quantity of their unit. */
export const COLUMN_QUANTITIES = {
  die_diameter: { quantity: "length", description: "die bore D" },
  die_length: { quantity: "length", description: "die land length L" },
  slit_width: { quantity: "length", description: "slit die width W (with slit_height, instead of die_diameter)" },
  slit_height: { quantity: "length", description: "slit die height (gap) H" },
  piston_speed: { quantity: "speed", description: "piston (crosshead) speed" },
  barrel_diameter: { quantity: "length", description: "barrel bore" },
  flow_rate: { quantity: "volumetricFlow", description: "volumetric flow rate" },
  mass_rate: { quantity: "massRate", description: "extrudate mass rate" },
  density: { quantity: "density", description: "melt density at test temperature" },
  pressure: { quantity: "pressure", description: "pressure drop over the die" },
  temperature: { quantity: "temperature", description: "melt temperature" },
} as const satisfies Record<string, { quantity: Quantity; description: string }>;

export type ColumnName = keyof typeof COLUMN_QUANTITIES;

/** What a header cell was read as (N: the quantity names of the table being read). */
export interface ColumnInfo<N extends string = ColumnName> {
  /** 0-based column index */
  index: number;
  header: string;
  /** the recognised quantity name, or null */
  name: N | null;
  /** the unit text as written, or null when none was given */
  unit: string | null;
  /** why the column was not recognised or its unit not accepted, if so */
  problem: string | null;
}

/** Normalises a quantity name: lower case, spaces and hyphens to underscores. */
export function normaliseColumnName(text: string): string {
  return text.trim().toLowerCase().replace(/[\s-]+/g, "_");
}

/**
 * Reads one header cell. `pressure [bar]` → { name: "pressure", unit: "bar" }.
 * @example readHeader("Die diameter [mm]", 0).name // "die_diameter"
 */
export function readHeader(header: string, index: number): ColumnInfo {
  return readHeaderOf(header, index, COLUMN_QUANTITIES);
}

/**
 * Reads one header cell against a table of known quantities (the raw point table's
 * {@link COLUMN_QUANTITIES}, or a larger one such as the trace table's).
 * @example readHeaderOf("time [min]", 0, { time: { quantity: "time", description: "" } }).unit // "min"
 */
export function readHeaderOf<N extends string>(header: string, index: number, quantities: Record<N, { quantity: Quantity; description: string }>): ColumnInfo<N> {
  const match = /^\s*([^[(]+?)\s*(?:[[(]\s*([^\])]*?)\s*[\])])?\s*$/.exec(header);
  const rawName = match?.[1] ?? header;
  const unit = match?.[2] ?? null;
  const key = normaliseColumnName(rawName);
  if (!Object.prototype.hasOwnProperty.call(quantities, key)) {
    return { index, header, name: null, unit, problem: `"${header}" is not a known quantity; known: ${Object.keys(quantities).join(", ")}` };
  }
  const name = key as N;
  const quantity = quantities[name].quantity;
  if (unit === null) {
    return { index, header, name, unit, problem: `"${header}" has no unit; write it as "${name} [unit]" with one of ${acceptedUnits(quantity).join(", ")}` };
  }
  if (!isUnitOf(quantity, unit)) {
    return { index, header, name, unit, problem: `"${header}": unknown ${quantity} unit "${unit}"; accepted: ${acceptedUnits(quantity).join(", ")}` };
  }
  return { index, header, name, unit, problem: null };
}

/** Rows searched for the header row below a title or notes. */
export const HEADER_SEARCH_ROWS = 50;

/**
 * Which row holds the column headers: the first of the first {@link HEADER_SEARCH_ROWS} rows in
 * which two or more cells name a known quantity ("pressure [bar]", "die_length (mm)"); rows above
 * it are a title or notes. -1 when no row qualifies (the caller then reads its first row as the
 * header, so that its problems are reported).
 * @example findHeaderRow([["Run 7"], [], ["die_diameter [mm]", "pressure [bar]"]]) // 2
 */
export function findHeaderRow(rows: readonly (readonly unknown[])[]): number {
  const n = Math.min(rows.length, HEADER_SEARCH_ROWS);
  for (let r = 0; r < n; r++) {
    let known = 0;
    for (const cell of rows[r] ?? []) {
      if (typeof cell !== "string" || cell.length > 200) continue;
      if (knownColumnName(cell) && ++known >= 2) return r;
    }
  }
  return -1;
}

/** True when a header cell names a known quantity (its unit not checked). */
export function knownColumnName(header: string): boolean {
  const match = /^\s*([^[(]+?)\s*(?:[[(].*)?$/.exec(header);
  return match !== null && normaliseColumnName(match[1] as string) in COLUMN_QUANTITIES;
}
