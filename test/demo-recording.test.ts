/**
 * The demo recording (workbooks/demo-film-grade-recording.csv, invented: see
 * scripts/demo/filmGradeRecording.ts): the committed file is what the generator writes, and step
 * detection finds the staged defects and recovers the grade's steady pressures
 * (scripts/demo/filmGrade.ts, the generating law) where steady state is reached.
 */
import { readFileSync } from "fs";
import path from "path";
import { detectTraceSteps, stepMeasurements, reduce } from "../src/core";
import { parseCsv } from "../src/io/csv";
import { readTraceTable } from "../src/io/traceTable";
import { filmGradePressure } from "../scripts/demo/filmGrade";
import { FILM_GRADE_RECORDING, filmGradeRecordingCsv } from "../scripts/demo/filmGradeRecording";
import { expectClose } from "./helpers/expectClose";

const FILE = path.join(__dirname, "..", "workbooks", "demo-film-grade-recording.csv");

describe("demo recording", () => {
  const text = readFileSync(FILE, "utf8");
  test("the committed file is the generator's output (npm run workbooks)", () => {
    expect(text).toBe(filmGradeRecordingCsv());
  });

  test("its steps: the staged defects are flagged, the other plateaus match the generating law", () => {
    const csv = parseCsv(text);
    const table = readTraceTable(csv.lines.map((l) => l.cells), { rowWord: "line", headerNumber: csv.lines[0]!.line, rowNumbers: csv.lines.map((l) => l.line) });
    const trace = detectTraceSteps(table.runs);
    expect(trace.warnings.map((w) => w.code)).toEqual(["STEP_NOT_STEADY", "FLOW_INSTABILITY", "THERMAL_CHECK_CHANGE"]);
    expect(trace.warnings[0]!.message).toMatch(/^run 1 \(189\.99 °C, D 1 mm, L 10 mm\), step 8 at 80\.07 mm\/min: not steady \(cut short/);
    expect(trace.warnings[1]!.message).toMatch(/^run 3 \(190 °C, D 1 mm, L 30 mm\), step 8 at 80 mm\/min: the pressure oscillates/);
    expect(trace.warnings[2]!.message).toMatch(/^run 3 \(190 °C, D 1 mm, L 30 mm\): the first speed .* a change of -3\.9 %/);
    // L = 10 and 20 mm: no degradation; every steady plateau within 0.6 % of the law (steps of 7τ
    // leave ≤ e^-7 of the change plus the drift the 0.4 % noise can hide)
    for (const run of trace.runs.slice(0, 2)) {
      for (const s of run.steps.filter((x) => x.used)) {
        const speed = FILM_GRADE_RECORDING.pistonSpeedsMmMin.reduce((best, v) => (Math.abs(v - s.pistonSpeed * 6e4) < Math.abs(best - s.pistonSpeed * 6e4) ? v : best));
        expectClose(s.pressure, filmGradePressure(190, run.die!.dieLength, speed), { rel: 0.006 }, `${run.label} step ${s.step}`);
      }
    }
    expect(reduce(stepMeasurements(trace)).groups).toHaveLength(1);
  });
});
