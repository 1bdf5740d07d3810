/**
 * Property-based tests (fast-check, fixed seeds) of every RHEO worksheet function, called as
 * Excel calls them (2-D ranges, null for blanks and omitted arguments).
 *
 * 0. Valid calls mutated one thing at a time, every function: a physically consistent call (a
 *    power-law liquid in dies of plausible size, in the functions' default units) with nothing
 *    changed, one argument replaced by junk, one cell of one range replaced by junk, or one range
 *    scaled by a power of ten (a unit slip); the result must be well formed (as in 1.) and at
 *    least half of these calls must reach the calculations and return numbers. The per-suite
 *    report (cases, reaching the calculations, errors by kind) is printed and written to
 *    test-output/fuzz-report.json.
 * 1. Robustness, every function of every file in webpack.config.js FUNCTION_FILES (found through
 *    the same @customfunction metadata the build uses): for generated arguments of every kind —
 *    blanks, text, logicals, error values, NaN, ±∞, huge and tiny numbers, zero and negative
 *    values, ranges of every shape, single points, junk options — the call never throws, returns a
 *    rectangular grid, and every cell is a finite number, text, a logical or an error value with a
 *    code and a message naming what went wrong; never NaN or ∞, never an "internal error".
 * 2. Physical identities on valid input, against closed forms: wall stress is ΔP·D/(4L) and
 *    linear in pressure (Bagley 1957; Macosko 1994, ch. 6, from memory); Q = v·πDb²/4; γ̇a = 32Q/(πD³); a
 *    Newtonian liquid (τ = μγ̇) gives n' = 1 and η = μ at every rate; a power-law liquid
 *    (τw = K·γ̇wⁿ, so τw = K·((3n+1)/(4n))ⁿ·γ̇aⁿ) gives n' = n, γ̇w = γ̇a(3n+1)/(4n) and
 *    η = K·γ̇w^(n−1) (Rabinowitsch 1929; Macosko 1994, ch. 6, from memory); unit conversions
 *    invert (NIST SP 811 factors are exact ratios).
 * 3. Paired ranges of different lengths are #VALUE! naming the argument.
 *
 * Generated cases: see RUNS (the last test checks the total, ≥ 9 000 here; test/fuzz-cli.test.ts
 * adds ≥ 3 000).
 */
import path from "path";
import fc from "fast-check";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";
import { acceptedUnits, fromSI, knownQuantities, toSI, type Quantity } from "../src/core/units";
import { unitScale } from "../src/functions/adapter/unitScale";
import * as sheet from "../src/functions/functions";
import { expectClose } from "./helpers/expectClose";
import { FakeCustomFunctionError, cell, col, installOfficeRuntime } from "./helpers/sheet";
import { anyCell, anyOption, anyRange, plausible } from "./helpers/fuzzCells";
import { countError, newTally, writeFuzzReport, type FuzzTally } from "./helpers/fuzzReport";

const root = path.join(__dirname, "..");
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { FUNCTION_FILES } = require("../webpack.config.js") as { FUNCTION_FILES: string[] };

/** Runs per property; the robustness runs are per worksheet function. */
const RUNS = { perFunction: 60, mutated: 220, identity: 150, newtonian: 60, powerLaw: 60, reduce: 40, convert: 300, mismatch: 200, unitScale: 300 } as const;
let generated = 0;
const tally: FuzzTally = newTally();

const SEED = 20261202;
const ERROR_CODES = new Set(["#VALUE!", "#N/A", "#NUM!", "#DIV/0!", "#NULL!", "#NAME?", "#REF!"]);

interface ParamMeta {
  name: string;
  type?: string;
  dimensionality?: string;
}
interface SheetFunction {
  id: string;
  jsName: string;
  fn: (...args: unknown[]) => unknown;
  parameters: ParamMeta[];
}

let uninstall: () => void;
const functions: SheetFunction[] = [];

beforeAll(async () => {
  uninstall = installOfficeRuntime();
  for (const file of FUNCTION_FILES.map((f) => path.join(root, f))) {
    const meta = await generateCustomFunctionsMetadata([file]);
    const byId = new Map((JSON.parse(meta.metadataJson).functions as { id: string; parameters: ParamMeta[] }[]).map((f) => [f.id, f]));
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const module = require(file) as Record<string, unknown>;
    for (const { functionName, id } of meta.associate) {
      const fn = module[functionName];
      const described = byId.get(id);
      if (typeof fn === "function" && described) functions.push({ id, jsName: functionName, fn: fn as SheetFunction["fn"], parameters: described.parameters });
    }
  }
});
afterAll(() => uninstall());

/** What is wrong with a worksheet function's result, or null when it is well formed. */
function resultProblem(result: unknown): string | null {
  if (!Array.isArray(result) || result.length === 0) return `not a non-empty 2-D array: ${String(result)}`;
  const width = Array.isArray(result[0]) ? (result[0] as unknown[]).length : -1;
  if (width < 1) return "first row is not a non-empty array";
  for (const [r, row] of result.entries()) {
    if (!Array.isArray(row)) return `row ${r} is not an array`;
    if (row.length !== width) return `jagged: row ${r} has ${row.length} cells, row 0 has ${width}`;
    for (const [c, v] of row.entries()) {
      if (typeof v === "number" && !Number.isFinite(v)) return `cell ${r},${c} is ${v}`;
      if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") continue;
      if (v instanceof FakeCustomFunctionError) {
        if (!ERROR_CODES.has(v.code)) return `cell ${r},${c}: unknown error code ${v.code}`;
        if (!/^\S[^:]*: \S/.test(v.message)) return `cell ${r},${c}: ${v.code} without a message naming its subject: "${v.message}"`;
        if (/internal error/i.test(v.message)) return `cell ${r},${c}: a defect reached the cell: ${v.message}`;
        continue;
      }
      return `cell ${r},${c} is ${v === null ? "null" : typeof v}`;
    }
  }
  return null;
}

function argumentFor(p: ParamMeta): fc.Arbitrary<unknown> {
  return p.dimensionality === "matrix" ? anyRange : fc.oneof({ weight: 4, arbitrary: anyOption }, { weight: 1, arbitrary: anyRange });
}

const describeArgs = (args: unknown[]) => JSON.stringify(args, (_k, v) => (typeof v === "number" && !Number.isFinite(v) ? String(v) : v instanceof FakeCustomFunctionError ? v.code : v));

describe("every worksheet function, on valid calls changed one thing at a time", () => {
  test("a valid call is defined for every worksheet function", () => {
    const sample = fc.sample(scenario, { seed: SEED, numRuns: 1 })[0] as Scenario;
    expect(functions.filter((f) => validCall(f.id, sample) === undefined).map((f) => f.id)).toEqual([]);
  });

  // Whole-table functions (RHEO.PLAN, RHEO.REDUCE) refuse a table with one bad cell, so a single
  // function may reach its calculations in fewer than half of these calls; every one must in a
  // quarter, and the whole suite in half (last test).
  test("results are well formed, and at least a quarter of the calls of each function reach the calculations", () => {
    const failures: string[] = [];
    const reachedShare: Record<string, number> = {};
    for (const f of functions) {
      let cases = 0;
      let reached = 0;
      const out = fc.check(
        fc.property(scenario, mutation, (s, m) => {
          generated++;
          const args = mutate(validCall(f.id, s) as unknown[], f, m);
          let result: unknown;
          try {
            result = f.fn(...args);
          } catch (thrown) {
            throw new Error(`threw ${thrown instanceof Error ? thrown.message : String(thrown)}`);
          }
          const problem = resultProblem(result);
          if (problem) throw new Error(problem);
          cases++;
          if (record(result, f.id === "UNITS")) reached++;
        }),
        { seed: SEED + 20, numRuns: RUNS.mutated },
      );
      if (out.failed) failures.push(`RHEO.${f.id}: ${(out.errorInstance as Error | undefined)?.message ?? "failed"} for ${JSON.stringify(out.counterexample)}`);
      reachedShare[f.id] = reached / Math.max(cases, 1);
    }
    expect(failures).toEqual([]);
    const below = Object.entries(reachedShare).filter(([, share]) => share < 0.25);
    expect(below).toEqual([]);
  });
});

describe("every worksheet function, on generated arguments of every kind", () => {
  test("the metadata lists the functions of every FUNCTION_FILES file", () => {
    expect(functions.length).toBeGreaterThanOrEqual(14);
    expect(functions.map((f) => f.id)).toEqual(expect.arrayContaining(["FLOWRATE", "WALLSTRESSAPP", "REDUCE", "CONVERT"]));
  });

  test("never throws; returns a rectangular grid of finite numbers, text, logicals or errors with a message", () => {
    const failures: string[] = [];
    for (const f of functions) {
      const args = fc.tuple(...f.parameters.map(argumentFor));
      const out = fc.check(
        fc.property(args, (values) => {
          generated++;
          let result: unknown;
          try {
            result = f.fn(...values);
          } catch (thrown) {
            throw new Error(`threw ${thrown instanceof Error ? thrown.message : String(thrown)}`);
          }
          const problem = resultProblem(result);
          if (problem) throw new Error(problem);
          record(result);
        }),
        { seed: SEED, numRuns: RUNS.perFunction },
      );
      if (out.failed) failures.push(`RHEO.${f.id}: ${(out.errorInstance as Error | undefined)?.message ?? "failed"} for ${describeArgs(out.counterexample?.[0] as unknown[])}`);
    }
    expect(failures).toEqual([]);
  });
});

/**
 * Counts a well-formed result: reached the calculations when it holds a finite number (or, for a
 * function whose result is text, such as RHEO.UNITS, any non-error cell), else its first error code.
 */
function record(result: unknown, textResult = false): boolean {
  tally.cases++;
  const cells = (result as unknown[][]).flat();
  if (cells.some((v) => (typeof v === "number" && Number.isFinite(v)) || (textResult && typeof v === "string" && v !== ""))) {
    tally.reachedCore++;
    return true;
  }
  const error = cells.find((v): v is FakeCustomFunctionError => v instanceof FakeCustomFunctionError);
  countError(tally, error ? error.code : "no number");
  return false;
}

const column = (values: readonly unknown[]) => values.map((v) => [v]);

/** A power-law liquid in a round die of plausible size, in the worksheet functions' default units. */
const scenario = fc.record({
  K: fc.double({ min: 300, max: 3e4, noNaN: true }),
  n: fc.double({ min: 0.25, max: 1, noNaN: true }),
  D: fc.constantFrom(0.5, 1, 2),
  e: fc.double({ min: 0, max: 4, noNaN: true }),
  points: fc.integer({ min: 5, max: 8 }),
  model: fc.constantFrom("power-law", "cross", "carreau"),
});
interface Scenario {
  K: number;
  n: number;
  D: number;
  e: number;
  points: number;
  model: string;
}

/** Valid arguments per worksheet function id, built from a scenario. */
function validCall(id: string, s: Scenario): unknown[] | undefined {
  const rates = Array.from({ length: s.points }, (_, i) => 10 * Math.pow(10, (2 * i) / (s.points - 1))); // apparent, 1/s
  const factor = (3 * s.n + 1) / (4 * s.n);
  const stress = rates.map((g) => s.K * (factor * g) ** s.n); // Pa
  const wall = rates.map((g) => factor * g);
  const eta = wall.map((g, i) => (stress[i] as number) / g);
  const ld = [10, 20, 30];
  const bar = (tau: number, x: number) => (2 * tau * (2 * x + s.e)) / 1e5;
  const flows = rates.map((g) => (g * Math.PI * s.D ** 3) / 32); // mm3/s
  const temps = [190, 210, 230];
  const aT = (T: number) => Math.exp((45e3 / 8.314462618) * (1 / (T + 273.15) - 1 / 483.15));
  switch (id) {
    case "FLOWRATE": return [column(rates.map((g) => g / 10)), [[15]]];
    case "FLOWRATEMASS": return [column(rates.map((g) => g / 10)), [[0.76]]];
    case "SHEARRATEAPP": return [column(flows), [[s.D]]];
    case "WALLSTRESSAPP": return [column(stress.map((t) => bar(t, 20))), [[s.D]], [[20 * s.D]]];
    case "WALLSTRESS": return [column(stress.map((t) => bar(t, 20))), column(stress.map((t) => bar(t, 0))), [[s.D]], [[20 * s.D]]];
    case "WALLSTRESSEND": return [column(stress.map((t) => bar(t, 20))), [[s.e]], [[s.D]], [[20 * s.D]]];
    case "BAGLEY": return [column(ld.flatMap((x) => rates.map(() => x))), column(ld.flatMap(() => rates)), column(ld.flatMap((x) => stress.map((t) => bar(t, x))))];
    case "NPRIME":
    case "SHEARRATEWALL":
    case "VISCOSITY":
    case "VISCOSITYAPP":
    case "REPVISCOSITY": return [column(rates), column(stress)];
    case "REDUCE": return [[["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"], ...ld.flatMap((x) => flows.map((q, i) => [s.D, x * s.D, q, bar(stress[i] as number, x)]))]];
    case "CONVERT": return [column(stress.map((t) => t / 1e5)), "bar", "psi"];
    case "UNITS": return ["pressure"];
    case "FIT": return [column(wall), column(eta), s.model === "carreau" ? "power-law" : s.model];
    case "MODEL": return ["power-law", `K=${s.K}, n=${s.n}`, column(wall)];
    case "COMPAREFITS": return [column(wall), column(eta), column(["power-law", "cross"])];
    case "SHIFT": return [column(temps), [[210]], "arrhenius", [[45000]]];
    case "SHIFTFIT": return [column(temps.flatMap((T) => wall.map(() => T))), column(temps.flatMap(() => wall)), column(temps.flatMap((T) => wall.map((g) => aT(T) * s.K * (aT(T) * g) ** (s.n - 1)))), [[210]]];
    case "MASTERFIT": return [column(temps.flatMap((T) => wall.map(() => T))), column(temps.flatMap(() => wall)), column(temps.flatMap((T) => wall.map((g) => aT(T) * s.K * (aT(T) * g) ** (s.n - 1)))), "power-law", "arrhenius", [[210]]];
    case "SLITSHEARRATEAPP": return [column(flows), [[10]], [[1]]];
    case "SLITWALLSTRESS": return [column(stress.map((t) => bar(t, 20))), [[1]], [[20]]];
    case "ORIFICEPRESSURE": return [column([10, 1000]), column([1, 100]), column(rates)];
    case "SLIPVELOCITY": return [column([1, 1, 2, 2]), column([180, 360, 140, 280]), column([1e4, 2e4, 1e4, 2e4])];
    case "COGSWELL": return [[[bar(stress[2] as number, 0) + 1]], [[wall[2]]], [[eta[2]]], [[s.n]]];
    case "HEATING": return [column(stress.map((t) => bar(t, 20))), [[0.76]], [[2500]]];
    case "NAHME": return [[[0.03]], column(eta), column(wall), [[s.D]], [[0.2]]];
    case "PRESSURECOEFF": return [column([10, 20, 40, 60]), column([10, 20, 40, 60].map((x) => (5e6 - Math.log(1 - 20e-9 * 2e5 * x) / 20e-9) / 1e5))];
    case "PRESSUREUNC": return [1000, 0.25];
    case "MFRPOINT": return [10, "cm3/10min", 2.16];
    case "PLAN": return [
      [["barrelDiameter", 15], ["usable length", "200 mm"], ["density", 0.76], ["dwellTime", 60], ["shearRateMin", 10], ["shearRateMax", 1000], ["points", 4], ["priorModel", "power-law"], ["priorParameters", `K=${s.K}, n=${s.n}`], ["endCorrection", s.e]],
      [["name", "type", "diameter [mm]", "length [mm]"], ["L20", "capillary", s.D, 20 * s.D]],
      [["name", "full_scale [bar]", "accuracy [%]"], ["P100", 100, 0.25], ["P1000", 1000, 0.25]],
    ];
    case "PLATEAUS": {
      // one die run: a step per rate, 30 s each at 2 Hz, approaching its pressure with τ = 1 s (compressionTime.ts)
      const time: number[] = [];
      const speed: number[] = [];
      const pressure: number[] = [];
      let p = 0;
      rates.forEach((g, i) => {
        const target = bar(stress[i] as number, 20);
        const start = p;
        for (let k = 0; k < 60; k++) {
          p = target + (start - target) * Math.exp(-k / 2);
          time.push(30 * i + k / 2);
          speed.push(g / 10);
          pressure.push(p);
        }
      });
      return [column(time), column(speed), column(pressure)];
    }
    case "LOTCHECK": return [column(wall), column(eta.map((v) => v * 1.03)), column(wall), column(eta)];
    default: return undefined;
  }
}

/** One change to a valid call: none, an argument replaced, a cell replaced, or a range scaled. */
const mutation = fc.oneof(
  { weight: 2, arbitrary: fc.constant({ kind: "none" as const }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant("argument" as const), index: fc.nat(), range: anyRange, option: anyOption }) },
  { weight: 3, arbitrary: fc.record({ kind: fc.constant("cell" as const), index: fc.nat(), cell: fc.nat(), junk: anyCell }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant("scale" as const), index: fc.nat(), power: fc.constantFrom(-6, -3, -1, 1, 3, 6) }) },
);
type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

function mutate(args: unknown[], f: SheetFunction, m: Mutation): unknown[] {
  const out = args.map((a) => (Array.isArray(a) ? (a as unknown[][]).map((r) => [...r]) : a));
  if (m.kind === "none" || out.length === 0) return out;
  const ranges = out.map((a, i) => (Array.isArray(a) ? i : -1)).filter((i) => i >= 0);
  if (m.kind === "argument") {
    const i = m.index % out.length;
    out[i] = f.parameters[i]?.dimensionality === "matrix" ? m.range : m.option;
    return out;
  }
  if (ranges.length === 0) return out;
  const grid = out[ranges[m.index % ranges.length] as number] as unknown[][];
  const cells = grid.flatMap((r, i) => r.map((_, j) => [i, j] as const));
  if (m.kind === "cell") {
    const [i, j] = cells[m.cell % cells.length] as readonly [number, number];
    (grid[i] as unknown[])[j] = m.junk;
  } else {
    for (const r of grid) r.forEach((v, j) => (r[j] = typeof v === "number" ? v * 10 ** m.power : v));
  }
  return out;
}

const num = (grid: unknown[][], r = 0, c = 0): number => {
  const v = (grid[r] as unknown[])[c];
  if (typeof v !== "number") throw new Error(`expected a number, got ${v instanceof FakeCustomFunctionError ? `${v.code} ${v.message}` : String(v)}`);
  return v;
};

/** A positive scale factor. */
const factor = fc.double({ min: -3, max: 3, noNaN: true }).map((e) => Math.pow(10, e));

describe("physical identities on valid input", () => {
  test("RHEO.WALLSTRESSAPP = ΔP·D/(4L) (SI) and scales linearly with pressure", () => {
    fc.assert(
      fc.property(plausible, plausible, plausible, factor, (p, d, l, k) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const tau = num(sheet.wallStressApp(cell(p), cell(d), cell(l)));
        expectClose(tau, (p * 1e5 * d * 1e-3) / (4 * l * 1e-3), { rel: 1e-12 }, "closed form");
        expectClose(num(sheet.wallStressApp(cell(k * p), cell(d), cell(l))), k * tau, { rel: 1e-12 }, "linear in ΔP");
        expectClose(num(sheet.wallStressApp(cell(p), cell(k * d), cell(k * l))), tau, { rel: 1e-12 }, "depends on L/D only");
      }),
      { seed: SEED, numRuns: RUNS.identity },
    );
  });

  test("RHEO.WALLSTRESS with no entrance loss and RHEO.WALLSTRESSEND with e = 0 equal the apparent stress; both scale with pressure", () => {
    fc.assert(
      fc.property(plausible, plausible, plausible, factor, fc.double({ min: 0, max: 0.9, noNaN: true }), (p, d, l, k, share) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const app = num(sheet.wallStressApp(cell(p), cell(d), cell(l)));
        expectClose(num(sheet.wallStress(cell(p), cell(0), cell(d), cell(l))), app, { rel: 1e-12 });
        expectClose(num(sheet.wallStressEnd(cell(p), cell(0), cell(d), cell(l))), app, { rel: 1e-12 });
        const corrected = num(sheet.wallStress(cell(p), cell(share * p), cell(d), cell(l)));
        expectClose(num(sheet.wallStress(cell(k * p), cell(k * share * p), cell(d), cell(l))), k * corrected, { rel: 1e-12 });
        const e = share * 10;
        expectClose(num(sheet.wallStressEnd(cell(p), cell(e), cell(d), cell(l))), (p * 1e5) / (2 * ((2 * l) / d + e)), { rel: 1e-12 });
      }),
      { seed: SEED + 1, numRuns: RUNS.identity },
    );
  });

  test("RHEO.FLOWRATE = v·πDb²/4 and RHEO.SHEARRATEAPP = 32Q/(πD³) (1 mm/min = 1/60 mm/s)", () => {
    fc.assert(
      fc.property(plausible, plausible, plausible, factor, (v, db, d, k) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const q = num(sheet.flowRate(cell(v), cell(db)));
        expectClose(q, ((v / 60) * Math.PI * db * db) / 4, { rel: 1e-12 }, "Q in mm3/s");
        expectClose(num(sheet.flowRate(cell(k * v), cell(db))), k * q, { rel: 1e-12 }, "linear in speed");
        const rate = num(sheet.shearRateApp(cell(q), cell(d)));
        expectClose(rate, (32 * q) / (Math.PI * d ** 3), { rel: 1e-12 }, "γ̇a in 1/s");
        expectClose(num(sheet.shearRateApp(cell(q), cell(k * d))), rate / k ** 3, { rel: 1e-12 }, "∝ D⁻³");
      }),
      { seed: SEED + 2, numRuns: RUNS.identity },
    );
  });

  /** 5–12 distinct rates, ascending, spanning at least one decade. */
  const rates = fc
    .tuple(fc.double({ min: -2, max: 2, noNaN: true }), fc.double({ min: 1, max: 3, noNaN: true }), fc.integer({ min: 5, max: 12 }))
    .map(([start, span, n]) => Array.from({ length: n }, (_, i) => Math.pow(10, start + (span * i) / (n - 1))));

  test("a Newtonian liquid (τ = μγ̇): apparent and true viscosity are μ at every rate, n' = 1", () => {
    const methods = ["transition", "local", "global", "difference"];
    fc.assert(
      fc.property(rates, plausible, fc.constantFrom(...methods), (gs, mu, method) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const tau = gs.map((g) => mu * g);
        const app = sheet.viscosityApp(col(...gs), col(...tau));
        gs.forEach((_, i) => expectClose(num(app, i), mu, { rel: 1e-12 }, "η_a"));
        const n = sheet.nPrime(col(...gs), col(...tau), method);
        const eta = sheet.viscosity(col(...gs), col(...tau), method);
        gs.forEach((_, i) => {
          expectClose(num(n, i), 1, { abs: 1e-6 }, `n' (${method})`);
          expectClose(num(eta, i), mu, { rel: 1e-6 }, `η (${method})`);
        });
      }),
      { seed: SEED + 3, numRuns: RUNS.newtonian },
    );
  });

  test("a power-law liquid (τw = Kγ̇wⁿ): n' = n, γ̇w = γ̇a(3n+1)/(4n), η = K·γ̇w^(n−1)", () => {
    fc.assert(
      fc.property(rates, plausible, fc.double({ min: 0.15, max: 1.5, noNaN: true }), fc.constantFrom("local", "global", "difference"), (gs, k, n, method) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const tau = gs.map((g) => k * ((3 * n + 1) / (4 * n)) ** n * g ** n); // τw at apparent rate g
        const np = sheet.nPrime(col(...gs), col(...tau), method);
        const wall = sheet.shearRateWall(col(...gs), col(...tau), method);
        const eta = sheet.viscosity(col(...gs), col(...tau), method);
        gs.forEach((g, i) => {
          const gw = (g * (3 * n + 1)) / (4 * n);
          expectClose(num(np, i), n, { abs: 1e-8 }, `n' (${method})`);
          expectClose(num(wall, i), gw, { rel: 1e-8 }, `γ̇w (${method})`);
          expectClose(num(eta, i), k * gw ** (n - 1), { rel: 1e-8 }, `η (${method})`);
        });
      }),
      { seed: SEED + 4, numRuns: RUNS.powerLaw },
    );
  });

  test("RHEO.REDUCE of Newtonian data with entrance losses (Bagley over 3 dies) gives η = μ at every rate", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 3, noNaN: true }),
        fc.double({ min: 1, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.integer({ min: 5, max: 9 }),
        (d, mu, e, points) => {
          generated++;
          tally.cases++;
          tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
          const rows: unknown[][] = [["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"]];
          for (const ld of [5, 10, 20]) {
            for (let i = 0; i < points; i++) {
              const q = Math.pow(10, -1 + (2.5 * i) / (points - 1)); // mm3/s
              const rate = (32 * q * 1e-9) / (Math.PI * (d * 1e-3) ** 3);
              const pressure = 2 * mu * rate * (2 * ld + e); // ΔP = 2τw(L/R + e), Pa
              rows.push([d, ld * d, q, pressure / 1e5]);
            }
          }
          const table = sheet.reduceData(rows, "bagley", "global", 1);
          const header = table[0] as unknown[];
          const at = header.findIndex((h) => typeof h === "string" && h.startsWith("viscosity ["));
          expect(table.length).toBe(points + 1);
          for (let r = 1; r < table.length; r++) expectClose(num(table, r, at), mu, { rel: 1e-6 }, `row ${r}`);
        },
      ),
      { seed: SEED + 5, numRuns: RUNS.reduce },
    );
  });

  test("RHEO.CONVERT there and back returns the value; linear units scale linearly", () => {
    const quantities = knownQuantities().filter((q) => acceptedUnits(q).length >= 2);
    const pair = fc.constantFrom(...quantities).chain((q: Quantity) => fc.tuple(fc.constant(q), fc.constantFrom(...acceptedUnits(q)), fc.constantFrom(...acceptedUnits(q))));
    fc.assert(
      fc.property(pair, plausible, factor, ([q, from, to], v, k) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const there = num(sheet.convert(cell(v), from, to, q));
        expectClose(num(sheet.convert(cell(there), to, from, q)), v, { rel: 1e-12, abs: 1e-12 });
        if (!/temperature$/i.test(q) || /difference/i.test(q)) {
          expectClose(num(sheet.convert(cell(k * v), from, to, q)), k * there, { rel: 1e-12 });
        }
      }),
      { seed: SEED + 6, numRuns: RUNS.convert },
    );
  });
});

describe("the adapter's unit conversions (resolved once per unit)", () => {
  test("equal the core's toSI and fromSI bit for bit, for every unit of every quantity", () => {
    const unit = fc.constantFrom(...knownQuantities()).chain((q: Quantity) => fc.tuple(fc.constant(q), fc.constantFrom(...acceptedUnits(q))));
    fc.assert(
      fc.property(unit, fc.oneof(plausible, fc.double({ noNaN: true }), fc.constantFrom(0, -0, 1e-300, -5)), ([q, u], v) => {
        generated++;
        tally.cases++;
        tally.reachedCore++; // an identity that returned the expected numbers (a failure stops the test)
        const scale = unitScale(q, u, "value");
        expect(Object.is(scale.toSI(v), toSI(v, u, q))).toBe(true);
        expect(Object.is(scale.fromSI(v), fromSI(v, u, q))).toBe(true);
      }),
      { seed: SEED + 8, numRuns: RUNS.unitScale },
    );
  });
});

describe("paired ranges", () => {
  test("two ranges longer than one cell and of different lengths are #VALUE! naming an argument", () => {
    const pairs: [string, (a: unknown[][], b: unknown[][]) => unknown[][]][] = [
      ["flowRate", (a, b) => sheet.flowRate(a, b)],
      ["shearRateApp", (a, b) => sheet.shearRateApp(a, b)],
      ["wallStressApp", (a, b) => sheet.wallStressApp(a, b, cell(20))],
      ["viscosityApp", (a, b) => sheet.viscosityApp(a, b)],
      ["viscosity", (a, b) => sheet.viscosity(a, b)],
    ];
    fc.assert(
      fc.property(fc.constantFrom(...pairs), fc.array(plausible, { minLength: 2, maxLength: 12 }), fc.array(plausible, { minLength: 2, maxLength: 12 }), fc.boolean(), ([, call], a, b, asRow) => {
        fc.pre(a.length !== b.length);
        generated++;
        const shape = (vs: number[]) => (asRow ? [vs] : vs.map((v) => [v]));
        const out = call(shape(a), shape(b));
        const e = (out[0] as unknown[])[0];
        expect(out).toHaveLength(1);
        expect(e).toBeInstanceOf(FakeCustomFunctionError);
        expect((e as FakeCustomFunctionError).code).toBe("#VALUE!");
        expect((e as FakeCustomFunctionError).message).toMatch(/^\w+: has \d+ cells but \w+ has \d+; paired ranges must have equal lengths$/);
        tally.cases++;
        countError(tally, "#VALUE!");
      }),
      { seed: SEED + 7, numRuns: RUNS.mismatch },
    );
  });
});

test("generated cases in this file: at least 9 000, half of the calls reaching the calculations (report: test-output/fuzz-report.json)", () => {
  expect(generated).toBeGreaterThanOrEqual(9000);
  writeFuzzReport("worksheet-functions", tally);
  expect(tally.reachedCore / tally.cases).toBeGreaterThanOrEqual(0.5);
});
