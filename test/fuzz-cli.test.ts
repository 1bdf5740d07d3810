/**
 * Property-based tests (fast-check, fixed seeds) of the command line: its argument parser and
 * `main` end to end on generated files and flags.
 *
 * - parseArgs on any token list either returns flags that are all declared (switches true,
 *   values non-empty and never another flag) and positionals in their order, or throws a
 *   RheoError naming the flag; and it recovers exactly what a valid command line says, in either
 *   `--flag value` or `--flag=value` form.
 * - splitQuantity reads "number unit" text into a finite number and the unit, or refuses it
 *   naming the flag.
 * - main, on generated CSV files (consistent capillary data in random units, with corrupted cells,
 *   comments, quoting, decimal commas) and generated flags, never throws and never reaches its
 *   internal-error exit (70); a failure prints one message on stderr and nothing on stdout; a
 *   success prints on stdout only, and `--json` output parses.
 *
 * Generated cases: see RUNS (the last test checks the total, ≥ 3 000 here; with
 * test/fuzz-functions.test.ts ≥ 12 000 in all). The end-to-end cases start from a consistent file
 * and change one thing at a time (a cell, a row, a column, one flag, the command), so that most
 * reach the reduction; the last test requires half of all cases in this file to end in numbers
 * and writes the per-suite report (test-output/fuzz-report.json).
 */
import fc from "fast-check";
import { RheoError } from "../src/core/errors";
import { parseArgs, splitQuantity, type FlagSpec } from "../src/cli/args";
import { main } from "../src/cli/main";
import { REDUCE_FLAGS } from "../src/cli/reduceCommand";
import { anyText, plausible } from "./helpers/fuzzCells";
import { countError, newTally, writeFuzzReport } from "./helpers/fuzzReport";

const RUNS = { parseAny: 200, parseValid: 150, splitQuantity: 150, main: 2500 } as const;
const SEED = 20261203;
let generated = 0;
const tally = newTally();
/** Cases of the parser properties: they check the command line's parsing and never reach the maths. */
const parserCase = () => {
  tally.cases++;
  countError(tally, "parser only");
};

const FLAG_NAMES = Object.keys(REDUCE_FLAGS);
const VALUE_FLAGS = FLAG_NAMES.filter((k) => (REDUCE_FLAGS[k] as FlagSpec).value);
const SWITCHES = FLAG_NAMES.filter((k) => !(REDUCE_FLAGS[k] as FlagSpec).value);

/** A command-line token: flags known and unknown, with and without values, and plain words. */
const token = fc.oneof(
  fc.constantFrom(...FLAG_NAMES).map((k) => `--${k}`),
  fc.tuple(fc.constantFrom(...FLAG_NAMES), anyText).map(([k, v]) => `--${k}=${v}`),
  fc.constantFrom("--", "-", "--=", "--=x", "-h", "--help", "--nope", "--JSON", "--json=", "---json", "file.csv", ""),
  anyText,
);

describe("parseArgs(argv, REDUCE_FLAGS)", () => {
  test("on any tokens: declared flags with proper values and positionals in order, or a RheoError naming the flag", () => {
    fc.assert(
      fc.property(fc.array(token, { maxLength: 8 }), (tokens) => {
        generated++;
        parserCase();
        const argv = ["reduce", ...tokens];
        let parsed;
        try {
          parsed = parseArgs(argv, REDUCE_FLAGS);
        } catch (e) {
          expect(e).toBeInstanceOf(RheoError);
          expect((e as RheoError).message).toMatch(/^--[^:]*: \S/);
          return;
        }
        expect(parsed.command).toBe("reduce");
        for (const [name, value] of parsed.flags) {
          const spec = REDUCE_FLAGS[name] as FlagSpec;
          expect(spec).toBeDefined();
          if (spec.value) {
            expect(typeof value).toBe("string");
            expect(value).not.toBe("");
            expect((value as string).startsWith("--")).toBe(false);
          } else expect(value).toBe(true);
        }
        // positionals appear in argv in the same order, and none is a flag
        let from = 1;
        for (const p of parsed.positionals) {
          expect(p.startsWith("--")).toBe(false);
          const at = argv.indexOf(p, from);
          expect(at).toBeGreaterThanOrEqual(from);
          from = at + 1;
        }
      }),
      { seed: SEED, numRuns: RUNS.parseAny },
    );
  });

  const value = fc.string({ minLength: 1, maxLength: 10 }).filter((v) => !v.startsWith("--"));
  const positional = fc.string({ minLength: 1, maxLength: 10 }).filter((v) => !v.startsWith("--"));
  const item = fc.oneof(
    fc.tuple(fc.constant("value" as const), fc.constantFrom(...VALUE_FLAGS), value, fc.boolean()),
    fc.tuple(fc.constant("switch" as const), fc.constantFrom(...SWITCHES), fc.constant(""), fc.constant(false)),
    fc.tuple(fc.constant("positional" as const), fc.constant(""), positional, fc.constant(false)),
  );

  test("recovers the flags and positionals of a valid command line, in either form; a flag given twice is refused", () => {
    fc.assert(
      fc.property(fc.array(item, { maxLength: 10 }), (items) => {
        generated++;
        parserCase();
        const argv = ["reduce"];
        const flags = new Map<string, string | true>();
        const positionals: string[] = [];
        for (const [kind, name, v, withEquals] of items) {
          if (kind === "positional") {
            argv.push(v);
            positionals.push(v);
          } else if (kind === "switch") {
            argv.push(`--${name}`);
            flags.set(name, true);
          } else {
            argv.push(...(withEquals ? [`--${name}=${v}`] : [`--${name}`, v]));
            flags.set(name, v);
          }
        }
        const names = items.filter(([kind]) => kind !== "positional").map(([, name]) => name);
        if (new Set(names).size < names.length) {
          expect(() => parseArgs(argv, REDUCE_FLAGS)).toThrow(/^--[a-z0-9-]+: is given twice/);
          return;
        }
        const parsed = parseArgs(argv, REDUCE_FLAGS);
        expect(parsed.positionals).toEqual(positionals);
        expect(new Map(parsed.flags)).toEqual(flags);
      }),
      { seed: SEED + 1, numRuns: RUNS.parseValid },
    );
  });
});

describe("splitQuantity(text, flag)", () => {
  const numberText = fc.oneof(
    plausible.map(String),
    fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
    fc.constantFrom("15", "0.76", ".5", "-3", "+2", "1e3", "1E-3", "1e400", "-1e400", "1e-400", "5."),
  );
  const unitText = fc.constantFrom("mm", "in", "g/cm3", "kg/m3", "C", " mm ", "", "m m", "µm");

  test("number-and-unit text gives a finite number and the unit, or a RheoError naming the flag", () => {
    fc.assert(
      fc.property(fc.oneof(fc.tuple(numberText, fc.constantFrom("", " ", "  "), unitText).map((p) => p.join("")), anyText), (text) => {
        generated++;
        parserCase();
        let out;
        try {
          out = splitQuantity(text, "--density");
        } catch (e) {
          expect(e).toBeInstanceOf(RheoError);
          expect((e as RheoError).message).toMatch(/^--density: \S/);
          return;
        }
        expect(Number.isFinite(out.value)).toBe(true);
        expect(out.unit).toBe(out.unit.trim());
        expect(text).toContain(out.unit);
      }),
      { seed: SEED + 2, numRuns: RUNS.splitQuantity },
    );
  });
});

// ------------------------------------------------------------------------------------------------
// main(), end to end

/** Column units and their factor to SI, to write consistent data in random units. */
const LENGTH = { mm: 1e-3, in: 0.0254, um: 1e-6 };
const PRESSURE = { bar: 1e5, MPa: 1e6, psi: 6894.757293168, kPa: 1e3 };
const FLOW = { "mm3/s": 1e-9, "cm3/min": 1e-6 / 60 };

/** A consistent power-law capillary test (2–3 dies of one bore, 4–8 rates) as CSV cells. */
const consistentTable = fc
  .record({
    length: fc.constantFrom(...(Object.keys(LENGTH) as (keyof typeof LENGTH)[])),
    pressure: fc.constantFrom(...(Object.keys(PRESSURE) as (keyof typeof PRESSURE)[])),
    flow: fc.constantFrom(...(Object.keys(FLOW) as (keyof typeof FLOW)[])),
    diameter: fc.double({ min: 0.5, max: 2, noNaN: true }),
    ratios: fc.shuffledSubarray([5, 10, 20, 30], { minLength: 2, maxLength: 3 }),
    rates: fc.integer({ min: 4, max: 8 }),
    k: fc.double({ min: 100, max: 2e4, noNaN: true }),
    n: fc.double({ min: 0.2, max: 1, noNaN: true }),
    e: fc.double({ min: 0, max: 4, noNaN: true }),
    temperature: fc.option(fc.constantFrom(190, 210, 230)),
  })
  .map((s) => {
    const d = s.diameter * 1e-3;
    const header = ["die_diameter", "die_length", "flow_rate", "pressure"].map((q, i) => `${q} [${[s.length, s.length, s.flow, s.pressure][i]}]`);
    if (s.temperature !== null) header.push("temperature [C]");
    const rows: (string | number)[][] = [header];
    for (const ld of s.ratios) {
      for (let i = 0; i < s.rates; i++) {
        const rate = Math.pow(10, 1 + (2 * i) / (s.rates - 1)); // apparent, 1/s
        const q = (rate * Math.PI * d ** 3) / 32;
        const tau = s.k * ((3 * s.n + 1) / (4 * s.n)) ** s.n * rate ** s.n;
        const pressure = 2 * tau * (2 * ld + s.e);
        const row: (string | number)[] = [d / LENGTH[s.length], (ld * d) / LENGTH[s.length], q / FLOW[s.flow], pressure / PRESSURE[s.pressure]];
        if (s.temperature !== null) row.push(s.temperature);
        rows.push(row);
      }
    }
    return rows;
  });

/** Damage to a table: a cell replaced by junk, a row or column removed, nothing. */
const damage = fc.oneof(
  { weight: 6, arbitrary: fc.constant(null) },
  { weight: 2, arbitrary: fc.tuple(fc.constant("cell" as const), fc.nat(), fc.nat(), fc.oneof(anyText, fc.constantFrom("", "-1", "0", "NaN", "1e400", "inf"))) },
  { weight: 1, arbitrary: fc.tuple(fc.constant("row" as const), fc.nat(), fc.nat(), fc.constant("")) },
  { weight: 1, arbitrary: fc.tuple(fc.constant("column" as const), fc.nat(), fc.nat(), fc.constant("")) },
);

function damaged(rows: (string | number)[][], d: ["cell" | "row" | "column", number, number, string] | null): string[][] {
  const text = rows.map((r) => r.map(String));
  if (!d) return text;
  const [kind, a, b, junk] = d;
  const r = a % text.length;
  const width = (text[0] as string[]).length;
  if (kind === "cell") (text[r] as string[])[b % width] = junk;
  if (kind === "row") text.splice(r, 1);
  if (kind === "column") text.forEach((row) => row.splice(b % width, 1));
  return text;
}

/** Writes cells as CSV: comma, or semicolon with decimal commas; maybe a BOM, comments, quoting. */
const csvTextWith = (damageOf: fc.Arbitrary<["cell" | "row" | "column", number, number, string] | null>) =>
  fc.tuple(consistentTable, damageOf, fc.boolean(), fc.boolean(), fc.boolean(), fc.boolean()).map(([rows, d, semicolon, bom, comment, quote]) => {
    const cells = damaged(rows, d);
    const sep = semicolon ? ";" : ",";
    const field = (c: string) => {
      const t = semicolon ? c.replace(/\./g, ",") : c;
      return quote || t.includes(sep) || t.includes('"') ? `"${t.replace(/"/g, '""')}"` : t;
    };
    const body = cells.map((r) => r.map(field).join(sep)).join("\n");
    return `${bom ? "\uFEFF" : ""}${comment ? "# invented data, generated by a property test\n\n" : ""}${body}\n`;
  });


/** Flags for `reduce`: valid ones, and at most one that is not (one change at a time). */
const VALID_FLAGS = fc.constantFrom(["--json"], ["--summary"], ["--method", "global"], ["--method", "local"], ["--method", "difference"], ["--method", "transition"], ["--end-correction", "none"], ["--end-correction", "bagley"], ["--degree", "2"], ["--density", "0.76 g/cm3"]);
/** Up to `max` valid flags, each flag at most once (a repeated flag is refused). */
const validFlags = (max: number) => fc.uniqueArray(VALID_FLAGS, { maxLength: max, selector: (f) => f[0] as string });
const INVALID_FLAG = fc.oneof(
  fc.constantFrom(["--degree", "7"], ["--method", "nope"], ["--window", "2"]),
  fc.tuple(fc.constantFrom(...VALUE_FLAGS), anyText).map(([k, v]) => [`--${k}=${v}`]),
);

/**
 * One end-to-end case: a consistent file reduced with valid flags, changed in one thing at most:
 * a damaged file, one invalid flag, or another command.
 */
const endToEnd = fc.oneof(
  { weight: 10, arbitrary: fc.tuple(csvTextWith(fc.constant(null)), validFlags(3), fc.constant("reduce")) },
  { weight: 4, arbitrary: fc.tuple(csvTextWith(damage.filter((d) => d !== null)), validFlags(3), fc.constant("reduce")) },
  { weight: 1, arbitrary: fc.tuple(csvTextWith(fc.constant(null)), fc.tuple(validFlags(2), INVALID_FLAG).map(([v, bad]) => [...v, bad]), fc.constant("reduce")) },
  { weight: 1, arbitrary: fc.tuple(csvTextWith(fc.constant(null)), validFlags(2), fc.constantFrom("plan", "compare")) },
);


describe("main(argv, io)", () => {
  test("reduce on generated files and flags: exit 0, 1 or 2; failures print one message and no output", async () => {
    await fc.assert(
      fc.asyncProperty(endToEnd, async ([text, flagLists, command]) => {
        generated++;
        let stdout = "";
        let stderr = "";
        const written: string[] = [];
        const argv = [command, "data.csv", ...flagLists.flat()];
        const code = await main(argv, {
          readFile: (p) => {
            if (p === "data.csv") return text;
            throw new Error(`no such file: ${p}`);
          },
          stdout: (t) => (stdout += t),
          stderr: (t) => (stderr += t),
          writeFile: (p) => void written.push(p),
        });
        expect(stderr).not.toMatch(/internal error/);
        expect([0, 1, 2, 3]).toContain(code);
        if (code === 0) {
          expect(stderr).toBe("");
          expect(stdout.length).toBeGreaterThan(0);
          if (argv.includes("--json") && command === "reduce") expect(() => JSON.parse(stdout)).not.toThrow();
        } else if (code === 1 || code === 2) {
          expect(stdout).toBe("");
          expect(stderr).toMatch(/^rheoledger/);
        }
        expect(written).toEqual([]); // no --out was given
        tally.cases++;
        if (code === 0 && command === "reduce" && /\d/.test(stdout)) tally.reachedCore++;
        else countError(tally, code === 0 ? `exit 0 (${command})` : `exit ${code}`);
      }),
      { seed: SEED + 3, numRuns: RUNS.main },
    );
  });
});

test("generated cases in this file: at least 3 000, half of them reduced to numbers end to end (report: test-output/fuzz-report.json)", () => {
  expect(generated).toBeGreaterThanOrEqual(3000);
  writeFuzzReport("command-line", tally);
  expect(tally.reachedCore / tally.cases).toBeGreaterThanOrEqual(0.5);
});
