/**
 * RHEO.PLAN and RHEO.LOTCHECK: worksheet adapters over the planner and the lot comparison. They
 * read ranges into the same option objects as the CLI (src/io/planOptions.ts), call the core and
 * spill the tables of src/io/planTables.ts.
 */
import { RheoError } from "../core/errors";
import { planTest } from "../core/planner";
import { compareLot, DEFAULT_LOT_COMPARISON_OPTIONS, type LotReference } from "../core/lotComparison";
import { toSI } from "../core/units";
import { PLAN_DIE_KEYS, PLAN_SETTING_KEYS, PLAN_SHEET_UNITS, PLAN_TRANSDUCER_KEYS, readParameters, readPlanOptions } from "../io/planOptions";
import { lotComparisonTable, lotVerdictTable, planStepTable, planSummaryTable, type SheetTable } from "../io/planTables";
import { DEFAULT_SHEET_UNITS as U, cellValue, choiceArg, grid, isBlank, keyFor, optionalText, readNumber, readRows, readSettingsRange, column, unitArg } from "./adapter";

/** Settings: two columns, name | value. */
function readSettings(range: unknown): Record<string, unknown> {
  return readSettingsRange(range, Object.keys(PLAN_SETTING_KEYS));
}

/** A table with a header row `name [unit]`; numbers get the header's unit as "value unit" text. */
function readEntries(range: unknown, argument: string, keys: readonly string[]): Record<string, unknown>[] {
  const rows = grid(range, argument);
  const header = (rows[0] as unknown[]).map((h, c) => {
    if (isBlank(h)) return null;
    const m = /^\s*([^[(]+?)\s*(?:[[(]\s*([^\])]*?)\s*[\])])?\s*$/.exec(String(h));
    return { key: keyFor(m?.[1] ?? String(h), keys, `${argument} header column ${c + 1}`), unit: m?.[2] };
  });
  return rows
    .slice(1)
    .filter((r) => r.some((c) => !isBlank(c)))
    .map((r, i) => {
      const entry: Record<string, unknown> = {};
      header.forEach((h, c) => {
        const v = cellValue(r[c], argument, `row ${i + 2}`);
        if (h === null || v === undefined) return;
        entry[h.key] = typeof v === "number" && h.unit !== undefined ? `${v} ${h.unit}` : v;
      });
      return entry;
    });
}

function toGrid(t: SheetTable): unknown[][] {
  const width = t.header.length;
  return [t.header, ...t.rows.map((r) => [...r, ...new Array<unknown>(width - r.length).fill("")])];
}

/** Arguments of RHEO.PLAN as Excel passes them. */
export interface PlanArgs {
  settings: unknown;
  dies: unknown;
  transducers: unknown;
  output?: unknown;
}

/** RHEO.PLAN (argument descriptions in functions.ts). */
export function planSheet(a: PlanArgs): unknown[][] {
  const output = choiceArg(a.output, "output", ["steps", "summary", "warnings"] as const, "steps");
  const raw = {
    ...readSettings(a.settings),
    dies: readEntries(a.dies, "dies", Object.keys(PLAN_DIE_KEYS)),
    transducers: readEntries(a.transducers, "transducers", Object.keys(PLAN_TRANSDUCER_KEYS)),
  };
  const parsed = readPlanOptions(raw, PLAN_SHEET_UNITS);
  const plan = planTest(parsed.input, parsed.options);
  if (output === "summary") return toGrid(planSummaryTable(plan));
  if (output === "warnings") {
    return [["code", "message"], ...(plan.warnings.length === 0 ? [["none", ""]] : plan.warnings.map((w) => [w.code, w.message]))];
  }
  return toGrid(planStepTable(plan));
}

/** Arguments of RHEO.LOTCHECK as Excel passes them. */
export interface LotCheckArgs {
  lotShearRate: unknown;
  lotViscosity: unknown;
  referenceShearRate?: unknown;
  reference: unknown;
  tolerance?: unknown;
  parameters?: unknown;
  viscosityUnit?: unknown;
  temperature?: unknown;
}

function isModelName(value: unknown): value is string | string[][] {
  const cell = Array.isArray(value) ? (value as unknown[][])[0]?.[0] : value;
  const single = !Array.isArray(value) || (value.length === 1 && ((value as unknown[][])[0]?.length ?? 0) === 1);
  return single && typeof cell === "string" && !/^[-+.\d]/.test(cell.trim());
}

/** RHEO.LOTCHECK (argument descriptions in functions.ts). */
export function lotCheckSheet(a: LotCheckArgs): unknown[][] {
  const unit = unitArg(a.viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
  const tolPercent = isBlank(a.tolerance) ? DEFAULT_LOT_COMPARISON_OPTIONS.tolerance * 100 : readNumber(a.tolerance, "tolerance", "the value");
  if (tolPercent === null || !(tolPercent > 0)) throw new RheoError("value", "tolerance", `must be a percentage above 0 (e.g. 10), got ${String(a.tolerance)}`);
  const lotRows = readRows([
    { argument: "lotShearRate", range: a.lotShearRate },
    { argument: "lotViscosity", range: a.lotViscosity, quantity: "viscosity", unit },
  ]);
  const lot = { shearRate: column(lotRows, "lotShearRate"), viscosity: column(lotRows, "lotViscosity") };
  let reference: LotReference;
  if (isModelName(a.reference)) {
    const model = optionalText(Array.isArray(a.reference) ? a.reference[0]?.[0] : a.reference, "reference", "");
    const parameters = readParameters(optionalText(Array.isArray(a.parameters) ? (a.parameters as unknown[][])[0]?.[0] : a.parameters, "parameters", ""), "parameters");
    const t = isBlank(a.temperature) ? null : readNumber(Array.isArray(a.temperature) ? (a.temperature as unknown[][])[0]?.[0] : a.temperature, "temperature", "the value");
    const rates = isBlank(a.referenceShearRate) || (Array.isArray(a.referenceShearRate) && (a.referenceShearRate as unknown[][]).every((r) => r.every(isBlank)))
      ? undefined
      : column(readRows([{ argument: "referenceShearRate", range: a.referenceShearRate }]), "referenceShearRate");
    reference = { kind: "model", model, parameters, shearRate: rates, temperature: t === null ? undefined : toSI(t, U.temperature, "temperature", "temperature") };
  } else {
    if (!isBlank(a.parameters)) throw new RheoError("value", "parameters", "applies only when reference is a model name");
    const refRows = readRows([
      { argument: "referenceShearRate", range: a.referenceShearRate },
      { argument: "reference", range: a.reference, quantity: "viscosity", unit },
    ]);
    reference = { kind: "table", shearRate: column(refRows, "referenceShearRate"), viscosity: column(refRows, "reference") };
  }
  const result = compareLot(reference, lot, { tolerance: tolPercent / 100 });
  const table = toGrid(lotComparisonTable(result, unit));
  const width = (table[0] as unknown[]).length;
  const pad = (r: unknown[]) => [...r, ...new Array<unknown>(width - r.length).fill("")];
  const verdict = lotVerdictTable(result);
  table.push(pad([]), pad(verdict.header), ...verdict.rows.map(pad), ...result.warnings.map((w) => pad([w.code, w.message])));
  return table;
}
