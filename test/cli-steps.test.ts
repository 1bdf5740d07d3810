/**
 * The command line with pressure recordings: `reduce TRACE.csv` (one or several files, --blank),
 * `steps TRACE.csv [--out] [--json]`, and the JSON "steps" of each group. Data: the invented demo
 * recording (scripts/demo/filmGradeRecording.ts) and recordings made here from known plateaus
 * (first-order approach, src/core/compressionTime.ts).
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import ExcelJS from "exceljs";
import { main } from "../src/cli/main";
import { nodeIO } from "../src/cli/nodeIO";
import { expectClose } from "./helpers/expectClose";
import { syntheticRun } from "./helpers/syntheticTrace";

const DEMO = "workbooks/demo-film-grade-recording.csv";
const DEMO_TEXT = readFileSync(DEMO, "utf8");

async function run(args: string[], files: Record<string, string> = {}) {
  let stdout = "";
  let stderr = "";
  const written: Record<string, string> = {};
  const code = await main(args, {
    readFile: (p) => {
      if (p in files) return files[p] as string;
      if (p in written) return written[p] as string;
      return readFileSync(p, "utf8");
    },
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    writeFile: (p, data) => (written[p] = typeof data === "string" ? data : new TextDecoder().decode(data)),
  });
  return { code, stdout, stderr, written };
}

/** The demo's lines of one die length (header kept), as a file of its own. */
function demoPart(lengthMm: number): string {
  const lines = DEMO_TEXT.trim().split("\n");
  return [lines[0], lines[1], ...lines.slice(2).filter((l) => l.split(",")[5] === String(lengthMm))].join("\n") + "\n";
}

describe("rheoledger reduce TRACE.csv", () => {
  test("--json: each group has steps with exactly the contract's keys (SI), plus thermal checks", async () => {
    const r = await run(["reduce", DEMO, "--json"]);
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.groups).toHaveLength(1);
    const steps = doc.groups[0].steps as Record<string, unknown>[];
    expect(steps).toHaveLength(27);
    for (const s of steps) expect(Object.keys(s)).toEqual(["dieLength", "pistonSpeed", "pressure", "pressureStd", "start", "end", "steady"]);
    expect(steps[0]).toMatchObject({ dieLength: 0.01, start: 129, end: 195, steady: true });
    expectClose(steps[0]!.pistonSpeed as number, 0.6e-3 / 60, { rel: 0.003 });
    expect(steps.filter((s) => s.steady === false)).toHaveLength(1);
    expect(doc.thermalChecks.map((c: { run: number; withinLimit: boolean }) => [c.run, c.withinLimit])).toEqual([[1, true], [2, true], [3, false]]);
    expect(doc.warnings.map((w: { code: string }) => w.code).slice(0, 3)).toEqual(["STEP_NOT_STEADY", "FLOW_INSTABILITY", "THERMAL_CHECK_CHANGE"]);
    // 8 speeds; the top one's plateau on the longest die is a stick–slip time average that stalls
    // below the trend, so the corrected curve's top point is set aside as a flow instability
    expect(doc.groups[0].flowCurve).toHaveLength(7);
    expect(doc.groups[0].flagged.map((f: { source: string; reason: string }) => [f.source, f.reason])).toEqual([["flow curve", "FLOW_INSTABILITY"]]);
  });

  test("text: the step table under its group, the thermal checks, the warnings", async () => {
    const r = await run(["reduce", DEMO]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^== 190 °C, D 1 mm[^\n]*; dies: [^\n]*\n\nSteps of the pressure recording\n/);
    expect(r.stdout).toContain("Repeated first speed (thermal stability)");
    expect(r.stdout).toMatch(/\[caution\] \[THERMAL_CHECK_CHANGE\] run 3/);
  });

  test("several files give the same result as one; errors name the file", async () => {
    const files = { "a.csv": demoPart(10), "b.csv": demoPart(20), "c.csv": demoPart(30) };
    const one = JSON.parse((await run(["reduce", DEMO, "--json"])).stdout);
    const three = JSON.parse((await run(["reduce", "a.csv", "b.csv", "c.csv", "--json"], files)).stdout);
    expect(three.groups[0].flowCurve).toEqual(one.groups[0].flowCurve);
    expect(three.groups[0].steps).toEqual(one.groups[0].steps);
    const bad = await run(["reduce", "a.csv", "b.csv"], { "a.csv": demoPart(10), "b.csv": demoPart(20).replace(/\n(\d+\.\d),([^,]+),/, "\n$1,fast,") });
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/^rheoledger: b\.csv: piston_speed \[mm\/min\] \(column 2\): line 3 is text "fast", not a number/);
  });

  test("--unsteady keep keeps the cut-short step, flagged; step settings need a unit unless --si", async () => {
    const kept = JSON.parse((await run(["reduce", DEMO, "--json", "--unsteady", "keep"])).stdout);
    expect(kept.groups[0].flowCurve).toHaveLength(8);
    expect(kept.warnings[0].message).toMatch(/kept in the flow curve, flagged/);
    const bare = await run(["reduce", DEMO, "--min-window", "10"]);
    expect(bare.stderr).toMatch(/^rheoledger: --min-window: needs a unit, e\.g\. "10 s"/);
    const longer = JSON.parse((await run(["reduce", DEMO, "--json", "--min-window", "0.5 min"])).stdout);
    expect(longer.groups[0].steps.filter((s: { steady: boolean }) => !s.steady).length).toBeGreaterThan(1);
  });

  test("point tables refuse what only recordings use", async () => {
    const points = "workbooks/demo-film-grade.csv";
    expect((await run(["reduce", points, "--unsteady", "keep"])).stderr).toMatch(/^rheoledger: --unsteady: applies to pressure recordings \(a file with a "time \[s\]" column\); workbooks\/demo-film-grade\.csv \(UTF-8 text, comma-separated, decimal point\) is a point table/);
    expect((await run(["reduce", points, "--blank", "x.csv"])).stderr).toMatch(/^rheoledger: --blank: subtracts barrel friction from pressure recordings/);
    expect((await run(["reduce", points, points])).stderr).toMatch(/only pressure recordings \(a "time \[s\]" column\) are read several at a time/);
    expect((await run(["reduce", DEMO, points])).stderr).toMatch(/^rheoledger: workbooks\/demo-film-grade\.csv: is not a pressure recording/);
  });
});

describe("--blank FILE (force instruments)", () => {
  const area = (Math.PI * 0.015 ** 2) / 4;
  // plateaus 20, 45, 90 bar plus a friction of 30 N + 1 N per mm/min (invented)
  const friction = (vMmMin: number) => 30 + vMmMin;
  function forceRecording(): string {
    const steps = [1, 3, 10].map((v, i) => ({ speed: v, pressure: ([20, 45, 90][i] as number) * 1e5 * area + friction(v), duration: 60 }));
    const r = syntheticRun({ steps, tau: 2, noise: 0.002, dt: 0.5, seed: 61 });
    const rows = r.time.map((t, k) => [t, r.speed[k], (r.pressure[k] as number).toFixed(3), 1, 20, 15].join(","));
    return ["time [s],piston_speed [mm/min],force [N],die_diameter [mm],die_length [mm],barrel_diameter [mm]", ...rows].join("\n") + "\n";
  }
  const blank = "piston_speed [mm/min],force [N]\n1,31\n5,35\n10,40\n";

  test("pressure = force/area − blank friction at the step's speed", async () => {
    const r = await run(["steps", "f.csv", "--blank", "blank.csv", "--json"], { "f.csv": forceRecording(), "blank.csv": blank });
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    const steps = doc.runs[0].steps;
    [20, 45, 90].forEach((p, i) => {
      expectClose(steps[i].pressure, p * 1e5, { rel: 0.003 }, `step ${i + 1}`);
      expectClose(steps[i].friction, friction([1, 3, 10][i] as number) / area, { rel: 0.003 });
    });
    expect(doc.blank).toHaveLength(3);
    const noBlank = JSON.parse((await run(["steps", "f.csv", "--json"], { "f.csv": forceRecording() })).stdout);
    expectClose(noBlank.runs[0].steps[0].pressure, 20e5 + 31 / area, { rel: 0.003 });
  });

  test("a bad blank names the file", async () => {
    const r = await run(["steps", "f.csv", "--blank", "blank.csv"], { "f.csv": forceRecording(), "blank.csv": "piston_speed [mm/min],pressure [bar]\n1,2\n" });
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^rheoledger: blank\.csv: force: the blank run needs a "force \[N\]" column/);
  });
});

describe("rheoledger steps TRACE.csv", () => {
  test("--out writes the ordinary point table; reduce reads it to the same flow curve", async () => {
    const r = await run(["steps", DEMO, "--out", "points.csv"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("Point table written to points.csv");
    const csv = r.written["points.csv"] as string;
    expect(csv.split("\n").filter((l) => l.startsWith("# point"))).toHaveLength(23);
    expect(csv).toContain("die_diameter [mm],die_length [mm],barrel_diameter [mm],piston_speed [mm/min],pressure [bar],temperature [C]");
    const fromPoints = JSON.parse((await run(["reduce", "points.csv", "--json"], { "points.csv": csv })).stdout);
    const fromTrace = JSON.parse((await run(["reduce", DEMO, "--json"])).stdout);
    fromPoints.groups[0].flowCurve.forEach((row: Record<string, number>, i: number) => {
      // the table keeps six significant figures
      expectClose(row.viscosity!, fromTrace.groups[0].flowCurve[i].viscosity, { rel: 1e-4 }, `viscosity ${i}`);
    });
  });

  test("--out never overwrites without --force, never writes onto an input, and wants a .csv name", async () => {
    // the real process's file rules (src/cli/safeWrite.ts through nodeIO), in a fresh folder
    const dir = mkdtempSync(path.join(tmpdir(), "rheoledger-steps-"));
    const taken = path.join(dir, "taken.csv");
    writeFileSync(taken, "x");
    let stderr = "";
    const io = nodeIO({ stdout: () => undefined, stderr: (t) => (stderr += t) });
    expect(await main(["steps", DEMO, "--out", taken], io)).toBe(1);
    expect(stderr).toMatch(/--out: .*taken\.csv.* exists/);
    expect(readFileSync(taken, "utf8")).toBe("x");
    expect(await main(["steps", DEMO, "--out", taken, "--force"], io)).toBe(0);
    expect(readFileSync(taken, "utf8")).toMatch(/piston_speed/);
    stderr = "";
    expect(await main(["steps", DEMO, "--out", DEMO, "--force"], io)).toBe(1);
    expect(stderr).toMatch(/input/);
    expect((await run(["steps", DEMO, "--out", "p.xlsx"])).stderr).toMatch(/--out: expected a file name ending in \.csv/);
  });

  test("--json lists runs with every step's detail and the method", async () => {
    const doc = JSON.parse((await run(["steps", DEMO, "--json"])).stdout);
    expect(doc.runs).toHaveLength(3);
    expect(doc.runs[0].die).toEqual({ dieDiameter: 0.001, dieLength: 0.01 });
    const s8 = doc.runs[0].steps[7];
    expect(s8).toMatchObject({ step: 8, steady: false, used: false, role: "point" });
    expect(s8.note).toMatch(/^not steady: cut short/);
    expect(doc.runs[2].steps[7].oscillation.cycles).toBeGreaterThanOrEqual(3);
    expect(doc.method[0]).toMatch(/^Steps: segmented where the piston speed changes/);
  });

  test("usage and errors", async () => {
    expect((await run(["steps"])).code).toBe(2);
    expect((await run(["steps", "--help"])).stdout).toMatch(/--unsteady VALUE/);
    expect((await run(["steps", "workbooks/demo-film-grade.csv"])).stderr).toMatch(/is not a pressure recording/);
    expect((await run(["steps", DEMO, "--end-correction", "none"])).stderr).toMatch(/--end-correction: unknown option/);
  });
});

describe("rheoledger reduce TRACE.csv --out results.xlsx", () => {
  test("the workbook has the step table and how the steps were found, for a colleague to audit", async () => {
    let bytes: Uint8Array | undefined;
    const code = await main(["reduce", DEMO, "--out", "r.xlsx"], { readFile: (p) => readFileSync(p, "utf8"), stdout: () => undefined, stderr: () => undefined, writeFile: (_, d) => (bytes = d as Uint8Array) });
    expect(code).toBe(0);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(bytes as Uint8Array) as unknown as ArrayBuffer);
    const names = wb.worksheets.map((w) => w.name);
    expect(names).toEqual(expect.arrayContaining(["Steps of the pressure recording", "Repeated first speed", "Method"]));
    const rows: unknown[][] = [];
    wb.getWorksheet("Steps of the pressure recording")!.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
    // title row, header row, then one row per step (3 die runs × 9 steps)
    expect(rows[1]).toEqual(["Group", "Die run", "Die", "Step", "Piston speed [mm/s]", "Step start [s]", "Window start [s]", "Window end [s]", "Samples", "Pressure [bar]", "Pressure sd [bar]", "Steady", "In flow curve", "Note"]);
    const data = rows.slice(2).filter((r) => typeof r[1] === "number");
    expect(data).toHaveLength(27);
    const doc = JSON.parse((await run(["reduce", DEMO, "--json"])).stdout);
    expectClose(data[0]![9] as number, doc.groups[0].steps[0].pressure / 1e5, { rel: 1e-12 });
    const method: string[] = [];
    wb.getWorksheet("Method")!.eachRow((row) => method.push(String((row.values as unknown[])[1] ?? "")));
    expect(method.some((m) => /^Steps: segmented where the piston speed changes/.test(m))).toBe(true);
  });
});
