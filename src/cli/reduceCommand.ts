/**
 * `rheoledger reduce FILE [--json]`: reads a raw-data CSV or workbook sheet (reduceInput.ts),
 * reduces it with the core and prints readable tables (units shown) or one JSON document in SI
 * units. A file with a `time` column is a pressure recording (several may be given): its steps
 * are detected first (src/core/traceRun.ts) and their plateaus reduced.
 */
import { RheoError, Warning } from "../core/errors";
import { groupLabel, type ReductionGroup, type ReductionResult, type ReduceOptions } from "../core/reduce";
import { runReduction, type ReductionRun } from "../core/run";
import { rowAccountText, withReduction } from "../core/rowAccount";
import type { ReduceInput } from "./reduceInput";
import { parseCsv } from "../io/csv";
import { readRotationalTable } from "../io/rotationalTable";
import type { RotationalCurve } from "../core/rotationalJoin";
import { readInputText } from "./io";
import { CLI_SETTINGS_SOURCE, readReduceSettings, reduceSetting, reduceSettingOfFlag, type ReduceRequest } from "../io/reduceOptions";
import { reduceSettingFlags } from "../io/reduceSettingWords";
import { FlagSpec, ParsedArgs } from "./args";
import { num, resultTableText } from "./format";
import { reductionSummary } from "./summary";
import { flowCurveExtrasJson, groupExtrasJson, topExtrasJson } from "./methodFlags";
import { CHART_DATA_TABLES, resultTables } from "../io/resultTables";
import { shiftSummary, withFitJson } from "./fitReport";
import type { TraceSteps } from "../core/steps/traceSteps";
import { runTraceReduction } from "../core/traceRun";
import { RECORDING_INPUT_FLAGS, readBlankFile, readRecordings, recordingJson, refuseStepSettings, type InputFile } from "./recordingInput";
import type { CliIO } from "./io";

/** Flags of `reduce` that choose what is read, printed or written (not reduce settings). */
export const REDUCE_OUTPUT_FLAGS: Record<string, FlagSpec> = {
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  out: { value: true, description: "also write the results workbook (xlsx: every table, charts, method record) to FILE.xlsx" },
  report: { value: true, description: "also write a self-contained HTML report (tables, charts, method record; prints to PDF) to FILE.html" },
  meta: { value: true, description: "JSON file of test-report items for the method record (material, conditioning, preheatTime, dieEntryAngle, ...; docs/workbooks.md)" },
  force: { value: false, description: "replace an existing --out or --report file (never an input file, never through a link)" },
  summary: { value: false, description: "print a short summary (with model fits) instead of the full tables" },
  sheet: { value: true, description: "the sheet of an .xlsx input to read (default: the first sheet)" },
};

/** Every flag of `reduce`: the reduce settings (src/io/reduceOptions.ts) and the output flags. */
export const REDUCE_FLAGS: Record<string, FlagSpec> = { ...reduceSettingFlags(), ...RECORDING_INPUT_FLAGS, ...REDUCE_OUTPUT_FLAGS };

/** What a command hands back: text for standard output, and the data it printed. */
export interface CommandOutput {
  stdout: string;
  run: ReductionRun;
  result: ReductionResult;
  options: Partial<ReduceOptions>;
  request: ReduceRequest;
  /** warnings from reading the file */
  inputWarnings: Warning[];
  /** the table read, with its row account and description */
  input?: ReduceInput;
  /** wall time of the core's run (reduction, and fits when asked), ms (for `npm run bench`) */
  coreMs: number;
  /** wall time of building the standard-output text (JSON, summary or tables), ms (for `npm run bench`) */
  formatMs?: number;
}

/** The reduce settings given as flags, by setting key (output flags left out). */
export function settingsFromFlags(args: ParsedArgs): Record<string, string | boolean> {
  const out: Record<string, string | boolean> = {};
  for (const [flag, value] of args.flags) {
    const spec = reduceSettingOfFlag(flag);
    if (spec) out[spec.key] = value;
  }
  return out;
}

/** Reduce request from the command-line flags. @throws RheoError naming the flag */
export function reduceRequestFromFlags(args: ParsedArgs): ReduceRequest {
  return readReduceSettings(settingsFromFlags(args), CLI_SETTINGS_SOURCE);
}

/** A core error about a setting, re-addressed to its flag ("shift" → "--shift"). */
export function asFlagError(e: unknown): unknown {
  if (!(e instanceof RheoError)) return e;
  try {
    return e.retarget({ argument: CLI_SETTINGS_SOURCE.nameOf(reduceSetting(e.argument)) });
  } catch {
    return e;
  }
}

/**
 * The JSON document of a reduction, SI units (the contract in docs/cli.md). From a pressure
 * recording each group also has "steps" and the top level "thermalChecks" (and
 * "stepsWithoutGroup" when a die run joined no group).
 */
export function reductionJson(result: ReductionResult, warnings: Warning[], input?: ReduceInput, steps?: TraceSteps) {
  const recording = steps ? recordingJson(result, steps) : null;
  return {
    units: { pressure: "Pa", length: "m", time: "s", temperature: "K", viscosity: "Pa.s", shearRate: "1/s" },
    ...(input ? { input: { ...input.format, decimalMark: input.decimalMark } } : {}),
    rows: input ? withReduction(input.rows, result.rows) : result.rows,
    groups: result.groups.map((g, i) => ({
      temperature: g.temperature,
      ...(g.temperatureSpread !== undefined ? { temperatureSpread: g.temperatureSpread, temperatureReadings: g.temperatureReadings } : {}),
      dieDiameter: g.dieDiameter,
      dies: g.dies.map((d) => ({ dieLength: d.dieLength, lengthOverRadius: d.lengthOverRadius, points: d.points, steps: d.steps })),
      bagley: g.bagley.map((b) => ({
        shearRateApparent: b.shearRateApparent,
        wallShearStress: b.wallShearStress,
        entrancePressure: b.entrancePressure,
        endCorrection: b.endCorrection,
        r2: b.r2,
        diesUsed: b.diesUsed,
        interpolated: b.points.filter((p) => p.interpolated).length,
        curvature: b.curvature,
      })),
      flowCurve: g.flowCurve.map((f, i) => ({
        shearRateApparent: f.shearRateApparent,
        wallShearStress: f.wallShearStress,
        nPrime: f.nPrime,
        shearRateWall: f.shearRateWall,
        viscosity: f.viscosity,
        viscosityApparent: f.viscosityApparent,
        ...flowCurveExtrasJson(g, i),
      })),
      ...groupExtrasJson(g),
      smoother: g.smoother,
      stability: g.stability,
      flagged: g.flagged,
      rows: g.rows,
      ...(recording ? { steps: recording.groupSteps[i] ?? [] } : {}),
      warnings: g.warnings,
    })),
    ...topExtrasJson(result),
    ...(recording ? recording.top : {}),
    warnings,
  };
}

/** The heading line of a group: its label and dies. */
function groupHeading(g: ReductionGroup): string {
  const ratio = g.geometry === "slit" ? "L/H" : "L/D";
  const bore = g.geometry === "slit" ? (g.slitHeight as number) : g.dieDiameter;
  return `== ${groupLabel(g)}${temperatureNote(g)}; dies: ${g.dies.map((d) => `L ${num(d.dieLength * 1e3)} mm (${ratio} ${num(d.dieLength / bore)})`).join(", ")}`;
}

/** " (mean of 3 readings, 189.8–190.3 °C)" after a group's label; "" for one repeated reading. */
function temperatureNote(g: ReductionGroup): string {
  const r = g.temperatureReadings;
  if (!r || r.max === r.min) return "";
  return ` (mean of ${r.count} readings, ${num(r.min - 273.15)}–${num(r.max - 273.15)} °C)`;
}

/**
 * "Input: data.csv (UTF-8 text, comma-separated); 42 lines read: 40 used, 2 merged as a repeated
 * reading." The reader's account with the reduction's skips (when a result is given).
 */
export function inputText(input: ReduceInput, result?: ReductionResult): string {
  const rows = result ? withReduction(input.rows, result.rows) : input.rows;
  return `Input: ${input.description}; ${rowAccountText(rows, input.format.kind === "csv" ? "line" : "row")}`;
}

/**
 * Readable tables of a run (src/io/resultTables.ts): per group a heading and its tables, then the
 * tables across groups; warnings apart ({@link warningsText}).
 */
export function reductionText(run: ReductionRun, input?: ReduceInput): string {
  const tables = resultTables(run).filter((t) => t.id !== "groups" && t.id !== "warnings" && !CHART_DATA_TABLES.has(t.id));
  const out: string[] = [];
  if (input) out.push(inputText(input, run.result), "");
  for (const g of run.result.groups) {
    out.push(groupHeading(g), "");
    for (const t of tables.filter((x) => x.scope === groupLabel(g))) out.push(resultTableText({ ...t, scope: undefined }), "");
  }
  for (const t of tables.filter((x) => x.scope === undefined)) out.push(resultTableText(t), "");
  return out.join("\n");
}

/** Every warning of the run, most serious first within the order they were raised. */
export function warningsText(warnings: Warning[]): string {
  if (warnings.length === 0) return "No warnings.\n";
  const rank = { serious: 0, caution: 1, info: 2 } as const;
  const sorted = [...warnings].sort((a, b) => rank[a.severity] - rank[b.severity]);
  return ["Warnings", ...sorted.map((w) => `  [${w.severity}] [${w.code}] ${w.message}`)].join("\n") + "\n";
}

/**
 * Reads the `--rotational FILE.csv` curve (src/io/rotationalTable.ts), decoded like any input
 * text; errors name the flag, the file's line and column.
 */
export function readRotationalFile(path: string, io: CliIO): { curve: RotationalCurve; warnings: Warning[] } {
  const { text, warnings } = readInputText(io, path);
  const csv = parseCsv(text, path);
  const first = csv.lines[0];
  if (!first) throw new RheoError("missing", "--rotational", `${path} is empty`);
  const table = readRotationalTable(
    csv.lines.map((l) => l.cells),
    { rowWord: "line", headerNumber: first.line, rowNumbers: csv.lines.map((l) => l.line), argument: "--rotational", decimalMark: csv.delimiter === "," ? "." : undefined },
  );
  return { curve: table.curve, warnings: [...warnings, ...table.warnings] };
}

/**
 * Runs `reduce` on the table read from the input file (reduceInput.ts), with the request read from
 * the flags ({@link reduceRequestFromFlags}; its input part was used to read the table).
 */
export function runReduce(
  raw: ReduceInput,
  args: ParsedArgs,
  request: ReduceRequest = reduceRequestFromFlags(args),
  rotational?: { curve: RotationalCurve; warnings: Warning[] },
): CommandOutput {
  refuseStepSettings(request, raw.description);
  if (typeof args.flags.get("blank") === "string") throw new RheoError("value", "--blank", `subtracts barrel friction from pressure recordings (a file with a "time [s]" column); ${raw.description} is a point table`, undefined, "SETTING_NOT_USED_HERE");
  const inputWarnings = [...raw.warnings, ...(rotational?.warnings ?? [])];
  let run: ReductionRun;
  const started = performance.now();
  try {
    run = runReduction(raw.measurements, request.options, { ...request.fits, rank: wantsRanking(args), ...(rotational ? { rotational: rotational.curve } : {}) }, inputWarnings);
  } catch (e) {
    throw asFlagError(e);
  }
  const coreMs = performance.now() - started;
  return output(run, args, request, raw, coreMs);
}

/** Model ranking is needed by the summary and by the written files. */
function wantsRanking(args: ParsedArgs): boolean {
  return args.flags.has("summary") || args.flags.has("out") || args.flags.has("report");
}

/**
 * Runs `reduce` on one or more pressure recordings (files with a time column): steps detected,
 * their plateaus reduced (src/core/traceRun.ts).
 * @param io reads the `--blank` file
 */
export function runRecordingReduce(files: InputFile[], args: ParsedArgs, io: CliIO, request: ReduceRequest = reduceRequestFromFlags(args)): CommandOutput {
  const blankFile = args.flags.get("blank");
  const recordings = readRecordings(files, request.input);
  const blank = typeof blankFile === "string" ? readBlankFile(io, blankFile) : undefined;
  const rotational = request.input.rotational !== undefined ? readRotationalFile(request.input.rotational, io) : undefined;
  const inputWarnings = [...recordings.warnings, ...(blank?.warnings ?? []), ...(rotational?.warnings ?? [])];
  let run: ReductionRun;
  const started = performance.now();
  try {
    run = runTraceReduction(recordings.runs, request.steps, request.options, { ...request.fits, rank: wantsRanking(args), ...(rotational ? { rotational: rotational.curve } : {}) }, inputWarnings, blank?.blank);
  } catch (e) {
    throw asFlagError(e);
  }
  return output(run, args, request, undefined, performance.now() - started);
}

function output(run: ReductionRun, args: ParsedArgs, request: ReduceRequest, raw: ReduceInput | undefined, coreMs: number): CommandOutput {
  const result = run.result;
  const started = performance.now();
  const stdout = args.flags.has("json")
    ? JSON.stringify(withFitJson(reductionJson(result, run.warnings, raw, run.steps), run), null, 2) + "\n"
    : args.flags.has("summary")
      ? reductionSummary(run, raw ? withReduction(raw.rows, result.rows) : undefined) + shiftSummary(run)
      : reductionText(run, raw) + warningsText(run.warnings);
  return { stdout, run, result, options: request.options, request, inputWarnings: run.warnings.filter((w) => w.scope === "input"), input: raw, coreMs, formatMs: performance.now() - started };
}
