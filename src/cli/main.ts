/**
 * The `rheoledger` command line. `main(argv, io)` returns the exit code and writes through `io`,
 * so tests run it in-process; bin/rheoledger.js wires it to the real process.
 * Output is assembled first and written once: a failure prints only the error, never half a table.
 */
import { RheoError } from "../core/errors";
import { parseArgs } from "./args";
import { safeMessage } from "../io/safeText";
import type { CliIO } from "./io";
import { type CommandOutput, REDUCE_FLAGS, readRotationalFile, reduceRequestFromFlags, runRecordingReduce, runReduce } from "./reduceCommand";
import { readReduceInput } from "./reduceInput";
import { planOutputs, writeReduceOutputs } from "./reduceOutputs";
import { runPlanCommand } from "./planCommand";
import { runCompareCommand } from "./compareCommand";
import { CLI_VERSION } from "./version";
import { runStepsCommand } from "./stepsCommand";
import { isRecordingFile, recordingFiles } from "./recordingInput";

export type { CliIO } from "./io";

const USAGE = `rheoledger — capillary-rheometer data reduction

Usage:
  rheoledger reduce FILE.csv|FILE.xlsx [options]
  rheoledger reduce TRACE.csv [TRACE2.csv ...] [options]   a pressure recording (time column): steps, then reduce
  rheoledger steps TRACE.csv [...] [--out steps.csv] [--json]   steps of a recording only (steps --help)
  rheoledger plan OPTIONS.json [--json]          plan dies, speeds, pressures, material (plan --help)
  rheoledger compare LOT.csv --reference REF.csv | --model NAME --params k=v,...  (compare --help)

Options for reduce:
${Object.entries(REDUCE_FLAGS)
  .map(([k, s]) => `  --${k}${s.value ? " VALUE" : ""}`.padEnd(28) + s.description)
  .join("\n")}

  rheoledger --version                           print the version

The CSV (or the sheet) has one header row of "quantity [unit]" cells: die_diameter, die_length, pressure, and
flow_rate, or piston_speed with barrel_diameter, or mass_rate with density; temperature optional.
A pressure recording has one row per sample: time, piston_speed (or piston_position), pressure
(or force with barrel_diameter), die_diameter, die_length; barrel_diameter, temperature optional.
`;

/** Runs the command line; returns the process exit code (0 ok, 1 bad input, 2 usage, 3 lot not passed by `compare`). */
// `reduce` on a workbook or with `--out`/`--report` returns a Promise (exceljs reads and writes
// asynchronously); every other path a number.
export function main(argv: string[], io: CliIO): number | Promise<number> {
  if (argv.length === 0 || argv[0] === "--help" || argv[0] === "-h" || argv[0] === "help") {
    io.stdout(USAGE);
    return argv.length === 0 ? 2 : 0;
  }
  if (argv[0] === "--version" || argv[0] === "-v" || argv[0] === "version") {
    io.stdout(`rheoledger ${CLI_VERSION}\n`);
    return 0;
  }
  try {
    const command = argv[0];
    if (command === "plan") return runPlanCommand(argv, io);
    if (command === "compare") return runCompareCommand(argv, io);
    if (command === "steps") return runStepsCommand(argv, io);
    if (command !== "reduce") {
      io.stderr(`rheoledger: unknown command "${command}"; accepted: reduce, steps, plan, compare\n\n${USAGE}`);
      return 2;
    }
    const args = parseArgs(argv, REDUCE_FLAGS);
    const file = args.positionals[0];
    if (!file) {
      io.stderr(`rheoledger reduce: give a CSV file or xlsx workbook (or several pressure recordings)\n\n${USAGE}`);
      return 2;
    }
    const request = reduceRequestFromFlags(args);
    // output paths and --meta are checked before the reduction: a refused file costs no work
    const plan = planOutputs(args, args.positionals, io);
    if ("usage" in plan) {
      io.stderr(`rheoledger: ${plan.usage}\n`);
      return 2;
    }
    const finish = (out: CommandOutput): number | Promise<number> => {
      io.timing?.("reduce", out.coreMs);
      // the writers (and exceljs) are loaded only when a file is written
      if (plan.out !== undefined || plan.report !== undefined) return writeReduceOutputs(out, { file: args.positionals.join(", "), files: args.positionals, args, argv, io, plan }).catch((e: unknown) => failed(e, io));
      io.timing?.("format", out.formatMs ?? 0);
      const writing = performance.now();
      io.stdout(out.stdout);
      io.timing?.("write", performance.now() - writing);
      return 0;
    };
    if (isRecordingFile(io, file)) return finish(runRecordingReduce(recordingFiles(io, args.positionals), args, io, request));
    if (args.positionals.length > 1) {
      io.stderr(`rheoledger reduce: give exactly one point table (CSV file or xlsx workbook); only pressure recordings (a "time [s]" column) are read several at a time\n\n${USAGE}`);
      return 2;
    }
    // the rotational curve to join (--rotational FILE.csv), read before the main input
    const rotational = request.input.rotational !== undefined ? readRotationalFile(request.input.rotational, io) : undefined;
    const started = performance.now();
    const input = readReduceInput(io, file, args, request.input);
    if (!(input instanceof Promise)) io.timing?.("read", performance.now() - started);
    if (input instanceof Promise) return input.then((raw) => finish(runReduce(raw, args, request, rotational))).catch((e: unknown) => failed(e, io));
    return finish(runReduce(input, args, request, rotational));
  } catch (e) {
    return failed(e, io);
  }
}

/** Prints a failure: a RheoError's message (exit 1), anything else as an internal error (exit 70). */
function failed(e: unknown, io: CliIO): number {
  if (e instanceof RheoError) {
    io.stderr(`rheoledger: ${safeMessage(e.message)}\n`);
    return 1;
  }
  io.stderr(`rheoledger: internal error: ${safeMessage((e as Error).stack ?? String(e))}\n`);
  return 70;
}
