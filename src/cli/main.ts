/**
 * The `rheoledger` command line. `main(argv, io)` returns the exit code and writes through `io`,
 * so tests run it in-process; bin/rheoledger.js wires it to the real process.
 * Output is assembled first and written once: a failure prints only the error, never half a table.
 */
import { RheoError } from "../core/errors";
import { parseArgs } from "./args";
import { CliIO, readInputFile } from "./io";
import { REDUCE_FLAGS, runReduce } from "./reduceCommand";
import { writeResultsFile } from "./resultsFile";
import { runPlanCommand } from "./planCommand";
import { runCompareCommand } from "./compareCommand";
import { runStepsCommand } from "./stepsCommand";

export type { CliIO } from "./io";

const USAGE = `rheoledger — capillary-rheometer data reduction

Usage:
  rheoledger reduce FILE.csv [options]
  rheoledger reduce TRACE.csv [TRACE2.csv ...] [options]   a pressure recording (time column): steps, then reduce
  rheoledger steps TRACE.csv [...] [--out steps.csv] [--json]   steps of a recording only (steps --help)
  rheoledger plan OPTIONS.json [--json]          plan dies, speeds, pressures, material (plan --help)
  rheoledger compare LOT.csv --reference REF.csv | --model NAME --params k=v,...  (compare --help)

Options for reduce:
${Object.entries(REDUCE_FLAGS)
  .map(([k, s]) => `  --${k}${s.value ? " VALUE" : ""}`.padEnd(28) + s.description)
  .join("\n")}

The CSV has one header row of "quantity [unit]" cells: die_diameter, die_length, pressure, and
flow_rate, or piston_speed with barrel_diameter, or mass_rate with density; temperature optional.
A pressure recording has one row per sample: time, piston_speed (or piston_position), pressure
(or force with barrel_diameter), die_diameter, die_length; barrel_diameter, temperature optional.
`;

/** Runs the command line; returns the process exit code (0 ok, 1 bad input, 2 usage, 3 lot not passed by `compare`). */
// `reduce --out FILE.xlsx` returns a Promise (the workbook is written asynchronously); every other path a number.
export function main(argv: string[], io: CliIO): number | Promise<number> {
  if (argv.length === 0 || argv[0] === "--help" || argv[0] === "-h" || argv[0] === "help") {
    io.stdout(USAGE);
    return argv.length === 0 ? 2 : 0;
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
      io.stderr(`rheoledger reduce: give a CSV file (or several pressure recordings)\n\n${USAGE}`);
      return 2;
    }
    const out = runReduce(args.positionals.map((name) => ({ name, text: readInputFile(io, name) })), args, io);
    const outPath = args.flags.get("out");
    if (typeof outPath === "string") return writeResultsFile(out, args.positionals.join(", "), outPath, io, args.flags.has("json"));
    io.stdout(out.stdout);
    return 0;
  } catch (e) {
    if (e instanceof RheoError) {
      io.stderr(`rheoledger: ${e.message}\n`);
      return 1;
    }
    io.stderr(`rheoledger: internal error: ${(e as Error).stack ?? String(e)}\n`);
    return 70;
  }
}
