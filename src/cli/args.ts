/**
 * Command-line argument parsing for `rheoledger`: a command, positional arguments and
 * `--flag value` / `--flag=value` / boolean `--flag` options, validated against a table.
 */
import { RheoError } from "../core/errors";

export interface FlagSpec {
  /** takes a value (true) or is a switch (false) */
  value: boolean;
  description: string;
}

export interface ParsedArgs {
  command: string;
  positionals: string[];
  flags: Map<string, string | true>;
}

/**
 * Parses `argv` (without node and script) against the flags a command accepts.
 * @throws RheoError("value") naming an unknown flag or a flag missing its value.
 */
export function parseArgs(argv: string[], specs: Record<string, FlagSpec>): ParsedArgs {
  const [command = "", ...rest] = argv;
  const positionals: string[] = [];
  const flags = new Map<string, string | true>();
  for (let i = 0; i < rest.length; i++) {
    const arg = rest[i] as string;
    if (!arg.startsWith("--")) {
      positionals.push(arg);
      continue;
    }
    const eq = arg.indexOf("=");
    const name = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
    const spec = specs[name];
    if (!spec) {
      throw new RheoError("value", `--${name}`, `unknown option; accepted: ${Object.keys(specs).map((k) => "--" + k).join(", ")}`);
    }
    if (flags.has(name)) throw new RheoError("value", `--${name}`, "is given twice; give each option once", undefined, "DUPLICATE_KEY");
    if (!spec.value) {
      if (eq > 0) throw new RheoError("value", `--${name}`, "takes no value");
      flags.set(name, true);
      continue;
    }
    let value: string | undefined;
    if (eq > 0) value = arg.slice(eq + 1);
    else {
      value = rest[i + 1];
      i++;
    }
    if (value === undefined || value === "" || value.startsWith("--")) {
      throw new RheoError("value", `--${name}`, "needs a value");
    }
    flags.set(name, value);
  }
  return { command, positionals, flags };
}

/**
 * Reads a "number unit" option value such as "15mm", "15 mm" or "230C" into its parts.
 * @throws RheoError("value") when it does not start with a number.
 */
export function splitQuantity(text: string, flag: string): { value: number; unit: string } {
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$/.exec(text);
  if (!m) throw new RheoError("value", flag, `expected a number with a unit, e.g. "15 mm", got "${text}"`);
  const value = Number(m[1]);
  if (!Number.isFinite(value)) throw new RheoError("value", flag, `the number in "${text}" is too large to represent`);
  return { value, unit: m[2] ?? "" };
}
