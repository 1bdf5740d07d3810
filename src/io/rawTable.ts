/**
 * Raw data tables (a header row of `quantity [unit]` cells, then one row per measurement) to SI
 * measurements for the core. The same reader serves CSV lines, worksheet ranges and the pane.
 */
import { RheoError, Warning, warning } from "../core/errors";
import { toSI } from "../core/units";
import { flowRateFromMassRate, flowRateFromPiston } from "../core/flow";
import { Measurement } from "../core/reduce";
import { COLUMN_QUANTITIES, ColumnInfo, ColumnName, readHeader } from "./headers";

/** Options of {@link readRawTable}. */
export interface RawTableOptions {
  /** how rows are named in messages: "line" for files, "row" for worksheets */
  rowWord: "line" | "row";
  /** number of the header row/line (data rows are numbered after it) */
  headerNumber: number;
  /** 1-based numbers of each row, when rows are not consecutive (CSV with comments) */
  rowNumbers?: number[];
  /** read "1,5" as 1.5 */
  decimalComma: boolean;
  /** used when there is no barrel_diameter column, SI (m) */
  barrelDiameter?: number;
  /** used when there is no density column, SI (kg/m³) */
  density?: number;
}

export const DEFAULT_RAW_TABLE_OPTIONS: Readonly<RawTableOptions> = Object.freeze({
  rowWord: "row",
  headerNumber: 1,
  decimalComma: false,
});

/** Result of {@link readRawTable}. */
export interface RawTable {
  measurements: Measurement[];
  columns: ColumnInfo[];
  /** numbers of rows skipped because a needed cell was blank */
  skippedRows: number[];
  warnings: Warning[];
}

/**
 * A cell as a number, or null when blank; numbers stored as text are read.
 * @param argument names the column in the error, e.g. `pressure [bar] (column 5)`
 * @param place names the row in the error, e.g. `line 7` or `row 4`
 * @throws RheoError("value"): `pressure [bar] (column 5): line 7 is text "n/a", not a number`
 */
export function readNumberCell(cell: unknown, argument: string, place: string, decimalComma: boolean): number | null {
  if (cell === null || cell === undefined) return null;
  if (typeof cell === "number") {
    if (!Number.isFinite(cell)) throw new RheoError("value", argument, `${place} is not a finite number (${String(cell)})`);
    return cell;
  }
  if (typeof cell === "boolean") throw new RheoError("value", argument, `${place} is a TRUE/FALSE value, not a number`);
  if (typeof cell === "string") {
    let text = cell.trim();
    if (text === "") return null;
    if (decimalComma && /^[-+]?\d*,\d+([eE][-+]?\d+)?$/.test(text)) text = text.replace(",", ".");
    if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) return Number(text);
    throw new RheoError("value", argument, `${place} is text "${cell}", not a number`);
  }
  throw new RheoError("value", argument, `${place} is not a number (${typeof cell})`);
}

/**
 * Reads a raw table (first row headers) into SI measurements.
 *
 * Needs die_diameter (or slit_width and slit_height for slit dies; a row has one or the other),
 * die_length, pressure, and a flow: flow_rate, or piston_speed with
 * barrel_diameter (column or option), or mass_rate with density (column or option);
 * temperature is optional. Unknown columns are ignored with a warning. A row whose needed cells
 * are all blank is skipped silently; one with some blank is skipped with a warning.
 *
 * @throws RheoError naming the column and row, e.g. `pressure [bar] (column 4): line 5 is text "n/a", not a number`.
 */
export function readRawTable(cells: unknown[][], options: Partial<RawTableOptions> = {}): RawTable {
  const opt: RawTableOptions = { ...DEFAULT_RAW_TABLE_OPTIONS, ...options };
  const header = cells[0];
  if (!header || header.every((c) => c === null || c === undefined || String(c).trim() === "")) {
    throw new RheoError("missing", "header", `the first ${opt.rowWord} must hold the column headers, e.g. "pressure [bar]"`);
  }
  const columns = header.map((h, i) => readHeader(h === null || h === undefined ? "" : String(h), i));
  const warnings: Warning[] = [];
  const byName = new Map<ColumnName, ColumnInfo>();
  for (const c of columns) {
    if (c.header.trim() === "") continue;
    if (c.name === null) {
      warnings.push(warning("COLUMN_IGNORED", `Column ${c.index + 1} ${c.problem}; it is ignored.`));
      continue;
    }
    if (c.problem) throw new RheoError("value", `column ${c.index + 1}`, c.problem);
    if (byName.has(c.name)) throw new RheoError("value", `column ${c.index + 1}`, `"${c.header}" repeats the quantity ${c.name}`);
    byName.set(c.name, c);
  }
  const hasSlit = byName.has("slit_width") || byName.has("slit_height");
  if (hasSlit && !(byName.has("slit_width") && byName.has("slit_height"))) {
    const missing = byName.has("slit_width") ? "slit_height" : "slit_width";
    throw new RheoError("missing", missing, `a slit die needs both "slit_width [unit]" and "slit_height [unit]" columns`);
  }
  const geometryColumns: ColumnName[] = [...(byName.has("die_diameter") || !hasSlit ? ["die_diameter" as const] : []), ...(hasSlit ? ["slit_width" as const, "slit_height" as const] : [])];
  const required: ColumnName[] = [...geometryColumns, "die_length", "pressure"];
  for (const name of required) {
    if (!byName.has(name)) {
      throw new RheoError("missing", name, `no "${name} [unit]" column; found: ${columns.map((c) => `"${c.header}"`).join(", ")}`);
    }
  }
  const flowSource = byName.has("flow_rate")
    ? "flow_rate"
    : byName.has("piston_speed")
      ? "piston_speed"
      : byName.has("mass_rate")
        ? "mass_rate"
        : null;
  if (flowSource === null) {
    throw new RheoError("missing", "flow_rate", `no flow column: give flow_rate, or piston_speed with barrel_diameter, or mass_rate with density`);
  }
  if (flowSource === "piston_speed" && !byName.has("barrel_diameter") && opt.barrelDiameter === undefined) {
    throw new RheoError("missing", "barrel_diameter", `piston_speed needs the barrel bore: add a "barrel_diameter [mm]" column, or give the bore on its own (--barrel-diameter on the command line, the barrelDiameter argument of RHEO.REDUCE)`);
  }
  if (flowSource === "mass_rate" && !byName.has("density") && opt.density === undefined) {
    throw new RheoError("missing", "density", `mass_rate needs the melt density: add a "density [g/cm3]" column, or give it on its own (--density on the command line, the density argument of RHEO.REDUCE)`);
  }
  const used: ColumnName[] = [...required, flowSource];
  if (flowSource === "piston_speed" && byName.has("barrel_diameter")) used.push("barrel_diameter");
  if (flowSource === "mass_rate" && byName.has("density")) used.push("density");
  if (byName.has("temperature")) used.push("temperature");

  const measurements: Measurement[] = [];
  const skippedRows: number[] = [];
  for (let r = 1; r < cells.length; r++) {
    const rowCells = cells[r] ?? [];
    const number = opt.rowNumbers?.[r] ?? opt.headerNumber + r;
    const values = new Map<ColumnName, number>();
    const blanks: ColumnName[] = [];
    for (const name of used) {
      const col = byName.get(name) as ColumnInfo;
      const v = readNumberCell(rowCells[col.index], `${col.header} (column ${col.index + 1})`, `${opt.rowWord} ${number}`, opt.decimalComma);
      if (v === null) blanks.push(name);
      else values.set(name, toSI(v, col.unit as string, COLUMN_QUANTITIES[name].quantity, col.header));
    }
    if (blanks.length === used.length) continue;
    if (hasSlit) {
      // Geometry: die_diameter, or slit_width with slit_height; the other kind is left blank.
      const round = values.has("die_diameter");
      const slit = values.has("slit_width") || values.has("slit_height");
      if (round && slit) {
        throw new RheoError("value", `${opt.rowWord} ${number}`, "has both a die diameter and a slit size; give die_diameter for a round die or slit_width and slit_height for a slit");
      }
      const notNeeded: ColumnName[] = round ? ["slit_width", "slit_height"] : slit ? ["die_diameter"] : [];
      const stillBlank = blanks.filter((name) => !notNeeded.includes(name));
      blanks.length = 0;
      blanks.push(...stillBlank);
    }
    if (blanks.length > 0) {
      skippedRows.push(number);
      warnings.push(warning("ROW_SKIPPED_BLANK", `${opt.rowWord} ${number} skipped: blank ${blanks.join(", ")}.`));
      continue;
    }
    const get = (name: ColumnName) => values.get(name) as number;
    const fail = (name: ColumnName, e: unknown): never => {
      const col = byName.get(name) as ColumnInfo;
      const argument = `${col.header} (column ${col.index + 1})`;
      if (e instanceof RheoError) throw e.retarget({ argument, row: null, context: `${opt.rowWord} ${number}`, received: e.received === undefined ? undefined : String(values.get(name) ?? e.received) });
      throw new RheoError("value", argument, `${opt.rowWord} ${number} ${String(e)}`);
    };
    let flowRate: number;
    try {
      if (flowSource === "flow_rate") flowRate = get("flow_rate");
      else if (flowSource === "piston_speed") flowRate = flowRateFromPiston(get("piston_speed"), values.get("barrel_diameter") ?? (opt.barrelDiameter as number));
      else flowRate = flowRateFromMassRate(get("mass_rate"), values.get("density") ?? (opt.density as number));
    } catch (e) {
      return fail(flowSource, e);
    }
    const isSlit = values.has("slit_width") || values.has("slit_height");
    const geometry: ColumnName[] = isSlit ? ["slit_width", "slit_height"] : ["die_diameter"];
    for (const name of [...geometry, "die_length", "pressure", flowSource] as ColumnName[]) {
      const v = name === flowSource ? flowRate : get(name);
      if (!(v > 0)) fail(name, new RheoError("domain", name, `must be greater than zero, got ${values.get(name)}`));
    }
    const m: Measurement = {
      ...(isSlit ? { slitWidth: get("slit_width"), slitHeight: get("slit_height") } : { dieDiameter: get("die_diameter") }),
      dieLength: get("die_length"),
      flowRate,
      pressure: get("pressure"),
      row: number,
    };
    if (values.has("temperature")) m.temperature = get("temperature");
    measurements.push(m);
  }
  if (measurements.length === 0) throw new RheoError("missing", "data", `no data ${opt.rowWord}s below the header`);
  return { measurements, columns, skippedRows, warnings };
}
