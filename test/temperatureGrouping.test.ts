/**
 * Grouping measured melt temperatures by set-point (src/core/grouping.ts). The data are an invented
 * run (scripts/make-input-fixtures.ts: power-law melt, three dies); the temperatures are what an
 * instrument records, jittering around the set-points. Rule of the issue (common practice, no
 * source): readings within the tolerance (default 1 K) are one set-point, reported at their mean
 * with their spread; a spread above the tolerance is a warning, never a silent split.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { DEFAULT_REDUCE_OPTIONS, type Measurement, reduce } from "../src/core/reduce";
import { SETPOINT_MIN_SPACING, groupTemperatures } from "../src/core/grouping";
import { main } from "../src/cli/main";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import * as sheet from "../src/functions/functions";
import { expectClose } from "./helpers/expectClose";
import { installOfficeRuntime } from "./helpers/sheet";

const FIXTURE = (name: string) => join(__dirname, "fixtures", "input", name);
const measurementsOf = (name: string): Measurement[] => {
  const csv = parseCsv(readFileSync(FIXTURE(name), "utf8"));
  return readRawTable(csv.lines.map((l) => l.cells), { rowWord: "line", headerNumber: csv.lines[0]?.line, rowNumbers: csv.lines.map((l) => l.line) }).measurements;
};
const K = (celsius: number) => celsius + 273.15;

describe("groupTemperatures(readings, tolerance)", () => {
  test("jittered readings of one set-point form one group whatever their number; set-points apart stay apart", () => {
    expect(groupTemperatures([K(190.3), K(189.8), K(210.2), K(190.1), K(209.7)], 1)).toEqual([[1, 3, 0], [4, 2]]);
  });
  test("a new set-point starts only where neighbouring readings differ by more than the tolerance", () => {
    expect(groupTemperatures([K(189), K(190.5)], 1)).toEqual([[0], [1]]);
    expect(groupTemperatures([K(189), K(190.5)], 2)).toEqual([[0, 1]]);
    expect(groupTemperatures([], 1)).toEqual([]);
  });
  test("the default tolerance is 1 K", () => expect(DEFAULT_REDUCE_OPTIONS.temperatureTolerance).toBe(1));
});

describe("reduce() of jittered temperatures (test/fixtures/input/jittered.csv)", () => {
  const plain = reduce(measurementsOf("plain.csv"));
  const jittered = measurementsOf("jittered.csv");
  const result = reduce(jittered);
  test("two groups, one per set-point, not one per reading", () => {
    expect(result.groups).toHaveLength(2);
    expect(result.groups.map((g) => g.dies.length)).toEqual([3, 3]);
  });
  test("each group is reported at the mean of its readings, with their count, range and spread", () => {
    for (const [i, setPoint] of [190, 230].entries()) {
      const readings = jittered.map((m) => m.temperature as number).filter((t) => Math.abs(t - K(setPoint)) < 2);
      const g = result.groups[i]!;
      expectClose(g.temperature as number, readings.reduce((s, t) => s + t, 0) / readings.length, { rel: 1e-14 });
      expect(g.temperatureReadings).toEqual({ count: 21, min: Math.min(...readings), max: Math.max(...readings) });
      expectClose(g.temperatureSpread as number, 0.7, { abs: 1e-9 }); // −0.4 to +0.3 K, the fixture's jitter
    }
    expect(result.warnings.filter((w) => w.code.startsWith("TEMPERATURE"))).toEqual([]);
  });
  test("the flow curves are those of the same run without jitter", () => {
    result.groups.forEach((g, i) =>
      g.flowCurve.forEach((f, k) => expectClose(f.viscosity as number, plain.groups[i]!.flowCurve[k]!.viscosity as number, { rel: 1e-12 })),
    );
  });
});

describe("a spread above the tolerance is a warning, never a silent split", () => {
  const base = measurementsOf("plain.csv").filter((m) => Math.abs((m.temperature as number) - K(190)) < 1e-9);
  test("one die's series drifting 1.8 K stays in its group; the warning names the die and its rows", () => {
    let step = 0;
    const drifting = base.map((m) => (m.dieLength === 0.02 ? { ...m, temperature: K(189.1 + 0.3 * step++) } : m));
    const r = reduce(drifting);
    expect(r.groups).toHaveLength(1);
    expectClose(r.groups[0]!.temperatureSpread as number, 1.8, { abs: 1e-9 });
    const w = r.warnings.filter((x) => x.code === "TEMPERATURE_SPREAD");
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toMatch(/span 1\.8 K \(189\.1 °C to 190\.9 °C\), more than the tolerance of 1 K; they are kept as one set-point/);
    expect(w[0]!.message).toMatch(/The die D 1 mm, L 20 mm alone spans 1\.8 K \(row 10 at 189\.1 °C, row 16 at 190\.9 °C\)/);
  });
  test("two sets of readings 1.5 K apart form two groups, and the warning says how to join them", () => {
    const split = base.map((m, i) => ({ ...m, temperature: K(i % 2 === 0 ? 189 : 190.5) }));
    const r = reduce(split);
    expect(r.groups).toHaveLength(2);
    const w = r.warnings.filter((x) => x.code === "TEMPERATURE_GROUPS_CLOSE");
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toMatch(/are 1\.5 K apart, more than the tolerance of 1 K, so they form two groups 1\.5 K apart\. If they are one set-point, give a temperature tolerance of at least 1\.5 K/);
    expect(1.5).toBeLessThan(SETPOINT_MIN_SPACING);
    expect(reduce(split, { temperatureTolerance: 1.5 }).groups).toHaveLength(1);
  });
  test("a negative tolerance is refused", () => {
    expect(() => reduce(base, { temperatureTolerance: -1 })).toThrow(/^temperatureTolerance: must not be negative/);
  });
});

describe("the tolerance on every surface", () => {
  // the 190 °C rows of plain.csv with readings alternating 189 and 190.5 °C: two groups at 1 K, one at 2 K
  const lines = readFileSync(FIXTURE("plain.csv"), "utf8").split("\n").filter((l) => l.startsWith("190,"));
  const header = readFileSync(FIXTURE("plain.csv"), "utf8").split("\n")[1] as string;
  const text = [header, ...lines.map((l, i) => l.replace(/^190,/, i % 2 === 0 ? "189," : "190.5,"))].join("\n") + "\n";
  const run = async (args: string[]) => {
    let stdout = "";
    let stderr = "";
    const code = await main(args, { readFile: () => text, stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
    return { code, stdout, stderr };
  };
  test("CLI --temperature-tolerance with a unit; a bare number is refused", async () => {
    expect(JSON.parse((await run(["reduce", "split.csv", "--json"])).stdout).groups).toHaveLength(2);
    const joined = await run(["reduce", "split.csv", "--json", "--temperature-tolerance", "2 K"]);
    expect(joined.code).toBe(0);
    const doc = JSON.parse(joined.stdout);
    expect(doc.groups).toHaveLength(1);
    expectClose(doc.groups[0].temperatureSpread, 1.5, { abs: 1e-9 });
    expect(doc.groups[0].temperatureReadings).toEqual({ count: 21, min: K(189), max: K(190.5) });
    const bare = await run(["reduce", "split.csv", "--temperature-tolerance", "2"]);
    expect(bare.code).toBe(1);
    expect(bare.stderr).toMatch(/--temperature-tolerance: needs a unit, e\.g\. "2 K"/);
    expect((await run(["reduce", "split.csv", "--json", "--temperature-tolerance", "2", "--si"])).code).toBe(0);
  });
  test("RHEO.REDUCE settings range: temperatureTolerance (a bare number in K)", () => {
    const uninstall = installOfficeRuntime();
    try {
      const cells = text.trim().split("\n").map((l, r) => l.split(",").map((c) => (r === 0 ? c : Number(c))));
      const temps = (out: unknown[][]) => new Set(out.slice(1).map((row) => row[0]));
      expect(temps(sheet.reduceData(cells)).size).toBe(2);
      const joined = [...temps(sheet.reduceData(cells, undefined, undefined, undefined, undefined, undefined, undefined, undefined, false, [["temperatureTolerance", 2]]))];
      expect(joined).toHaveLength(1);
      expectClose(joined[0] as number, (11 * 189 + 10 * 190.5) / 21, { abs: 1e-9 }); // the mean of the readings, °C
    } finally {
      uninstall();
    }
  });
});
