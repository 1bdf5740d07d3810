/**
 * One run of the pane: the mapped table through the shared reader, the core's reduction and the
 * model fits, with progress reported between steps. Pure apart from the optional `pause` that
 * lets a browser repaint; everything computed here is computed by src/core.
 */
import { RheoError, Warning } from "../core/errors";
import { runReduction as coreRunReduction, trueFlowCurve, type RunMasterFit, type RunShift } from "../core/run";
import type { JoinedFit } from "../core/joinedFit";
import { readRotationalTable } from "../io/rotationalTable";
import type { ReductionGroup, ReductionResult } from "../core/reduce";
import type { CompareResult } from "../core/fit";
import type { Verdict } from "../core/fit/verdict";
import { evaluateModel, type ModelId } from "../core/models";
import { readRawTable, RawTable } from "../io/rawTable";
import { COLUMN_QUANTITIES } from "../io/headers";
import { applyColumnChoices, ColumnChoice, DieEntry } from "./columns";
import { FIELD_OF_SETTING_KEY, FieldId, PaneSettings, readPaneSettings } from "./settings";
import { PaneFieldError, detailOf, sentence } from "./panelContract";

/** What the user picked in the Data step. */
export interface RunInput {
  /** the selected range or table, header row first, as Excel returns values */
  cells: unknown[][];
  columns: ColumnChoice[];
  dies: DieEntry[];
  /** where the data came from, for the method record (e.g. "Data!A1:F82") */
  sourceLabel: string;
  /**
   * the rotational curve's cells (header row first, as Excel returns them) when the settings name
   * one, read by the panel from the range or table given (the demo curve in preview mode)
   */
  rotational?: { cells: unknown[][]; label: string };
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
  /** the core's one verdict on the group (null when nothing was fitted) */
  verdict: Verdict | null;
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
  shift: RunShift | null;
  /** the fit across temperatures (null when not asked for) */
  master: RunMasterFit | null;
  /** the rotational curve joined to the capillary one and its fits (null when none was given) */
  joined: JoinedFit | null;
  /** every warning of the run (the core's one list): reading, reduction, fits, shift */
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
  const direct = byArgument[a] ?? FIELD_OF_SETTING_KEY[a];
  if (direct) return direct;
  // the rotational table's reader and the join name "rotational …" (a column, a cell, the curve)
  if (a.startsWith("rotational")) return "rotational";
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
    if (field === "run") return new PaneFieldError({ field, message: sentence(error.message) });
    // a column or cell of the rotational table: its header stays in the message (the field names only the range)
    const where = field === "rotational" ? error.argument.replace(/^rotational[.\s]*/, "") : "";
    return new PaneFieldError({ field, message: where === "" ? detailOf(error) : sentence(`${where}: ${error.row !== undefined ? `row ${error.row}: ` : ""}${error.detail}`) });
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

/** The charts' curves of a group's ranked fits: each model evaluated on a log grid over the group's true rates. */
function modelCurves(group: ReductionGroup, compare: CompareResult | null): ModelCurve[] {
  if (!compare || compare.ranked.length === 0) return [];
  const rates = trueFlowCurve(group).shearRate;
  const grid = logGrid(Math.min(...rates), Math.max(...rates), MODEL_CURVE_POINTS);
  return compare.ranked.map((r) => ({ model: r.model, shearRate: grid, viscosity: evaluateModel(r.model, r.result.parameters, grid) }));
}

/**
 * The rotational curve of a run through the shared table reader (src/io/rotationalTable.ts), its
 * errors named "rotational" (the field).
 * @throws RheoError("missing", "rotational") when the settings name a curve the panel did not read
 */
function readRotational(input: RunInput) {
  if (!input.rotational) throw new RheoError("missing", "rotational", "was not read: give a range or table name, or clear the field");
  return readRotationalTable(input.rotational.cells, { rowWord: "row", argument: "rotational" });
}

/**
 * Runs a whole reduction: the settings through the shared reader (every problem at once), the
 * column mapping, the shared table reader, then the core's one run (reduction, model ranking,
 * temperature shift, one warning list), reporting progress between steps.
 * @throws PaneFieldError naming the field(s) at fault (settings, mapping, data, die list).
 */
export async function runReduction(
  input: RunInput,
  settings: PaneSettings,
  onProgress: ProgressReporter = () => undefined,
  pause: () => Promise<void> = () => Promise.resolve(),
): Promise<RunOutput> {
  const { request, problems } = readPaneSettings(settings);
  if (problems.length > 0) throw new PaneFieldError(problems);
  try {
    onProgress("Reading the data", 0.05);
    await pause();
    const cells = applyColumnChoices(input.cells, input.columns, input.dies);
    const raw = readRawTable(cells, { rowWord: "row" });
    onProgress("Corrections, model fits and shift", 0.2);
    await pause();
    const rotational = request.input.rotational === undefined ? null : readRotational(input);
    const models = settings.models.length > 0 ? { compare: settings.models } : { compare: undefined, rank: false };
    const fits = { ...request.fits, ...models, ...(rotational ? { rotational: rotational.curve } : {}) };
    const run = coreRunReduction(raw.measurements, request.options, fits, [...raw.warnings, ...(rotational?.warnings ?? [])]);
    onProgress("Reduction done", 0.9);
    return {
      input,
      settings,
      raw,
      result: run.result,
      fits: run.result.groups.map((g, i) => {
        const c = run.comparisons?.[i];
        const compare = c && (c.ranked.length > 0 || c.failed.length > 0) ? { ranked: c.ranked, failed: c.failed } : null;
        return { compare, verdict: run.groupFits[i]?.verdict ?? null, curves: modelCurves(g, compare) };
      }),
      shift: run.shift ?? null,
      master: run.master ?? null,
      joined: run.joined ?? null,
      warnings: run.warnings,
    };
  } catch (error) {
    throw error instanceof RheoError ? toFieldError(error) : error;
  }
}
