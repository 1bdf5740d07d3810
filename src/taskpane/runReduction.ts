/**
 * One run of the pane: the mapped table through the shared reader, the core's reduction and the
 * model fits, with progress reported between steps. Pure apart from the optional `pause` that
 * lets a browser repaint; everything computed here is computed by src/core.
 */
import { RheoError, Warning, warning } from "../core/errors";
import { reduce, ReductionGroup, ReductionResult } from "../core/reduce";
import { compareModels, type CompareResult } from "../core/fit";
import { evaluateModel, type ModelId } from "../core/models";
import { readRawTable, RawTable } from "../io/rawTable";
import { modelName } from "../io/displayNames";
import { COLUMN_QUANTITIES } from "../io/headers";
import { applyColumnChoices, ColumnChoice, DieEntry } from "./columns";
import { FieldId, PaneSettings, reduceOptionsOf, validateSettings } from "./settings";
import { PaneFieldError, detailOf, sentence } from "./panelContract";
import { ShiftOutput, shiftRun } from "./temperatureShift";

/** What the user picked in the Data step. */
export interface RunInput {
  /** the selected range or table, header row first, as Excel returns values */
  cells: unknown[][];
  columns: ColumnChoice[];
  dies: DieEntry[];
  /** where the data came from, for the method record (e.g. "Data!A1:F82") */
  sourceLabel: string;
}

/** A fitted model's viscosity on a smooth grid, for the charts. */
export interface ModelCurve {
  model: ModelId;
  shearRate: number[];
  viscosity: number[];
}

/** The fits of one group (null when no model was chosen or the curve has too few points). */
export interface GroupFits {
  compare: CompareResult | null;
  curves: ModelCurve[];
}

/** Everything a run produced, SI units. */
export interface RunOutput {
  input: RunInput;
  settings: PaneSettings;
  raw: RawTable;
  result: ReductionResult;
  /** aligned with result.groups */
  fits: GroupFits[];
  /** the temperature shift (null when not asked for) */
  shift: ShiftOutput | null;
  /** every warning of the run: reading, reduction (transducer range included), shift, fits */
  warnings: Warning[];
}

/** Called between steps: a short description and the fraction done (0–1). */
export type ProgressReporter = (step: string, fraction: number) => void;

/** Points on each model curve in the charts. */
export const MODEL_CURVE_POINTS = 24;

/**
 * The pane field a core or reader error concerns, read from its structured fields (argument, row),
 * never from its wording: a cell of the data (a row, or a column's value) → the data source;
 * a column or header problem → the column mapping; the die list → the die list; die lengths (the
 * end correction's needs) → the end-correction choice; die bores (the slip check's needs) → the
 * optional checks; an option → its control.
 */
export function fieldOfError(error: RheoError): FieldId {
  const a = error.argument;
  const byArgument: Record<string, FieldId> = {
    dies: "dies",
    dieLength: "endCorrection",
    endCorrection: "endCorrection",
    orificePressure: "endCorrection",
    dieDiameter: "slip",
    method: "rabinowitschMethod",
    degree: "rabinowitschDegree",
    window: "rabinowitschWindow",
    model: "models",
    models: "models",
    temperatureShift: "temperatureShift",
    referenceTemperature: "referenceTemperatureC",
    "heating.temperatureCoefficient": "heatingTemperatureCoefficient",
    temperatureCoefficient: "heatingTemperatureCoefficient",
    density: "heatingDensity",
    heatCapacity: "heatingHeatCapacity",
    conductivity: "heatingConductivity",
    fullScale: "transducerRangeBar",
    accuracy: "transducerAccuracyPercent",
    data: "source",
    measurements: "source",
    columns: "columns",
    header: "columns",
  };
  const direct = byArgument[a];
  if (direct) return direct;
  if (a.startsWith("curves")) return "temperatureShift";
  // a value in a data cell: the reader names it "<header> (column N)" or "row N" / "line N"
  if (error.row !== undefined || /\(column \d+\)$/.test(a) || /^(row|line) \d+$/.test(a)) return "source";
  if (/^column \d+$/.test(a) || a in COLUMN_QUANTITIES) return "columns";
  return "run";
}

/** The error as problems for the pane's fields, in plain words (the field's label names it). */
export function toFieldError(error: unknown): PaneFieldError {
  if (error instanceof PaneFieldError) return error;
  if (error instanceof RheoError) {
    const field = fieldOfError(error);
    // a failure not tied to one field keeps the argument's name in its message
    return new PaneFieldError({ field, message: field === "run" ? sentence(error.message) : detailOf(error) });
  }
  return new PaneFieldError({ field: "run", message: `Unexpected problem: ${error instanceof Error ? error.message : String(error)}` });
}

import { groupLabel } from "../core/grouping";
export { groupLabel };

function logGrid(lo: number, hi: number, n: number): number[] {
  if (!(hi > lo)) return [lo];
  const a = Math.log(lo);
  const b = Math.log(hi);
  return Array.from({ length: n }, (_, i) => Math.exp(a + ((b - a) * i) / (n - 1)));
}

function fitGroup(group: ReductionGroup, models: readonly ModelId[]): { fits: GroupFits; warnings: Warning[] } {
  const rows = group.flowCurve.filter((r) => r.shearRateWall !== null && r.viscosity !== null);
  const label = groupLabel(group);
  if (models.length === 0) return { fits: { compare: null, curves: [] }, warnings: [] };
  if (rows.length < 3) {
    return { fits: { compare: null, curves: [] }, warnings: [warning("FIT_SKIPPED", `${label}: only ${rows.length} corrected point(s); no model was fitted.`, label)] };
  }
  const data = { shearRate: rows.map((r) => r.shearRateWall as number), viscosity: rows.map((r) => r.viscosity as number) };
  const compare = compareModels(models, data);
  const warnings: Warning[] = [];
  for (const f of compare.failed) warnings.push(warning("FIT_FAILED", `${label}: ${modelName(f.model)} was not fitted (${f.reason}).`, label));
  for (const r of compare.ranked) warnings.push(...r.result.warnings.map((w) => warning(w.code, `${label}, ${modelName(r.model)}: ${w.message}`, label)));
  const grid = logGrid(Math.min(...data.shearRate), Math.max(...data.shearRate), MODEL_CURVE_POINTS);
  const curves = compare.ranked.map((r) => ({ model: r.model, shearRate: grid, viscosity: evaluateModel(r.model, r.result.parameters, grid) }));
  return { fits: { compare, curves }, warnings };
}

/**
 * Runs a whole reduction: settings check, column mapping, reading, the core's reduction with the
 * chosen checks (its transducer check included), the temperature shift, and model fits per group, reporting progress and pausing between groups.
 * @throws PaneFieldError naming the field(s) at fault (settings, mapping, data, die list).
 */
export async function runReduction(
  input: RunInput,
  settings: PaneSettings,
  onProgress: ProgressReporter = () => undefined,
  pause: () => Promise<void> = () => Promise.resolve(),
): Promise<RunOutput> {
  const invalid = validateSettings(settings);
  if (invalid.length > 0) throw new PaneFieldError(invalid);
  try {
    onProgress("Reading the data", 0.05);
    await pause();
    const cells = applyColumnChoices(input.cells, input.columns, input.dies);
    const raw = readRawTable(cells, { rowWord: "row" });
    onProgress("Bagley and Rabinowitsch corrections", 0.2);
    await pause();
    const result = reduce(raw.measurements, reduceOptionsOf(settings));
    const warnings: Warning[] = [...raw.warnings, ...result.warnings];
    let shift: ShiftOutput | null = null;
    if (settings.temperatureShift !== "none") {
      onProgress("Temperature shift", 0.25);
      await pause();
      shift = shiftRun(result.groups, settings.temperatureShift, settings.referenceTemperatureC);
      warnings.push(...shift.fit.warnings.map((w) => warning(w.code, `Temperature shift: ${w.message}`)));
    }
    const fits: GroupFits[] = [];
    for (const [i, group] of result.groups.entries()) {
      onProgress(`Fitting models: group ${i + 1} of ${result.groups.length}`, 0.3 + (0.6 * i) / result.groups.length);
      await pause();
      const f = fitGroup(group, settings.models);
      fits.push(f.fits);
      warnings.push(...f.warnings);
    }
    onProgress("Reduction done", 0.9);
    return { input, settings, raw, result, fits, shift, warnings };
  } catch (error) {
    throw error instanceof RheoError ? toFieldError(error) : error;
  }
}
