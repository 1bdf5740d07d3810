/**
 * RHEO.PLATEAUS on a synthetic recording made here (first-order approach to known plateaus, the
 * compressible-barrel model of src/core/compressionTime.ts), passed as Excel passes ranges.
 */
import { col, errorOf, installOfficeRuntime, row } from "./helpers/sheet";
import { readFileSync } from "fs";
import { plateaus } from "../src/functions/steps";
import { reduceData } from "../src/functions/functions";
import { parseCsv } from "../src/io/csv";
import { expectClose } from "./helpers/expectClose";
import { syntheticRun } from "./helpers/syntheticTrace";

let uninstall: () => void;
beforeAll(() => (uninstall = installOfficeRuntime()));
afterAll(() => uninstall());

const STEPS = [
  { speed: 1, pressure: 20, duration: 60 },
  { speed: 3, pressure: 45, duration: 60 },
  { speed: 10, pressure: 90, duration: 8 },
];
// speeds in mm/min and pressures in bar, as a sheet holds them
const r = syntheticRun({ steps: STEPS, tau: 2, noise: 0.003, dt: 0.5, seed: 31 });

describe("RHEO.PLATEAUS", () => {
  test("spills the header and one row per step in the sheet's units", () => {
    const g = plateaus(col(...r.time), col(...r.speed), col(...r.pressure));
    expect(g[0]).toEqual(["step", "piston_speed [mm/min]", "start [s]", "end [s]", "pressure [bar]", "pressure_sd [bar]", "steady", "used", "note"]);
    expect(g).toHaveLength(4);
    expectClose(g[1]![4] as number, 20, { rel: 0.003 });
    expectClose(g[2]![4] as number, 45, { rel: 0.003 });
    expectClose(g[2]![1] as number, 3, { rel: 1e-9 });
    expectClose(g[2]![5] as number, 0.003 * 45, { rel: 0.25 });
    expect(g.slice(1).map((x) => [x[6], x[7]])).toEqual([[true, true], [true, true], [false, false]]);
    expect(g[3]![8]).toMatch(/^not steady: cut short/);
  });

  test("units, minWindow, unsteady keep and the warnings", () => {
    const minutes = r.time.map((t) => t / 60);
    const g = plateaus(row(...minutes), row(...r.speed.map((v) => v / 60)), row(...r.pressure.map((p) => p / 10)), "min", "mm/s", "MPa", 0.1, "keep", true);
    expect(g[0]!.slice(1, 6)).toEqual(["piston_speed [mm/s]", "start [min]", "end [min]", "pressure [MPa]", "pressure_sd [MPa]"]);
    expectClose(g[2]![4] as number, 4.5, { rel: 0.003 });
    expect(g[3]![7]).toBe(true);
    const warnings = g.filter((x) => x[0] === "STEP_NOT_STEADY");
    expect(warnings).toHaveLength(1);
    expect(String(warnings[0]![1])).toMatch(/^run 1, step 3 at 10 mm\/min: not steady \(cut short: .*\); kept in the flow curve, flagged/);
  });

  test("errors name the argument and the row", () => {
    expect(errorOf(plateaus(col(0, 1, 1, 2), col(1, 1, 1, 1), col(1, 2, 3, 4)))).toEqual({ code: "#VALUE!", message: "time: row 3 repeats the time of row 2; times must increase within a die run" });
    expect(errorOf(plateaus(col(0, 1, 2), col(1, "fast", 1), col(1, 2, 3))).message).toMatch(/^pistonSpeed: .*"fast"/);
    expect(errorOf(plateaus(col(0, 1), col(1, 1), col(1, 2)))).toEqual({ code: "#N/A", message: "time: needs at least 3 samples with time, pistonSpeed and pressure, got 2" });
    expect(errorOf(plateaus(col(0, 1, 2), col(1, 1, 1), col(1, 2, 3), "fortnight")).message).toMatch(/^timeUnit: unknown time unit "fortnight"/);
    expect(errorOf(plateaus(col(0, 1, 2), col(1, 1, 1), col(1, 2, 3), undefined, undefined, undefined, -1))).toEqual({ code: "#NUM!", message: "minWindow: must be zero or more, got -1 s" });
    expect(errorOf(plateaus(col(0, 1, 2), col(1, 1, 1), col(1, 2, 3), undefined, undefined, undefined, undefined, "drop")).message).toBe('unsteady: unknown choice "drop"; accepted: exclude, keep');
  });
});

describe("RHEO.REDUCE and pressure recordings", () => {
  test("a recording is refused with a pointer to RHEO.PLATEAUS; step settings with a point table too", () => {
    const text = readFileSync("workbooks/demo-film-grade-recording.csv", "utf8");
    const cells = parseCsv(text).lines.slice(0, 50).map((l) => l.cells);
    expect(errorOf(reduceData(cells))).toEqual({
      code: "#VALUE!",
      message: "rawData: is a pressure recording (it has a time column); find its steady steps with RHEO.PLATEAUS per die run, or reduce the recording with the command line (rheoledger reduce) or the task pane",
    });
    const table = [["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"], [1, 10, 1, 50], [1, 20, 1, 90], [1, 10, 2, 70], [1, 20, 2, 120]];
    expect(errorOf(reduceData(table, undefined, undefined, undefined, undefined, undefined, undefined, undefined, undefined, [["minWindowTime", 10]]))).toEqual({
      code: "#VALUE!",
      message: "settings minWindowTime: applies to pressure recordings, which RHEO.REDUCE does not read (use the command line or the task pane)",
    });
  });
});
