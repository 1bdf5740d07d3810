/**
 * Raw files written the way labs write them (test/fixtures/lab-*.csv, made by
 * scripts/make-flow-fixtures.ts from an invented Carreau–Yasuda melt whose exact flow curve is in
 * lab-truth.json) through the whole command line: repeats, a spurt, jittered speeds. Checks the
 * stability table, the flow-instability handling, one rate ladder, and that every row is accounted.
 */
import { readFileSync } from "node:fs";
import { main } from "../src/cli/main";
import { reduce, type Measurement } from "../src/core/reduce";
import { expectClose } from "./helpers/expectClose";
import { BENCH_MELTS, capillaryRun, carreauYasuda, logRates, trueCurve } from "./helpers/capillaryRun";

const TRUTH = JSON.parse(readFileSync("test/fixtures/lab-truth.json", "utf8")) as {
  melt: { eta0: number; lambda: number; a: number; n: number };
  points: { shearRateApparent: number; shearRateWall: number; wallShearStress: number; viscosity: number }[];
};

async function reduceJson(file: string, extra: string[] = []) {
  let stdout = "";
  let stderr = "";
  const code = await main(["reduce", file, "--json", ...extra], { readFile: (p) => readFileSync(p, "utf8"), stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  expect(stderr).toBe("");
  expect(code).toBe(0);
  return JSON.parse(stdout);
}

/** True viscosity (Pa·s) at a true wall rate: the generating Carreau–Yasuda law (Yasuda, Armstrong & Cohen 1981). */
const trueViscosity = carreauYasuda(TRUTH.melt.eta0, TRUTH.melt.lambda, TRUTH.melt.a, TRUTH.melt.n);

/** rowsRead = rowsUsed + Σ rowsSkipped (core/rowAccount.ts). */
function expectAccounted(rows: { rowsRead: number; rowsUsed: number; rowsSkipped: Record<string, number> }, read: number) {
  expect(rows.rowsRead).toBe(read);
  expect(rows.rowsUsed + Object.values(rows.rowsSkipped).reduce((s, n) => s + n, 0)).toBe(read);
}

describe("lab-repeats.csv: the first speed repeated at the end of each die, one copied row", () => {
  let doc: Awaited<ReturnType<typeof reduceJson>>;
  beforeAll(async () => {
    doc = await reduceJson("test/fixtures/lab-repeats.csv");
  });

  test("the stability table lists each repeat against the first reading, with its change in per cent of the file's own pressures", () => {
    const g = doc.groups[0];
    expect(g.stability).toHaveLength(3);
    const byDie = Object.fromEntries(g.stability.map((s: { die: string }) => [s.die, s]));
    // L = 30 mm: 36.12 bar first (line 24), 33.86 bar repeat (line 33) in the file
    const l30 = byDie["L=30 mm"];
    expect([l30.firstRow, l30.repeatRow, l30.used]).toEqual([24, 33, "first"]);
    expectClose(l30.firstPressure, 36.12e5, { rel: 1e-12 });
    expectClose(l30.change, 33.86 / 36.12 - 1, { rel: 1e-9 });
    expect(byDie["L=10 mm"].used).toBe("mean");
    expect(byDie["L=20 mm"].used).toBe("mean");
  });

  test("REPEAT_DRIFT names the die, the speed and both rows; DUPLICATE_ROWS the copied line; REPEATS_AVERAGED the others", () => {
    const codes = doc.warnings.map((w: { code: string }) => w.code);
    expect(codes).toEqual(expect.arrayContaining(["REPEAT_DRIFT", "DUPLICATE_ROWS", "REPEATS_AVERAGED"]));
    const drift = doc.warnings.find((w: { code: string }) => w.code === "REPEAT_DRIFT");
    expect(drift.message).toContain("L=30 mm at 18 1/s, row 33 reads −6.3 % against row 24");
    expect(doc.warnings.find((w: { code: string }) => w.code === "DUPLICATE_ROWS").message).toContain("rows 17 and 18 (L=20 mm)");
  });

  test("every row is accounted: 31 read = 27 used + 2 merged repeats + 1 duplicate + 1 drifted", () => {
    const g = doc.groups[0];
    // 3 dies × 9 speeds + 3 repeats + 1 copy = 31 rows; 27 steps used; 2 repeats averaged; 1 duplicate; 1 drifted
    expectAccounted(g.rows, 31);
    expect(g.rows).toEqual({ rowsRead: 31, rowsUsed: 27, rowsSkipped: { repeat: 2, duplicate: 1, drifted: 1 } });
    // the file's account: the reader's rows with the reduction's skips moved out of "used"
    expect(doc.rows).toEqual(g.rows);
    expect(g.dies.map((d: { points: number; steps: number }) => [d.points, d.steps])).toEqual([[10, 9], [11, 9], [10, 9]]);
  });

  test("the drifted repeat never reaches the result: the reduction equals that of the file without it", async () => {
    const text = readFileSync("test/fixtures/lab-repeats.csv", "utf8").split("\n");
    const without = text.filter((_, i) => i !== 32).join("\n"); // line 33: the drifted repeat
    let stdout = "";
    await main(["reduce", "x.csv", "--json"], { readFile: () => without, stdout: (t) => (stdout += t), stderr: () => undefined });
    expect(JSON.parse(stdout).groups[0].flowCurve).toEqual(doc.groups[0].flowCurve);
  });

  test("the viscosity follows the generating law within 1.5 % at every point (0.3 % pressure noise)", () => {
    for (const f of doc.groups[0].flowCurve) expectClose(f.viscosity, trueViscosity(f.shearRateWall), { rel: 0.015 });
  });
});

describe("lab-spurt.csv: pressures 15 % low from the eighth speed up (the trial of issue 12)", () => {
  let doc: Awaited<ReturnType<typeof reduceJson>>;
  beforeAll(async () => {
    doc = await reduceJson("test/fixtures/lab-spurt.csv");
  });

  test("FLOW_INSTABILITY names the dies, the speed range and the wall stress at the onset", () => {
    const w = doc.warnings.find((x: { code: string }) => x.code === "FLOW_INSTABILITY");
    expect(w.message).toContain("dies L=10 mm, L=20 mm, L=30 mm: from 2400 1/s to 9600 1/s");
    expect(w.message).toMatch(/1[45] % below the continuation/);
    expect(w.message).toContain("wall stress of 0.145 MPa");
    expect(w.severity).toBe("caution");
  });

  test("the branch above is flagged, not smoothed: 9 readings flagged, the flow curve stops at 1200 1/s", () => {
    const g = doc.groups[0];
    expect(g.flagged).toHaveLength(9);
    expect(g.flagged.every((f: { reason: string }) => f.reason === "FLOW_INSTABILITY")).toBe(true);
    expect(g.flowCurve.map((f: { shearRateApparent: number }) => f.shearRateApparent)).toEqual([18, 36, 75, 150, 300, 600, 1200]);
    expect(g.rows).toEqual({ rowsRead: 30, rowsUsed: 21, rowsSkipped: { instability: 9 } });
  });

  test("below the break the viscosity follows the generating law within 1.5 % (smoothed across the break it was 22 % low and 14 % high)", () => {
    for (const f of doc.groups[0].flowCurve) expectClose(f.viscosity, trueViscosity(f.shearRateWall), { rel: 0.015 });
  });
});

describe("lab-jittered.csv: measured speeds within ±1.5 % of the set-points", () => {
  let doc: Awaited<ReturnType<typeof reduceJson>>;
  beforeAll(async () => {
    doc = await reduceJson("test/fixtures/lab-jittered.csv");
  });

  test("one flow-curve point per speed of the longest die (9, not 13 from a union of rates); interpolated pressures counted per line", () => {
    const g = doc.groups[0];
    expect(g.flowCurve).toHaveLength(9);
    const longest = g.dies[g.dies.length - 1];
    expect(longest.steps).toBe(9);
    g.bagley.forEach((b: { interpolated: number; diesUsed: number }) => {
      expect(b.diesUsed).toBe(3);
      expect(b.interpolated).toBe(2);
    });
    expect(g.rows).toEqual({ rowsRead: 27, rowsUsed: 27, rowsSkipped: {} });
  });

  test("the viscosity follows the generating law within 1.5 %", () => {
    for (const f of doc.groups[0].flowCurve) expectClose(f.viscosity, trueViscosity(f.shearRateWall), { rel: 0.015 });
  });
});

describe("nothing dropped silently (issue 20)", () => {
  test("a dense ladder (3 dies × 5000 speeds 0.12 % apart) keeps every speed: 5000 flow-curve points, every row used", () => {
    const K = 2e4;
    const n = 0.4;
    const rates = logRates(10, 4000, 5000);
    const wall = rates.map((r) => (r * (3 * n + 1)) / (4 * n));
    // power law: γ̇_w = γ̇_a(3n+1)/(4n) exactly (Macosko 1994, ch. 6, from memory)
    const run: Measurement[] = capillaryRun({ rates, wallRates: wall, stresses: wall.map((w) => K * w ** n) }, { lengthsOverDiameter: [10, 20, 30] });
    const result = reduce(run);
    const g = result.groups[0] as (typeof result.groups)[number];
    expect(g.flowCurve).toHaveLength(5000);
    expect(g.rows).toEqual({ rowsRead: 15000, rowsUsed: 15000, rowsSkipped: {} });
    g.flowCurve.forEach((f, i) => expectClose(f.shearRateWall as number, wall[i] as number, { rel: 0.003 }));
  });

  test("each die's first speed run again at the end of the ladder: the repeats are merged and counted, nothing else changes", () => {
    const curve = trueCurve(BENCH_MELTS.Cross, logRates(20, 5000, 8));
    const base = capillaryRun(curve, { noise: 0.003, seed: 5 });
    const repeats = [0, 8, 16, 24].map((i) => ({ ...(base[i] as Measurement), pressure: (base[i] as Measurement).pressure * 1.004, row: 100 + i }));
    const result = reduce([...base, ...repeats]);
    const g = result.groups[0] as (typeof result.groups)[number];
    expect(g.rows).toEqual({ rowsRead: 36, rowsUsed: 32, rowsSkipped: { repeat: 4 } });
    expect(g.stability.map((s) => s.used)).toEqual(["mean", "mean", "mean", "mean"]);
    expect(g.flowCurve).toHaveLength(8);
  });
});

describe("the stability limit is a setting; the new results are tables on every surface", () => {
  test("--stability-threshold 10 % averages the L = 30 mm repeat that drifted 6.3 %", async () => {
    const doc = await reduceJson("test/fixtures/lab-repeats.csv", ["--stability-threshold", "10 %"]);
    const g = doc.groups[0];
    expect(g.stability.map((s: { used: string }) => s.used)).toEqual(["mean", "mean", "mean"]);
    expect(g.rows).toEqual({ rowsRead: 31, rowsUsed: 27, rowsSkipped: { repeat: 3, duplicate: 1 } });
    expect(doc.warnings.map((w: { code: string }) => w.code)).not.toContain("REPEAT_DRIFT");
  });

  test("a limit of 100 % or more is refused, naming the flag", async () => {
    let stderr = "";
    const code = await main(["reduce", "test/fixtures/lab-repeats.csv", "--stability-threshold", "150 %"], { readFile: (p) => readFileSync(p, "utf8"), stdout: () => undefined, stderr: (t) => (stderr += t) });
    expect(code).not.toBe(0);
    expect(stderr).toContain("--stability-threshold: must be below 100 %, got 150 %");
  });

  test("text output: the stability table, the flagged readings, the row accounting and the smoother of each group", async () => {
    let text = "";
    const io = { readFile: (p: string) => readFileSync(p, "utf8"), stdout: (t: string) => (text += t), stderr: () => undefined };
    await main(["reduce", "test/fixtures/lab-repeats.csv"], io);
    expect(text).toContain("Repeated readings (stability check)");
    expect(text).toMatch(/L=30 mm\s+18\s+24\s+36\.12\s+33\s+33\.86\s+-6\.26\s+first reading only/);
    expect(text).toContain("Rows used and left out");
    expect(text).toContain("31 lines read: 27 used, 2 merged as a repeated reading, 1 exact duplicate, 1 drifted repeat.");
    text = "";
    await main(["reduce", "test/fixtures/lab-spurt.csv"], io);
    expect(text).toContain("Set aside above a flow instability");
    text = "";
    await main(["reduce", "test/fixtures/lab-spurt.csv", "--summary"], io);
    expect(text).toContain("(transition)");
    expect(text).toContain("Input: 30 rows read: 21 used, 9 above a flow instability.");
  });

  test("JSON: smoother per group names the curve and why", async () => {
    const doc = await reduceJson("test/fixtures/lab-spurt.csv");
    expect(doc.groups[0].smoother).toEqual(expect.objectContaining({ method: "transition", curve: "transition", points: 7 }));
    expect(doc.groups[0].smoother.reason).toContain("n′ → 1 at low rates");
  });
});
