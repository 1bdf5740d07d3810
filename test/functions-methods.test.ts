import { cell, col, errorOf, installOfficeRuntime, row, valuesOf } from "./helpers/sheet";
import { cogswellFlow, heating, mfrPoint, nahme, orificePressure, pressureCoeff, pressureUnc, repViscosity, slipVelocity, slitShearRateApp, slitWallStress } from "../src/functions/methods";
import { expectClose } from "./helpers/expectClose";

let uninstall: () => void;
beforeAll(() => (uninstall = installOfficeRuntime()));
afterAll(() => uninstall());

const first = (grid: unknown[][]) => (grid[0] as unknown[])[0] as number;

describe("RHEO slit functions", () => {
  // γ̇_a = 6Q/(WH²): 10 mm³/s in a 10 × 1 mm slit → 6·1e-8/(1e-2·1e-6) = 6 1/s
  test("SLITSHEARRATEAPP spills down a column", () => {
    const v = valuesOf(slitShearRateApp(col(10, 20), cell(10), cell(1))).map(Number);
    expectClose(v[0] as number, 6, { rel: 1e-12 });
    expectClose(v[1] as number, 12, { rel: 1e-12 });
  });
  // τ = (ΔP − ΔP_ent)·H/(2L): (100 − 20) bar · 1 mm/(2·20 mm) = 2e5 Pa
  test("SLITWALLSTRESS with and without an entrance pressure", () => {
    expectClose(first(slitWallStress(cell(100), cell(1), cell(20), cell(20))), 2e5, { rel: 1e-12 });
    expectClose(first(slitWallStress(cell(100), cell(1), cell(20))), 2.5e5, { rel: 1e-12 });
    expect(errorOf(slitWallStress(cell(100), cell(0), cell(20)))).toEqual({ code: "#NUM!", message: expect.stringMatching(/slitHeight/) });
  });
});

describe("RHEO.ORIFICEPRESSURE", () => {
  test("log–log interpolation; #N/A outside the orifice's rates; a row stays a row", () => {
    const g = orificePressure(col(10, 1000), col(1, 100), col(100, 5000));
    expectClose(first(g), 10, { rel: 1e-12 });
    expect(((g[1] as unknown[])[0] as { code: string }).code).toBe("#N/A");
    expect(orificePressure(col(10, 1000), col(1, 100), row(10, 1000))).toHaveLength(1);
    expect(errorOf(orificePressure(col(10, 1000), col(1, 2, 3), cell(100))).message).toMatch(/orificePressure: has 3 cells but orificeShearRate has 2/);
  });
});

describe("RHEO.SLIPVELOCITY", () => {
  // two diameters by hand (Mooney 1931): 180 and 140 1/s at 1 and 2 mm at one stress → v_s = 10 mm/s, γ̇_c = 100
  test("recovers the hand-worked Mooney line at every common stress", () => {
    const g = slipVelocity(col(1, 1, 2, 2), col(180, 360, 140, 280), col(1e4, 2e4, 1e4, 2e4), undefined, undefined, true);
    expect(g[0]).toEqual(["wall_shear_stress [Pa]", "slip_velocity [mm/s]", "shear_rate_apparent_corrected [1/s]", "shear_rate_wall [1/s]", "viscosity [Pa.s]"]);
    expectClose((g[1] as number[])[1] as number, 10, { rel: 1e-9 });
    expectClose((g[1] as number[])[2] as number, 100, { rel: 1e-9 });
    expect(errorOf(slipVelocity(col(1, 1), col(180, 360), col(1e4, 2e4))).code).toBe("#N/A");
  });

  // the same two-diameter case: mooneySlip's SLIP_FEW_DIAMETERS (src/core/slip.ts) listed below the table as RHEO.REDUCE lists its warnings
  test("showWarnings TRUE lists the core's warnings below the table: a blank row, then code | message padded to the width", () => {
    const g = slipVelocity(col(1, 1, 2, 2), col(180, 360, 140, 280), col(1e4, 2e4, 1e4, 2e4), undefined, undefined, true, true);
    const plain = slipVelocity(col(1, 1, 2, 2), col(180, 360, 140, 280), col(1e4, 2e4, 1e4, 2e4), undefined, undefined, true);
    expect(g.slice(0, plain.length)).toEqual(plain);
    expect(g[plain.length]).toEqual(["", "", "", "", ""]);
    const warningRows = g.slice(plain.length + 1);
    expect(warningRows.map((r) => r[0])).toContain("SLIP_FEW_DIAMETERS");
    for (const r of warningRows) {
      expect(r).toHaveLength(5);
      expect(r[0]).toMatch(/^[A-Z][A-Z0-9_]+$/);
      expect(typeof r[1]).toBe("string");
      expect(r.slice(2)).toEqual(["", "", ""]);
    }
  });

  // exact Mooney data (Mooney 1931): γ̇_a = 100·(τ/10 kPa)² + 8·v_s/D with v_s = 5 mm/s at D = 1, 2, 4 mm
  // → v_s = 5 mm/s and γ̇_c = 100 1/s at 10 kPa; three diameters over a factor 2 in stress give no warning
  test("showWarnings TRUE with nothing to warn about says so; FALSE, blank and 0 leave the table alone", () => {
    const D = [1, 1, 1, 2, 2, 2, 4, 4, 4];
    const tau = [1e4, 1.5e4, 2e4, 1e4, 1.5e4, 2e4, 1e4, 1.5e4, 2e4];
    const rate = D.map((d, i) => 100 * ((tau[i] as number) / 1e4) ** 2 + (8 * 5) / d);
    const g = slipVelocity(col(...D), col(...rate), col(...tau), "mm", "Pa", false, true);
    expectClose((g[0] as number[])[1] as number, 5, { rel: 1e-9 });
    expectClose((g[0] as number[])[2] as number, 100, { rel: 1e-9 });
    expect(g.slice(-2)).toEqual([
      ["", "", "", "", ""],
      ["warnings", "none", "", "", ""],
    ]);
    const table = slipVelocity(col(...D), col(...rate), col(...tau), "mm", "Pa", false);
    expect(g).toHaveLength(table.length + 2);
    expect(slipVelocity(col(...D), col(...rate), col(...tau), "mm", "Pa", false, false)).toEqual(table);
    expect(slipVelocity(col(...D), col(...rate), col(...tau), "mm", "Pa", false, 0 as unknown as boolean)).toEqual(table);
  });

  test("showWarnings that is not TRUE or FALSE is #VALUE! naming the argument", () => {
    const e = errorOf(slipVelocity(col(1, 1, 2, 2), col(180, 360, 140, 280), col(1e4, 2e4, 1e4, 2e4), undefined, undefined, true, "maybe" as unknown as boolean));
    expect(e).toEqual({ code: "#VALUE!", message: expect.stringMatching(/showWarnings: must be TRUE or FALSE, got "maybe"/) });
  });
});

describe("RHEO.REPVISCOSITY and RHEO.COGSWELL", () => {
  test("REPVISCOSITY: (π/4)γ̇_a and τ/γ̇_a", () => {
    const g = repViscosity(col(100, 200), col(1e5, 1.5e5));
    expectClose((g[0] as number[])[0] as number, 25 * Math.PI, { rel: 1e-15 });
    expect((g[0] as number[])[1]).toBe(1000);
    expect(errorOf(repViscosity(col(100, "x"), col(1, 2))).message).toMatch(/shearRateApparent: row 2 is text "x"/);
  });
  // Newtonian η_E = 3η: ΔP_ent = √(8/3)·ηγ̇ (Cogswell 1972) → Trouton 3 (Trouton 1906)
  test("COGSWELL: Trouton ratio 3 for a Newtonian liquid", () => {
    const p = (Math.sqrt(8 / 3) * 200 * 50) / 1e5; // bar
    const g = cogswellFlow(cell(p), cell(50), cell(200), cell(1));
    expectClose((g[0] as number[])[3] as number, 3, { rel: 1e-12 });
    expect(errorOf(cogswellFlow(cell(p), cell(50), cell(200), cell(0))).code).toBe("#NUM!");
  });
});

describe("RHEO.HEATING, RHEO.NAHME, RHEO.PRESSURECOEFF, RHEO.PRESSUREUNC, RHEO.MFRPOINT", () => {
  // 200 bar/(0.75 g/cm³ · 2500 J/(kg·K)) = 2e7/1.875e6 = 10.667 K
  test("HEATING: ΔP/(ρc_p)", () => expectClose(first(heating(cell(200), cell(0.75), cell(2.5), undefined, undefined, "kJ/(kg.K)")), 2e7 / 1.875e6, { rel: 1e-12 }));
  test("NAHME: 0.03·1000·100²·(0.5 mm)²/0.2 = 0.375", () => expectClose(first(nahme(cell(0.03), cell(1000), cell(100), cell(1), cell(0.2))), 0.375, { rel: 1e-12 }));
  test("PRESSURECOEFF: exact Barus line with β = 20 1/GPa", () => {
    const beta = 20e-9;
    const x = [10, 20, 40, 60];
    const p = x.map((xi) => (5e6 - Math.log(1 - beta * 2e5 * xi) / beta) / 1e5);
    expectClose(first(pressureCoeff(col(...x), col(...p))), 20, { rel: 1e-5 });
    expect(errorOf(pressureCoeff(col(10, 20), col(1, 2))).code).toBe("#N/A");
  });
  test("PRESSUREUNC: 2·0.25 %·1000 bar/√3 = 2.8868 bar", () => {
    expectClose(first(pressureUnc(1000, 0.25)), (2 * 2.5) / Math.sqrt(3), { rel: 1e-12 });
    expect(errorOf(pressureUnc(1000, 150)).code).toBe("#NUM!");
  });
  // ISO 1133-1 geometry from memory; 10 cm³/10 min at 2.16 kg → 18.4628 1/s, 19 360 Pa, 1048.6 Pa·s
  test("MFRPOINT: MVR and MFR", () => {
    const g = mfrPoint(10, "cm3/10min", 2.16);
    expectClose((g[0] as number[])[0] as number, 18.462766336971537, { rel: 1e-12 });
    expectClose((g[0] as number[])[2] as number, 1048.612614495892, { rel: 1e-12 });
    expectClose((mfrPoint(7.5, "g/10min", 2.16, 0.75)[0] as number[])[0] as number, 18.462766336971537, { rel: 1e-12 });
    expect(errorOf(mfrPoint(7.5, "g/10min", 2.16)).message).toMatch(/density/);
    expect(errorOf(mfrPoint(7.5, "bar", 2.16)).code).toBe("#VALUE!");
  });
});
