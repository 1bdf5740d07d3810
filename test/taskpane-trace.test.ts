/**
 * The trace view's pure parts (src/taskpane/panels/trace): chart data and SVG, the step table in
 * display units, moving a window and re-running, and the method-sheet record. Recordings are
 * synthetic (first-order approach to known plateaus, src/core/compressionTime.ts).
 */
import type { TraceRun } from "../src/core/steps/runSteps";
import { decimateMinMax, traceChartData, traceChartSvg } from "../src/taskpane/panels/trace/chart";
import { moveWindow, resetWindow, traceView } from "../src/taskpane/panels/trace/view";
import { expectClose } from "./helpers/expectClose";
import { syntheticRun } from "./helpers/syntheticTrace";

const MM_MIN = 1e-3 / 60;
const BAR = 1e5;
function recording(seed: number, cutShort = false): TraceRun {
  const steps = [
    { speed: 1 * MM_MIN, pressure: 20 * BAR, duration: 60 },
    { speed: 3 * MM_MIN, pressure: 45 * BAR, duration: cutShort ? 8 : 60 },
    { speed: 10 * MM_MIN, pressure: 90 * BAR, duration: 60 },
    { speed: 1 * MM_MIN, pressure: 20 * BAR, duration: 60 },
  ];
  const r = syntheticRun({ steps, tau: 2, noise: 0.003, dt: 0.1, seed });
  return { time: r.time, pressure: r.pressure, pistonSpeed: r.speed, die: { dieDiameter: 1e-3, dieLength: 20e-3 }, barrelDiameter: 0.015, temperature: 463.15 };
}

describe("decimateMinMax", () => {
  test("keeps each bucket's extremes in time order, and short series whole", () => {
    expect(decimateMinMax([0, 1, 2, 3], [5, 9, 1, 4], 1)).toEqual([{ x: 1, y: 9 }, { x: 2, y: 1 }]);
    expect(decimateMinMax([0, 1], [5, 9], 1)).toEqual([{ x: 0, y: 5 }, { x: 1, y: 9 }]);
    const x = Array.from({ length: 10000 }, (_, i) => i);
    const y = x.map((i) => (i === 5000 ? 100 : Math.sin(i)));
    const d = decimateMinMax(x, y, 200);
    expect(d.length).toBeLessThanOrEqual(400);
    expect(d.some((p) => p.y === 100)).toBe(true);
  });
});

describe("trace chart", () => {
  test("windows shaded by kind, plateaus drawn, steps left out marked", () => {
    const run = recording(41, true);
    const view = traceView([run], {}, []);
    const data = view.charts[0]!;
    expect(data.title).toBe("Die run 1: 190 °C, D 1 mm, L 20 mm");
    expect(data.windows.map((w) => w.kind)).toEqual(["used", "rejected", "used", "check"]);
    expectClose(data.windows[0]!.pressure, 20, { rel: 0.003 });
    expect(data.trace.length).toBeLessThanOrEqual(800);
    const svg = traceChartSvg(data);
    expect(svg.match(/<rect class="window /g)).toHaveLength(4);
    expect(svg.match(/class="rejected-mark" data-step="2"/g)).toHaveLength(1);
    expect(svg.match(/<polyline class="trace"/g)).toHaveLength(1);
    expect(svg).not.toMatch(/style=|<script/);
    expect(svg).toContain("not steady (cut short");
  });

  test("with a blank the trace is shown net of friction inside each step", () => {
    const area = (Math.PI * 0.015 ** 2) / 4;
    const run = recording(42);
    const gross = { ...run, pressure: (run.pressure as number[]).map((p) => p + 100 / area) };
    const view = traceView([gross], {}, [], [{ pistonSpeed: 1 * MM_MIN, force: 100 }, { pistonSpeed: 10 * MM_MIN, force: 100 }]);
    const data = traceChartData(gross, view.trace.runs[0]!, 100000);
    expectClose(data.trace[500]!.y, (run.pressure as number[])[500]! / BAR, { rel: 1e-12 });
  });
});

describe("step table, moved windows and the method record", () => {
  test("the step table in display units (src/io/resultTables.ts)", () => {
    const view = traceView([recording(43)], {}, []);
    expect(view.steps.columns.map((c) => c.key)).toEqual(["run", "die", "step", "pistonSpeed", "stepStart", "start", "end", "samples", "pressure", "pressureStd", "steady", "used", "note"]);
    const col = (key: string) => view.steps.columns.findIndex((c) => c.key === key);
    const first = view.steps.rows[0]!;
    expectClose(first[col("pistonSpeed")] as number, 1 / 60, { rel: 0.003 }, "1 mm/min in mm/s");
    expectClose(first[col("pressure")] as number, 20, { rel: 0.003 });
    expect(view.steps.rows[3]![col("note")]).toBe("repeat of the first speed (thermal check)");
    const checks = view.thermalChecks!;
    expect(checks.columns.find((c) => c.key === "change")?.unit).toBe("%");
    expectClose(checks.rows[0]![5] as number, 0, { abs: 0.3 });
  });

  test("moving a window re-runs with it and records it for the method sheet; resetting undoes it", () => {
    const run = recording(44);
    let windows = moveWindow([], { run: 1, step: 2, start: 90, end: 100 });
    windows = moveWindow(windows, { run: 1, step: 2, start: 95, end: 115 });
    expect(windows).toEqual([{ run: 1, step: 2, start: 95, end: 115 }]);
    const view = traceView([run], {}, windows);
    const s = view.trace.runs[0]!.steps[1]!;
    expect(s.window).toBe("set");
    expect(s.start).toBeGreaterThanOrEqual(95);
    expect(view.method.at(-1)).toMatch(/^Die run 1 \(190 °C, D 1 mm, L 20 mm\), step 2: window set by hand to 95\.\d*–11\d\.\d* s \(detected \d+\.\d*–119\.\d s\)\.$/);
    expect(view.warnings.map((w) => w.code)).toEqual(["STEP_WINDOW_SET"]);
    const back = traceView([run], {}, resetWindow(windows, 1, 2));
    expect(back.trace.runs[0]!.steps[1]!.window).toBe("detected");
    expect(back.method.some((l) => l.includes("set by hand"))).toBe(false);
  });

  test("changed settings are recorded", () => {
    const view = traceView([recording(45)], { unsteady: "keep", driftLimit: 2 }, []);
    expect(view.method).toContain("Settings changed from their defaults: driftLimit = 2, unsteady = keep.");
  });
});
