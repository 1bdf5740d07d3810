/**
 * `rheoledger steps TRACE.csv [TRACE2.csv ...] [--out steps.csv] [--json] [--blank FILE]`: step
 * detection only. Prints the step table of every die run (src/io/resultTables.ts), the
 * repeated-first-speed checks, the method record and the warnings, or one JSON document in SI
 * units; `--out` writes the ordinary point table (src/io/stepRecord.ts) that `reduce` reads, so a
 * user can inspect or edit it. An existing file is never overwritten.
 */
import { RheoError } from "../core/errors";
import { detectTraceSteps } from "../core/steps/traceSteps";
import { CLI_SETTINGS_SOURCE, REDUCE_SETTINGS, readReduceSettings } from "../io/reduceOptions";
import { reduceSettingFlags } from "../io/reduceSettingWords";
import { stepsTable, thermalChecksTable } from "../io/resultTables";
import { pointTableCsv, stepMethodLines } from "../io/stepRecord";
import { FlagSpec, parseArgs } from "./args";
import { resultTableText } from "./format";
import type { CliIO } from "./io";
import { RECORDING_INPUT_FLAGS, readBlankFile, readRecordings, recordingFiles, runsJson, type InputFile } from "./recordingInput";
import { asFlagError, settingsFromFlags, warningsText } from "./reduceCommand";

/** The reduce settings `steps` takes: the step settings, the barrel bore and --si. */
const STEP_COMMAND_SETTINGS = REDUCE_SETTINGS.filter((s) => s.section === "steps" || s.key === "barrelDiameter" || s.key === "si");

export const STEPS_FLAGS: Record<string, FlagSpec> = {
  ...Object.fromEntries(Object.entries(reduceSettingFlags()).filter(([flag]) => STEP_COMMAND_SETTINGS.some((s) => s.flag === flag))),
  ...RECORDING_INPUT_FLAGS,
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  out: { value: true, description: "write the steady points as an ordinary point table (CSV) that `rheoledger reduce` reads; an existing file is not overwritten without --force" },
  force: { value: false, description: "replace an existing --out file (never an input file, never through a link)" },
};

export const STEPS_USAGE = `Usage: rheoledger steps TRACE.csv [TRACE2.csv ...] [options]

Finds the steps of a pressure recording (one row per sample: time, piston_speed or
piston_position, pressure or force with barrel_diameter, die columns) and their steady plateaus.

Options:
${Object.entries(STEPS_FLAGS)
  .map(([k, s]) => `  --${k}${s.value ? " VALUE" : ""}`.padEnd(28) + s.description)
  .join("\n")}
`;

/** Runs `steps`; returns the exit code. */
export function runStepsCommand(argv: string[], io: CliIO): number {
  if (argv.includes("--help")) {
    io.stdout(STEPS_USAGE);
    return 0;
  }
  const args = parseArgs(argv, STEPS_FLAGS);
  if (args.positionals.length === 0) {
    io.stderr(`rheoledger steps: give one or more recording files\n\n${STEPS_USAGE}`);
    return 2;
  }
  const request = readReduceSettings(settingsFromFlags(args), CLI_SETTINGS_SOURCE);
  const files: InputFile[] = recordingFiles(io, args.positionals);
  const recordings = readRecordings(files, request.input);
  const blankFile = args.flags.get("blank");
  const blank = typeof blankFile === "string" ? readBlankFile(io, blankFile) : undefined;
  let trace;
  try {
    trace = detectTraceSteps(recordings.runs, request.steps, blank?.blank);
  } catch (e) {
    throw asFlagError(e);
  }
  const warnings = [...recordings.warnings, ...(blank?.warnings ?? []), ...trace.warnings];
  const out = args.flags.get("out");
  if (typeof out === "string") {
    if (!/\.csv$/i.test(out)) throw new RheoError("value", "--out", `expected a file name ending in .csv, got "${out}"`);
    if (!io.writeFile) throw new RheoError("value", "--out", "this surface cannot write files");
    if (!trace.runs.some((r) => r.steps.some((s) => s.used))) throw new RheoError("missing", "steps", "no step can go into the flow curve; nothing to write (see the step table)");
    // never over an existing file without --force, never onto an input or through a link (safeWrite.ts)
    io.writeFile(out, pointTableCsv(trace, args.positionals.join(", ")), { flag: "--out", force: args.flags.has("force"), inputs: [...args.positionals, ...(typeof blankFile === "string" ? [blankFile] : [])] });
  }
  if (args.flags.has("json")) {
    io.stdout(JSON.stringify({ units: { pressure: "Pa", length: "m", time: "s", speed: "m/s", temperature: "K", force: "N" }, runs: runsJson(trace), blank: trace.blank ?? null, method: stepMethodLines(trace), warnings }, null, 2) + "\n");
    if (typeof out === "string") io.stderr(`Point table written to ${out}\n`);
    return 0;
  }
  const text: string[] = [resultTableText(stepsTable(trace.runs)), ""];
  const checks = thermalChecksTable(trace.runs);
  if (checks) text.push(resultTableText(checks), "");
  text.push("Method", ...stepMethodLines(trace).map((l) => `  ${l}`), "");
  text.push(warningsText(warnings).trimEnd());
  if (typeof out === "string") text.push(`Point table written to ${out}`);
  io.stdout(text.join("\n") + "\n");
  return 0;
}
