/**
 * The trace-table reader (src/io/traceTable.ts): headers, SI conversion (NIST SP 811 factors:
 * 1 bar = 1e5 Pa, 1 mm/min = 1e-3/60 m/s, 1 kN = 1000 N), die runs, blanks and messages.
 */
import { isTraceHeader, readBlankTable, readTraceTable } from "../src/io/traceTable";
import { expectClose } from "./helpers/expectClose";

const H = ["time [s]", "piston_speed [mm/min]", "pressure [bar]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]"];

describe("readTraceTable(cells)", () => {
  test("converts to SI and splits die runs where the die changes or the clock restarts", () => {
    const t = readTraceTable([H, [0, 1, 10, 1, 20, 15], [1, 1, 11, 1, 20, 15], [2, 1, 12, 1, 20, 15], [0, 2, 5, 1, 10, 15], [1, 2, 6, 1, 10, 15], [0.5, 2, 7, 1, 10, 15]], { rowWord: "line" });
    expect(t.runs).toHaveLength(3);
    const r = t.runs[0]!;
    expect(r.time).toEqual([0, 1, 2]);
    expectClose((r.pistonSpeed as number[])[0]!, 1e-3 / 60, { rel: 1e-12 });
    expect(r.pressure).toEqual([10e5, 11e5, 12e5]);
    expect(r.die).toEqual({ dieDiameter: 1e-3, dieLength: 20e-3 });
    expectClose(r.barrelDiameter!, 0.015, { rel: 1e-12 });
    expect(r.lines).toEqual([2, 3, 4]);
    expect(t.runs[1]!.lines).toEqual([5, 6]);
    expect(t.runs[2]!.lines).toEqual([7]);
    expect(t.pressureSource).toBe("pressure");
    expect(t.warnings).toEqual([]);
  });

  test("force with a barrel bore option becomes F/A; positions are kept for the speed", () => {
    const t = readTraceTable(
      [["time [min]", "piston_position [mm]", "force [kN]", "die_diameter [mm]", "die_length [mm]", "temperature [C]"], [0, 50, 1, 1, 20, 190], [0.5, 49, 1, 1, 20, 191]],
      { barrelDiameter: 0.015, source: "a.csv" },
    );
    const r = t.runs[0]!;
    expect(r.time).toEqual([0, 30]);
    expectClose((r.pressure as number[])[0]!, 1000 / ((Math.PI * 0.015 ** 2) / 4), { rel: 1e-12 });
    expect(r.pistonPosition).toEqual([0.05, 0.049]);
    expectClose(r.temperature!, 463.65, { rel: 1e-12 });
    expect(r.source).toBe("a.csv");
    expect(t.speedSource).toBe("piston_position");
  });

  test("slits, decimal commas, ignored columns and blank rows (one warning for many)", () => {
    const rows: unknown[][] = [["time [s]", "piston_speed [mm/min]", "pressure [bar]", "slit_width [mm]", "slit_height [mm]", "die_length [mm]", "note", "flow_rate [cm3/s]"]];
    for (let i = 0; i < 14; i++) rows.push([String(i), "1,5", i % 2 === 0 ? "" : "10,5", 20, 1, 30, "x", 1]);
    rows.push([null, null, null, null, null, null, "end", null]);
    const t = readTraceTable(rows, { decimalMark: ",", rowWord: "line" });
    expect(t.runs[0]!.die).toEqual({ slitWidth: 0.02, slitHeight: 0.001, dieLength: 0.03 });
    expect(t.runs[0]!.pressure).toEqual(Array(7).fill(10.5e5));
    expect(t.warnings.map((w) => w.code)).toEqual(["COLUMN_IGNORED", "COLUMN_IGNORED", "ROW_SKIPPED_BLANK"]);
    expect(t.warnings[2]!.message).toBe(
      "7 lines of samples skipped for blank cells: lines 2 (blank pressure), 4 (blank pressure), 6 (blank pressure), 8 (blank pressure), 10 (blank pressure), 12 (blank pressure), 14 (blank pressure).",
    );
  });

  test("bad input names the column, the line and what was expected", () => {
    expect(() => readTraceTable([H, [0, 1, "n/a", 1, 20, 15]], { rowWord: "line" })).toThrow('pressure [bar] (column 3): line 2 is text "n/a", not a number');
    expect(() => readTraceTable([["piston_speed [mm/min]", "pressure [bar]"], [1, 2]])).toThrow('time: no "time [s]" column; found: "piston_speed [mm/min]", "pressure [bar]"');
    expect(() => readTraceTable([["time [s]", "pressure [bar]", "die_diameter [mm]", "die_length [mm]"], [1, 2, 1, 20]])).toThrow(/piston_speed: no "piston_speed \[mm\/min\]" or "piston_position \[mm\]" column/);
    expect(() => readTraceTable([["time [s]", "piston_speed [mm/min]", "force [N]", "die_diameter [mm]", "die_length [mm]"], [1, 1, 2, 1, 20]])).toThrow(/barrel_diameter: force needs the barrel bore/);
    expect(() => readTraceTable([["time [s]", "piston_speed [mm/min]", "pressure [bar]", "die_length [mm]"], [1, 1, 2, 20]])).toThrow(/die_diameter: no "die_diameter \[unit\]" column/);
    expect(() => readTraceTable([["time [fortnight]", "piston_speed [mm/min]"], [1, 1]])).toThrow(/column 1: "time \[fortnight\]": unknown time unit "fortnight"; accepted: s, ms, min, h/);
    expect(() => readTraceTable([H, [0, 1, 2, 0, 20, 15]], { rowWord: "line" })).toThrow("die_diameter: line 2: must be greater than zero, got 0");
    expect(() => readTraceTable([H])).toThrow("data: no samples below the header");
  });

  test("isTraceHeader recognises a time column only", () => {
    expect(isTraceHeader(H)).toBe(true);
    expect(isTraceHeader(["Time (s)", "x"])).toBe(true);
    expect(isTraceHeader(H.slice(1))).toBe(false);
    expect(isTraceHeader([null, 3])).toBe(false);
  });
});

describe("readBlankTable(cells)", () => {
  test("steady points without time, a recording with it", () => {
    const points = readBlankTable([["piston_speed [mm/min]", "force [N]", "die_length [mm]"], [1, 40], [10, 60]]);
    expect(points.kind).toBe("points");
    if (points.kind === "points") expect(points.points.map((p) => p.force)).toEqual([40, 60]);
    expect(points.warnings.map((w) => w.message)).toEqual(['Column 3 "die_length [mm]" is not used in a blank run; it is ignored.']);
    const rec = readBlankTable([["time [s]", "piston_speed [mm/min]", "force [N]"], [0, 1, 40], [1, 1, 41]]);
    expect(rec.kind).toBe("recording");
    if (rec.kind === "recording") expect(rec.run.pressure).toEqual([40, 41]);
  });
  test("a blank needs force and a speed", () => {
    expect(() => readBlankTable([["piston_speed [mm/min]", "pressure [bar]"], [1, 2]])).toThrow(/force: the blank run needs a "force \[N\]" column/);
    expect(() => readBlankTable([["piston_position [mm]", "force [N]"], [1, 2]])).toThrow(/piston_speed: the blank run needs "piston_speed \[mm\/min\]" \(or a "time \[s\]" column/);
  });
});
