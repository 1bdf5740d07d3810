/**
 * src/io/resultTables.ts: every table of a run described once. The values are the core's converted
 * to the display units in the headers (NIST SP 811 factors: 1 bar = 1e5 Pa, 1 kPa = 1e3 Pa); no cell
 * is NaN or infinite; every row is as wide as the header; key columns exist.
 */
import { readFileSync } from "fs";
import path from "path";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { runReduction } from "../src/core/run";
import { resultTables, headerWithUnit } from "../src/io/resultTables";
import { expectClose } from "./helpers/expectClose";

const DEMO = path.join(__dirname, "..", "workbooks", "demo-film-grade.csv");

function demoRun() {
  const csv = parseCsv(readFileSync(DEMO, "utf8"));
  const raw = readRawTable(csv.lines.map((l) => l.cells), { rowWord: "line", rowNumbers: csv.lines.map((l) => l.line), headerNumber: 1, decimalMark: csv.delimiter === "," ? "." : undefined });
  return runReduction(
    raw.measurements,
    { representativeRate: true, extensional: true, transducer: { fullScale: 7e7, accuracy: 0.0025 }, heating: { density: 760, heatCapacity: 2300, conductivity: 0.25 } },
    { rank: true, model: "power-law", shift: { law: "arrhenius", referenceTemperature: 483.15 } },
    raw.warnings,
  );
}

describe("resultTables(run)", () => {
  const run = demoRun();
  const tables = resultTables(run);

  test("every asked-for result has its table; shapes are consistent; no cell is NaN or infinite", () => {
    const ids = new Set(tables.map((t) => t.id));
    for (const id of ["groups", "bagley", "flowCurve", "extensional", "heating", "fitRanking", "fitParameters", "shift", "warnings"]) expect(ids.has(id)).toBe(true);
    for (const t of tables) {
      for (const row of t.rows) {
        expect(row).toHaveLength(t.columns.length);
        for (const cell of row) if (typeof cell === "number") expect(Number.isFinite(cell)).toBe(true);
      }
      for (const k of t.keyColumns ?? []) expect(t.columns.map((c) => c.key)).toContain(k);
      expect(new Set(t.columns.map((c) => c.key)).size).toBe(t.columns.length);
    }
  });

  test("flow-curve values are the core's in the header's units", () => {
    const g = run.result.groups[0]!;
    const t = tables.find((x) => x.id === "flowCurve" && x.scope === "190 °C, D 1 mm")!;
    const col = (key: string) => t.columns.findIndex((c) => c.key === key);
    expect(headerWithUnit(t.columns[col("wallShearStress")]!)).toBe("Wall shear stress [kPa]");
    g.flowCurve.forEach((f, i) => {
      expectClose(t.rows[i]![col("wallShearStress")] as number, f.wallShearStress / 1e3, { rel: 1e-15 });
      expectClose(t.rows[i]![col("viscosity")] as number, f.viscosity as number, { rel: 1e-15 });
    });
    const bagley = tables.find((x) => x.id === "bagley" && x.scope === "190 °C, D 1 mm")!;
    g.bagley.forEach((b, i) => expectClose(bagley.rows[i]![2] as number, b.entrancePressure / 1e5, { rel: 1e-15 }));
  });

  test("the warnings table holds every warning of the run, most serious first", () => {
    const w = tables.find((t) => t.id === "warnings")!;
    expect(w.rows).toHaveLength(run.warnings.length);
    const order = { serious: 0, caution: 1, info: 2 } as Record<string, number>;
    const ranks = w.rows.map((r) => order[r[0] as string] as number);
    expect([...ranks].sort((a, b) => a - b)).toEqual(ranks);
  });
});
