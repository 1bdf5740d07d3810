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
import { COLUMN_QUANTITIES } from "../io/headers";
import { applyColumnChoices, ColumnChoice, DieEntry } from "./columns";
import { FieldError, FieldId, PaneSettings, reduceOptionsOf, validateSettings } from "./settings";
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

/** A failure meant for one field of the pane. */
export class PaneError extends Error {
  readonly field: FieldId;
  constructor(field: FieldId, message: string) {
    super(message);
    this.name = "PaneError";
    this.field = field;
  }
}

/**
 * The pane field a core or reader error concerns: bad cells → the data source; column problems →
 * the mapping; die list problems → the die list; a single die length → the end-correction choice;
 * option errors → their control.
 */
export function fieldOfError(error: RheoError): FieldId {
  const a = error.argument;
  if (a === "dies") return "dies";
  if (a === "dieLength" && /single die length|at least two lengths/.test(error.message)) return "endCorrection";
  if (a === "method") return "rabinowitschMethod";
  if (a === "degree") return "rabinowitschDegree";
  if (a === "window") return "rabinowitschWindow";
  if (a === "model" || a === "models") return "models";
  if (a === "temperatureShift" || /^curves/.test(a)) return "temperatureShift";
  if (a === "referenceTemperature") return "referenceTemperatureC";
  if (/temperatureCoefficient$/.test(a)) return "heatingTemperatureCoefficient";
  if (a === "density") return "heatingDensity";
  if (a === "heatCapacity") return "heatingHeatCapacity";
  if (a === "conductivity") return "heatingConductivity";
  if (a === "fullScale") return "transducerRangeBar";
  if (a === "accuracy") return "transducerAccuracyPercent";
  if (a === "dieDiameter" && /slip/.test(error.message)) return "checks";
  if (a === "dieLength" && /orifice/.test(error.message)) return "endCorrection";
  if (/\b(row|line) \d+/.test(error.message)) return "source";
  if (a === "data" || a === "measurements") return "source";
  if (a === "columns" || a === "header" || /^column \d+/.test(a) || a in COLUMN_QUANTITIES) return "columns";
  return "run";
}

/** The error as a message for one field, in plain words. */
export function toFieldError(error: unknown): FieldError {
  if (error instanceof PaneError) return { field: error.field, message: error.message };
  if (error instanceof RheoError) return { field: fieldOfError(error), message: sentence(error.message) };
  return { field: "run", message: `Unexpected problem: ${error instanceof Error ? error.message : String(error)}` };
}

function sentence(text: string): string {
  const t = text.trim();
  return (t.charAt(0).toUpperCase() + t.slice(1)).replace(/([^.])$/, "$1.");
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
    return { fits: { compare: null, curves: [] }, warnings: [warning("FIT_SKIPPED", `${label}: only ${rows.length} corrected point(s); no model was fitted.`)] };
  }
  const data = { shearRate: rows.map((r) => r.shearRateWall as number), viscosity: rows.map((r) => r.viscosity as number) };
  const compare = compareModels(models, data);
  const warnings: Warning[] = [];
  for (const f of compare.failed) warnings.push(warning("FIT_FAILED", `${label}: ${f.model} was not fitted (${f.reason}).`));
  for (const r of compare.ranked) warnings.push(...r.result.warnings.map((w) => warning(w.code, `${label}, ${r.model}: ${w.message}`)));
  const grid = logGrid(Math.min(...data.shearRate), Math.max(...data.shearRate), MODEL_CURVE_POINTS);
  const curves = compare.ranked.map((r) => ({ model: r.model, shearRate: grid, viscosity: evaluateModel(r.model, r.result.parameters, grid) }));
  return { fits: { compare, curves }, warnings };
}

/**
 * Runs a whole reduction: settings check, column mapping, reading, the core's reduction with the
 * chosen checks (its transducer check included), the temperature shift, and model fits per group, reporting progress and pausing between groups.
 * @throws PaneError naming the field at fault (settings, mapping, data, die list).
 */
export async function runReduction(
  input: RunInput,
  settings: PaneSettings,
  onProgress: ProgressReporter = () => undefined,
  pause: () => Promise<void> = () => Promise.resolve(),
): Promise<RunOutput> {
  const invalid = validateSettings(settings)[0];
  if (invalid) throw new PaneError(invalid.field, invalid.message);
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
    if (error instanceof RheoError) {
      const f = toFieldError(error);
      throw new PaneError(f.field, f.message);
    }
    throw error;
  }
}
