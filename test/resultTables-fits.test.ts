/**
 * The fit tables of src/io/resultTables.ts: the one verdict per group, the fit across temperatures
 * and the rotational join, as every surface renders them. A value the data do not determine is an
 * empty cell whose note gives the supported bound; no cell is NaN or infinite.
 */
import { readFileSync } from "fs";
import path from "path";
import { parseCsv } from "../src/io/csv";
import { readRawTable } from "../src/io/rawTable";
import { runReduction } from "../src/core/run";
import { resultTables } from "../src/io/resultTables";
import { filmGradeViscosity } from "../scripts/demo/filmGrade";

const DEMO = path.join(__dirname, "..", "workbooks", "demo-film-grade.csv");

function demoRun() {
  const csv = parseCsv(readFileSync(DEMO, "utf8"));
  const raw = readRawTable(csv.lines.map((l) => l.cells), { rowWord: "line" });
  const eta = filmGradeViscosity(483.15);
  const omega = [0.01, 0.1, 1, 10, 30];
  return runReduction(raw.measurements, {}, {
    compare: ["cross", "power-law"],
    master: { model: "carreau-yasuda", law: "arrhenius", referenceTemperature: 483.15 },
    rotational: { kind: "oscillatory", rate: omega, viscosity: omega.map(eta), temperature: 483.15 },
  });
}

describe("resultTables(run): fit tables", () => {
  const run = demoRun();
  const tables = resultTables(run);
  const col = (t: { columns: { key: string }[] }, key: string) => t.columns.findIndex((c) => c.key === key);

  test("one verdict table per group, the groups table names the recommended model", () => {
    const verdicts = tables.filter((t) => t.id === "verdict");
    expect(verdicts.map((t) => t.scope)).toEqual(run.groupFits.map((g) => g.label));
    const groups = tables.find((t) => t.id === "groups")!;
    expect(groups.rows.map((r) => r[col(groups, "recommendedModel")])).toEqual(run.groupFits.map(() => "Cross"));
    expect(groups.rows.map((r) => r[col(groups, "verdict")])).toEqual(run.groupFits.map(() => "no model well determined"));
  });

  test("η0 outside the measured rates: empty value, not determined, the note gives η0 ≥ the highest viscosity", () => {
    const t = tables.find((x) => x.id === "verdict" && x.scope === "210 °C, D 1 mm")!;
    const eta0 = t.rows.find((r) => r[col(t, "parameter")] === "η₀")!;
    expect(eta0[col(t, "model")]).toBe("Cross");
    expect(eta0[col(t, "value")]).toBeNull();
    expect(eta0[col(t, "determined")]).toBe(false);
    const etaMax = Math.max(...run.result.groups[1]!.flowCurve.map((f) => f.viscosity ?? 0));
    expect(eta0[col(t, "note")]).toBe(`≥ ${Number(etaMax.toPrecision(4))} Pa·s (not determined by the data)`);
  });

  test("the ranking marks exactly one recommended model per group", () => {
    const t = tables.find((x) => x.id === "fitRanking")!;
    for (const g of run.groupFits) expect(t.rows.filter((r) => r[0] === g.label && r[col(t, "recommended")] === true)).toHaveLength(1);
  });

  test("the fit across temperatures: parameters and Ea, then aT; the rotational join with its overlap", () => {
    const m = tables.find((x) => x.id === "masterFit")!;
    expect(m.rows.map((r) => r[0])).toEqual(["η₀", "η∞", "λ", "n", "a", "Ea"]);
    expect(tables.find((x) => x.id === "masterFitFactors")!.rows).toHaveLength(3);
    const j = tables.find((x) => x.id === "rotationalJoin")!;
    // the overlap starts at the capillary curve's lowest true wall rate (the rotational curve reaches 30 1/s)
    const lowest = run.joined!.join.capillaryRange[0] as number;
    expect(run.joined!.join.overlap!.shearRateMin).toBe(lowest);
    expect(j.notes?.[0]).toMatch(new RegExp(`^Overlap ${Number(lowest.toPrecision(3))}–30 1/s: rotational/capillary `));
    expect(j.rows.find((r) => r[col(j, "parameter")] === "η₀")?.[col(j, "determined")]).toBe(true);
  });

  test("no cell is NaN or infinite; rows as wide as the header", () => {
    for (const t of tables) for (const row of t.rows) {
      expect(row).toHaveLength(t.columns.length);
      for (const cell of row) if (typeof cell === "number") expect(Number.isFinite(cell)).toBe(true);
    }
  });
});
