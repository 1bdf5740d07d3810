/**
 * `rheoledger reduce FILE.csv [--json]`: reads a raw-data CSV, reduces it with the core and
 * prints readable tables (units shown) or one JSON document in SI units. A file with a `time`
 * column is a pressure recording (several may be given): its steps are detected first
 * (src/core/traceRun.ts) and their plateaus reduced.
 */
import { RheoError, Warning } from "../core/errors";
import { groupLabel, type ReductionGroup, type ReductionResult, type ReduceOptions } from "../core/reduce";
import { runReduction, type ReductionRun } from "../core/run";
import { parseCsv } from "../io/csv";
import { readRawTable } from "../io/rawTable";
import { CLI_SETTINGS_SOURCE, readReduceSettings, reduceSetting, reduceSettingOfFlag, type ReduceRequest } from "../io/reduceOptions";
import { reduceSettingFlags } from "../io/reduceSettingWords";
import { FlagSpec, ParsedArgs } from "./args";
import { num, resultTableText } from "./format";
import { reductionSummary } from "./summary";
import { flowCurveExtrasJson, groupExtrasJson, topExtrasJson } from "./methodFlags";
import { resultTables } from "../io/resultTables";
import { shiftSummary, withFitJson } from "./fitReport";
import type { TraceSteps } from "../core/steps/traceSteps";
import { runTraceReduction } from "../core/traceRun";
import { RECORDING_INPUT_FLAGS, isRecordingText, readBlankFile, readRecordings, recordingJson, refuseStepSettings, type InputFile } from "./recordingInput";
import type { CliIO } from "./io";

/** Flags of `reduce` that choose what is printed or written (not reduce settings). */
export const REDUCE_OUTPUT_FLAGS: Record<string, FlagSpec> = {
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  out: { value: true, description: "also write the results workbook (xlsx: summary, Bagley, flow curve, fits, warnings) to FILE" },
  summary: { value: false, description: "print a short summary (with model fits) instead of the full tables" },
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

/** Reads CSV text into measurements (errors name the file's line and column). */
export function readCsvMeasurements(text: string, input: ReduceRequest["input"]) {
  const csv = parseCsv(text);
  const cells = csv.lines.map((l) => l.cells);
  const first = csv.lines[0];
  if (!first) throw new RheoError("missing", "file", "is empty");
  return readRawTable(cells, {
    rowWord: "line",
    headerNumber: first.line,
    rowNumbers: csv.lines.map((l) => l.line),
    decimalComma: csv.decimalComma,
    barrelDiameter: input.barrelDiameter,
    density: input.density,
  });
}

/**
 * The JSON document of a reduction, SI units (the contract in docs/cli.md). From a pressure
 * recording each group also has "steps" and the top level "thermalChecks" (and
 * "stepsWithoutGroup" when a die run joined no group).
 */
export function reductionJson(result: ReductionResult, warnings: Warning[], steps?: TraceSteps) {
  const recording = steps ? recordingJson(result, steps) : null;
  return {
    units: { pressure: "Pa", length: "m", time: "s", temperature: "K", viscosity: "Pa.s", shearRate: "1/s" },
    groups: result.groups.map((g, i) => ({
      temperature: g.temperature,
      dieDiameter: g.dieDiameter,
      dies: g.dies.map((d) => ({ dieLength: d.dieLength, lengthOverRadius: d.lengthOverRadius, points: d.points })),
      bagley: g.bagley.map((b) => ({
        shearRateApparent: b.shearRateApparent,
        wallShearStress: b.wallShearStress,
        entrancePressure: b.entrancePressure,
        endCorrection: b.endCorrection,
        r2: b.r2,
        diesUsed: b.diesUsed,
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
  return `== ${groupLabel(g)}; dies: ${g.dies.map((d) => `L ${num(d.dieLength * 1e3)} mm (${ratio} ${num(d.dieLength / bore)})`).join(", ")}`;
}

/**
 * Readable tables of a run (src/io/resultTables.ts): per group a heading and its tables, then the
 * tables across groups; warnings apart ({@link warningsText}).
 */
export function reductionText(run: ReductionRun): string {
  const tables = resultTables(run).filter((t) => t.id !== "groups" && t.id !== "warnings");
  const out: string[] = [];
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
 * Runs `reduce` on the files already read: one point table, or one or more pressure recordings.
 * @param io reads the `--blank` file
 */
export function runReduce(files: InputFile[], args: ParsedArgs, io?: CliIO): CommandOutput {
  const request = reduceRequestFromFlags(args);
  const first = files[0];
  if (!first) throw new RheoError("missing", "file", "give a CSV file");
  const wantsRanking = args.flags.has("summary") || args.flags.has("out");
  const fits = { ...request.fits, rank: wantsRanking };
  const blankFile = args.flags.get("blank");
  let run: ReductionRun;
  let inputWarnings: Warning[];
  if (isRecordingText(first.text)) {
    const recordings = readRecordings(files, request.input);
    const blank = typeof blankFile === "string" && io ? readBlankFile(io, blankFile) : undefined;
    inputWarnings = [...recordings.warnings, ...(blank?.warnings ?? [])];
    try {
      run = runTraceReduction(recordings.runs, request.steps, request.options, fits, inputWarnings, blank?.blank);
    } catch (e) {
      throw asFlagError(e);
    }
  } else {
    if (files.length > 1) throw new RheoError("value", (files[1] as InputFile).name, `only pressure recordings (files with a "time [s]" column) are read several at a time; ${first.name} is a point table`);
    refuseStepSettings(request, first.name);
    if (typeof blankFile === "string") throw new RheoError("value", "--blank", `subtracts barrel friction from pressure recordings (a file with a "time [s]" column); ${first.name} is a point table`, undefined, "SETTING_NOT_USED_HERE");
    const raw = readCsvMeasurements(first.text, request.input);
    inputWarnings = raw.warnings;
    try {
      run = runReduction(raw.measurements, request.options, fits, raw.warnings);
    } catch (e) {
      throw asFlagError(e);
    }
  }
  const result = run.result;
  const stdout = args.flags.has("json")
    ? JSON.stringify(withFitJson(reductionJson(result, run.warnings, run.steps), run), null, 2) + "\n"
    : args.flags.has("summary")
      ? reductionSummary(run) + shiftSummary(run)
      : reductionText(run) + warningsText(run.warnings);
  return { stdout, run, result, options: request.options, request, inputWarnings };
}
