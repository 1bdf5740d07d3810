/**
 * Pressure recordings on the command line: which input files are recordings (a `time` column),
 * reading several of them into one list of die runs, the blank run of `--blank FILE`, and the
 * JSON of steps (SI units).
 */
import { RheoError } from "../core/errors";
import type { Warning } from "../core/errors";
import type { BlankPoint } from "../core/steps/friction";
import type { RunSteps, TraceRun, TraceStep } from "../core/steps/runSteps";
import type { TraceSteps } from "../core/steps/traceSteps";
import { runsByGroup } from "../core/steps/groupSteps";
import { DEFAULT_REDUCE_OPTIONS, type ReductionResult } from "../core/reduce";
import { parseCsv } from "../io/csv";
import { isTraceHeader, readBlankTable, readTraceTable } from "../io/traceTable";
import { stepNote } from "../io/stepRecord";
import type { ReduceRequest } from "../io/reduceOptions";
import { CLI_SETTINGS_SOURCE, reduceSetting } from "../io/reduceOptions";
import type { CliIO } from "./io";
import { inputSource, readInputFile, readInputText } from "./io";
import { findCsvHeader } from "../io/rawInput";
import type { FlagSpec } from "./args";

/** Command-line flags of recordings that are inputs, not reduce settings. */
export const RECORDING_INPUT_FLAGS: Record<string, FlagSpec> = {
  blank: { value: true, description: "pressure recordings of a force instrument: a blank run (force against piston speed, no die) whose barrel friction is subtracted" },
};

/** One input file's text and name. */
export interface InputFile {
  name: string;
  text: string;
}

/** True when the file's first header line has a time column. */
export function isRecordingText(text: string): boolean {
  const first = parseCsv(text).lines[0];
  return first !== undefined && isTraceHeader(first.cells);
}

function cellsOf(text: string, name: string) {
  const csv = parseCsv(text);
  const first = csv.lines[0];
  if (!first) throw new RheoError("missing", name, "is empty");
  return { cells: csv.lines.map((l) => l.cells), headerNumber: first.line, rowNumbers: csv.lines.map((l) => l.line), decimalMark: csv.delimiter === "," ? ("." as const) : undefined };
}

/** Re-addresses a reading error to the file: "a.csv: pressure [bar] (column 3): line 7 …". */
function inFile<T>(name: string, several: boolean, call: () => T): T {
  try {
    return call();
  } catch (e) {
    if (e instanceof RheoError && several) throw e.retarget({ argument: `${name}: ${e.argument}` });
    throw e;
  }
}

/**
 * Reads every recording file into die runs (in file order; each file's runs numbered on).
 * @throws RheoError naming the file (when there are several), the column and the line
 */
export function readRecordings(files: InputFile[], input: ReduceRequest["input"]): { runs: TraceRun[]; warnings: Warning[] } {
  const runs: TraceRun[] = [];
  const warnings: Warning[] = [];
  const several = files.length > 1;
  for (const f of files) {
    if (!isRecordingText(f.text)) throw new RheoError("value", f.name, 'is not a pressure recording (no "time [s]" column); several files are read only as recordings, one point table at a time');
    const table = inFile(f.name, several, () => {
      const c = cellsOf(f.text, f.name);
      return readTraceTable(c.cells, { rowWord: "line", headerNumber: c.headerNumber, rowNumbers: c.rowNumbers, decimalMark: c.decimalMark, barrelDiameter: input.barrelDiameter, source: f.name });
    });
    runs.push(...table.runs);
    warnings.push(...table.warnings.map((w) => (several ? { ...w, message: `${f.name}: ${w.message}`, scope: f.name } : w)));
  }
  return { runs, warnings };
}

/** Reads the blank run of `--blank FILE` (a recording, or steady points). */
export function readBlankFile(io: CliIO, name: string): { blank: TraceRun | BlankPoint[]; warnings: Warning[] } {
  const text = readInputFile(io, name);
  const table = inFile(name, true, () => {
    const c = cellsOf(text, name);
    return readBlankTable(c.cells, { rowWord: "line", headerNumber: c.headerNumber, rowNumbers: c.rowNumbers, decimalMark: c.decimalMark, source: name });
  });
  return { blank: table.kind === "recording" ? table.run : table.points, warnings: table.warnings.map((w) => ({ ...w, message: `--blank ${name}: ${w.message}`, scope: "blank" })) };
}

/** Refuses step settings given with a point table (they would do nothing). */
export function refuseStepSettings(request: ReduceRequest, file: string): void {
  const key = Object.keys(request.steps)[0];
  if (key !== undefined) {
    throw new RheoError("value", CLI_SETTINGS_SOURCE.nameOf(reduceSetting(key)), `applies to pressure recordings (a file with a "time [s]" column); ${file} is a point table`, undefined, "SETTING_NOT_USED_HERE");
  }
}

/** One step as the JSON of `reduce` gives it per group (SI; the keys of the contract). */
export function stepJson(run: RunSteps, s: TraceStep) {
  return { dieLength: run.die?.dieLength ?? null, pistonSpeed: s.pistonSpeed, pressure: s.pressure, pressureStd: s.pressureStd, start: s.start, end: s.end, steady: s.steady };
}

/** A step with everything the step detection knows (the JSON of `rheoledger steps`). */
export function stepDetailJson(run: RunSteps, s: TraceStep) {
  return {
    ...stepJson(run, s),
    step: s.step,
    role: s.role,
    used: s.used,
    stepStart: s.stepStart,
    stepEnd: s.stepEnd,
    samples: s.samples,
    friction: s.friction,
    drift: s.drift,
    driftAllowed: s.driftAllowed,
    timeConstant: s.timeConstant,
    timeConstantSource: s.timeConstantSource,
    transient: s.transient,
    oscillation: s.oscillation,
    window: s.window,
    ...(s.detected ? { detected: s.detected } : {}),
    note: stepNote(s),
  };
}

/** The runs with their steps and thermal checks (the JSON of `rheoledger steps`). */
export function runsJson(trace: TraceSteps) {
  return trace.runs.map((r) => ({
    run: r.run,
    label: r.label,
    source: r.source ?? null,
    die: r.die ?? null,
    barrelDiameter: r.barrelDiameter ?? null,
    temperature: r.temperature,
    steps: r.steps.map((s) => stepDetailJson(r, s)),
    thermalCheck: r.thermalCheck,
  }));
}

/**
 * The additive keys of the `reduce` JSON for a recording: per group its "steps" (in the order of
 * result.groups), and at the top the thermal checks and the steps of runs that joined no group.
 */
export function recordingJson(result: ReductionResult, trace: TraceSteps) {
  const assigned = runsByGroup(result.groups, trace, DEFAULT_REDUCE_OPTIONS);
  return {
    groupSteps: assigned.byGroup.map((runs) => runs.flatMap((r) => r.steps.map((s) => stepJson(r, s)))),
    top: {
      thermalChecks: trace.runs.filter((r) => r.thermalCheck).map((r) => ({ run: r.run, ...r.thermalCheck })),
      ...(assigned.unassigned.length > 0 ? { stepsWithoutGroup: assigned.unassigned.flatMap((r) => r.steps.map((s) => stepJson(r, s))) } : {}),
    },
  };
}

/**
 * True when `file` is a pressure recording: a text file whose header row (found as for point
 * tables, below any title lines) has a time column. Reads only the file's first chunk.
 */
export function isRecordingFile(io: CliIO, file: string): boolean {
  let head = "";
  for (const chunk of inputSource(io, file).chunks()) {
    if (chunk.length >= 2 && chunk[0] === 0x50 && chunk[1] === 0x4b) return false; // a zip (xlsx)
    head = new TextDecoder("latin1").decode(chunk.subarray(0, 1 << 16));
    break;
  }
  const header = findCsvHeader(head);
  if (!header) return false;
  const line = (head.split("\n")[header.line - 1] ?? "").replace(/\r$/, "");
  return isTraceHeader(line.split(header.delimiter).map((c) => c.trim().replace(/^"(.*)"$/, "$1")));
}

/** Every recording file's text, decoded like any data table (the encoding named in a warning). */
export function recordingFiles(io: CliIO, names: readonly string[]): InputFile[] {
  return names.map((name) => ({ name, text: readInputText(io, name).text }));
}
