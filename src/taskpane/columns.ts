/**
 * Column recognition and mapping for the pane: which `quantity [unit]` headers were recognised,
 * the user's choices for the others, and an optional die list that supplies die geometry from a
 * die-label column (or for every row, when one die was used). The result is a header row the
 * shared reader (src/io/rawTable.ts) reads like any other table, so nothing is parsed twice.
 */
import { RheoError } from "../core/errors";
import { acceptedUnits, isUnitOf } from "../core/units";
import { COLUMN_QUANTITIES, ColumnName, normaliseColumnName, readHeader } from "../io/headers";

/** What a column is taken to be: a quantity, a die label looked up in the die list, or ignored. */
export type ColumnRole = ColumnName | "die" | "ignore";

/** One column as recognised, then possibly changed by the user. */
export interface ColumnChoice {
  index: number;
  header: string;
  role: ColumnRole;
  /** unit of a quantity column (null for die and ignored columns, or when not yet chosen) */
  unit: string | null;
  /** true when the header alone was enough */
  recognised: boolean;
  /** why the header was not recognised, in plain words */
  problem: string | null;
}

/** One die of the die list, in millimetres (as printed on a die). */
export interface DieEntry {
  label: string;
  diameterMm: number;
  lengthMm: number;
}

/** Header names read as a die label column. */
const DIE_LABEL_NAMES = ["die", "die_id", "die_label", "die_name"];

/** The roles offered in the mapping lists, with their descriptions. */
export function roleOptions(): { role: ColumnRole; label: string }[] {
  return [
    ...(Object.keys(COLUMN_QUANTITIES) as ColumnName[]).map((name) => ({ role: name as ColumnRole, label: `${name}: ${COLUMN_QUANTITIES[name].description}` })),
    { role: "die", label: "die: label looked up in the die list" },
    { role: "ignore", label: "ignore this column" },
  ];
}

/** The units a role accepts (empty for die and ignored columns). */
export function unitOptions(role: ColumnRole): string[] {
  return role === "die" || role === "ignore" ? [] : acceptedUnits(COLUMN_QUANTITIES[role].quantity);
}

/**
 * Reads a header row into column choices: recognised `quantity [unit]` headers, die label
 * columns, and unrecognised ones (role "ignore", with the reason) for the user to map.
 * @example detectColumns(["pressure [bar]", "Notes"])[0].role // "pressure"
 */
export function detectColumns(header: readonly unknown[]): ColumnChoice[] {
  return header.map((cell, index) => {
    const text = cell === null || cell === undefined ? "" : String(cell);
    if (DIE_LABEL_NAMES.includes(normaliseColumnName(text.replace(/[[(].*$/, "")))) {
      return { index, header: text, role: "die", unit: null, recognised: true, problem: null };
    }
    const info = readHeader(text, index);
    if (text.trim() === "") return { index, header: text, role: "ignore", unit: null, recognised: false, problem: "empty header" };
    if (info.name === null) return { index, header: text, role: "ignore", unit: null, recognised: false, problem: "not a known quantity: choose one or leave it ignored" };
    if (info.problem) return { index, header: text, role: info.name, unit: null, recognised: false, problem: `choose the unit of ${info.name}` };
    return { index, header: text, role: info.name, unit: info.unit, recognised: true, problem: null };
  });
}

/** Problems of a mapping that stop a run: a quantity without a valid unit, a quantity used twice, a die column without a die list. */
export function mappingProblems(columns: readonly ColumnChoice[], dies: readonly DieEntry[]): string[] {
  const problems: string[] = [];
  const seen = new Map<string, number>();
  for (const c of columns) {
    if (c.role === "ignore") continue;
    const earlier = seen.get(c.role);
    if (earlier !== undefined) problems.push(`Columns ${earlier + 1} and ${c.index + 1} are both ${c.role}.`);
    seen.set(c.role, c.index);
    if (c.role !== "die" && (c.unit === null || !isUnitOf(COLUMN_QUANTITIES[c.role].quantity, c.unit))) {
      problems.push(`Column ${c.index + 1} (${c.header || "no header"}): choose a unit for ${c.role}.`);
    }
  }
  if (seen.has("die") && (seen.has("die_diameter") || seen.has("die_length"))) {
    problems.push("Map either a die label column or die_diameter and die_length columns, not both.");
  }
  if (seen.has("die") && dies.length === 0) problems.push("A die column is mapped: add its dies to the die list.");
  return problems;
}

/**
 * The table with its header row rewritten from the choices (ignored columns get an empty header,
 * which the reader skips) and die geometry columns added from the die list: looked up by the die
 * column's label, or the single listed die for every row when the table has no die columns.
 * @throws RheoError("value", "columns") for a mapping problem; ("value", "dies") for a label not
 *   in the die list or a die with a non-positive size; ("missing", "dies") when the table has no
 *   die geometry and the die list does not hold exactly one die.
 */
export function applyColumnChoices(cells: readonly (readonly unknown[])[], columns: readonly ColumnChoice[], dies: readonly DieEntry[]): unknown[][] {
  const problems = mappingProblems(columns, dies);
  if (problems.length > 0) throw new RheoError("value", "columns", problems.join(" "));
  dies.forEach((d, i) => {
    if (!(d.diameterMm > 0) || !(d.lengthMm > 0) || !Number.isFinite(d.diameterMm) || !Number.isFinite(d.lengthMm)) {
      throw new RheoError("value", "dies", `die ${i + 1} ("${d.label}") needs a bore and a length greater than zero in mm`);
    }
  });
  const header = columns.map((c) => (c.role === "ignore" || c.role === "die" ? "" : `${c.role} [${c.unit}]`));
  const dieColumn = columns.find((c) => c.role === "die");
  const hasGeometry = columns.some((c) => c.role === "die_diameter") && columns.some((c) => c.role === "die_length");
  const body = cells.slice(1).map((row) => [...row]);
  if (dieColumn) {
    const byLabel = new Map(dies.map((d) => [d.label.trim().toLowerCase(), d]));
    const rows = body.map((row, r) => {
      const raw = row[dieColumn.index];
      const label = raw === null || raw === undefined ? "" : String(raw).trim();
      if (label === "") return [...row, null, null];
      const die = byLabel.get(label.toLowerCase());
      if (!die) throw new RheoError("value", "dies", `die "${label}" in row ${r + 2} is not in the die list (listed: ${dies.map((d) => d.label).join(", ")})`);
      return [...row, die.diameterMm, die.lengthMm];
    });
    return [[...header, "die_diameter [mm]", "die_length [mm]"], ...rows];
  }
  if (!hasGeometry) {
    const only = dies.length === 1 ? dies[0] : undefined;
    if (!only) {
      throw new RheoError(
        "missing",
        "dies",
        dies.length === 0
          ? "the table has no die_diameter and die_length columns: map them, map a die label column, or list the single die used"
          : "the table has no die columns, so the die list must hold exactly one die (or map a die label column)",
      );
    }
    return [[...header, "die_diameter [mm]", "die_length [mm]"], ...body.map((row) => [...row, only.diameterMm, only.lengthMm])];
  }
  return [header, ...body];
}
