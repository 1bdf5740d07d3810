/**
 * The whole-curve RHEO functions (BAGLEY, NPRIME, SHEARRATEWALL, VISCOSITY, REDUCE) called as Excel
 * calls them, on data built forward from known material laws.
 */
import * as sheet from "../src/functions/functions";
import { expectClose } from "./helpers/expectClose";
import { FakeCustomFunctionError, cell, col, errorOf, installOfficeRuntime, num, row, valuesOf } from "./helpers/sheet";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

/**
 * Bagley data built from ΔP = 2τ_w(L/R + e) (Bagley 1957, J. Appl. Phys. 28, 624): at 100 1/s
 * τ_w = 100 kPa, e = 3; at 1000 1/s τ_w = 200 kPa, e = 4; dies L/D 5, 10, 20 (L/R 10, 20, 40).
 */
const LINES = [
  { rate: 100, tau: 1e5, e: 3 },
  { rate: 1000, tau: 2e5, e: 4 },
];
const LD = [5, 10, 20];
function bagleyData() {
  const ld: number[] = [];
  const rate: number[] = [];
  const bar: number[] = [];
  for (const d of LD) {
    for (const l of LINES) {
      ld.push(d);
      rate.push(l.rate);
      bar.push((2 * l.tau * (2 * d + l.e)) / 1e5);
    }
  }
  return { ld, rate, bar };
}

describe("RHEO.BAGLEY(dieLengthOrRatio, shearRateApparent, pressure, dieDiameter, ...)", () => {
  test("recovers τ_w, ΔP_ent = 2τ_w·e, e, R² = 1 and the die count, one row per rate", () => {
    const { ld, rate, bar } = bagleyData();
    const out = sheet.bagley(col(...ld), col(...rate), col(...bar));
    expect(out).toHaveLength(2);
    out.forEach((r, i) => {
      const line = LINES[i]!;
      expect(r).toHaveLength(6);
      expectClose(num(r[0]), line.rate, { rel: 1e-12 });
      expectClose(num(r[1]), line.tau, { rel: 1e-9 });
      expectClose(num(r[2]), (2 * line.tau * line.e) / 1e5, { rel: 1e-9 });
      expectClose(num(r[3]), line.e, { rel: 1e-9 });
      expectClose(num(r[4]), 1, { abs: 1e-12 });
      expect(r[5]).toBe(3);
    });
  });
  test("L and D instead of L/D give the same table; rows work like columns", () => {
    const { ld, rate, bar } = bagleyData();
    const byRatio = sheet.bagley(col(...ld), col(...rate), col(...bar));
    const byLength = sheet.bagley(row(...ld.map((x) => x * 2)), row(...rate), row(...bar), cell(2));
    byLength.forEach((r, i) => r.forEach((v, j) => expectClose(num(v), num(byRatio[i]![j]), { rel: 1e-9 })));
  });
  test("units and a header row", () => {
    const { ld, rate, bar } = bagleyData();
    const out = sheet.bagley(col(...ld), col(...rate), col(...bar.map((b) => b / 10)), null as unknown as unknown[][], "MPa", "mm", "kPa", true);
    expect(out[0]).toEqual([
      "shear_rate_apparent [1/s]",
      "wall_shear_stress [kPa]",
      "entrance_pressure [MPa]",
      "end_correction [-]",
      "r2 [-]",
      "dies_used [-]",
    ]);
    expectClose(num(out[1]![1]), 100, { rel: 1e-9 });
    expectClose(num(out[1]![2]), 0.6, { rel: 1e-9 });
  });
  test("blank rows are skipped", () => {
    const { ld, rate, bar } = bagleyData();
    const out = sheet.bagley(col(...ld, null), col(...rate, 50), col(...bar, 3));
    expect(out).toHaveLength(2);
  });
  test("a single die length is #N/A", () => {
    const e = errorOf(sheet.bagley(col(10, 10), col(100, 1000), col(40, 80)));
    expect(e.code).toBe("#N/A");
    expect(e.message).toMatch(/^dieLengthOrRatio: the Bagley correction needs dies of at least two lengths/);
  });
  test("dies of different diameters are #VALUE!", () => {
    const e = errorOf(sheet.bagley(col(10, 20), col(100, 100), col(40, 80), col(1, 2)));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toMatch(/^dieDiameter: row 2 is 2 mm but the first die's is 1 mm/);
  });
  test("a non-positive pressure is #NUM! with the row in the caller's range", () => {
    const { ld, rate, bar } = bagleyData();
    bar[4] = 0;
    const e = errorOf(sheet.bagley(col(null, ...ld), col(null, ...rate), col(null, ...bar)));
    expect(e).toEqual({ code: "#NUM!", message: "pressure: row 6 must be greater than zero, got 0" });
  });
  test("text in the rate column is #VALUE!", () => {
    expect(errorOf(sheet.bagley(col(5, 10), col(100, "fast"), col(1, 2))).message).toBe('shearRateApparent: row 2 is text "fast"');
  });
});

/**
 * Power-law fluid τ_w = K·γ̇_w^n. The Rabinowitsch relation gives γ̇_w = γ̇_a(3n+1)/(4n) exactly
 * and n' = n (Macosko 1994, ch. 6, from memory).
 */
const K = 8000;
const N = 0.4;
const RATES = [10, 30, 100, 300, 1000, 3000];
const wallRate = (a: number) => (a * (3 * N + 1)) / (4 * N);
const stressOf = (a: number) => K * wallRate(a) ** N;

describe("RHEO.NPRIME / RHEO.SHEARRATEWALL / RHEO.VISCOSITY on a power-law fluid", () => {
  const stresses = RATES.map(stressOf);
  for (const method of ["transition", "local", "global", "difference", undefined]) {
    test(`n' = ${N} and γ̇_w = γ̇_a(3n+1)/(4n), method ${method ?? "(default)"}`, () => {
      const n = valuesOf(sheet.nPrime(col(...RATES), col(...stresses), method));
      n.forEach((v) => expectClose(v as number, N, { rel: 1e-6 }));
      const w = valuesOf(sheet.shearRateWall(col(...RATES), col(...stresses), method));
      w.forEach((v, i) => expectClose(v as number, wallRate(RATES[i]!), { rel: 1e-6 }));
    });
  }
  test("viscosity η = K·γ̇_w^(n−1), in mPa.s from kPa stresses", () => {
    const out = valuesOf(sheet.viscosity(col(...RATES), col(...stresses.map((s) => s / 1e3)), "global", 1, "kPa", "mPa.s"));
    out.forEach((v, i) => expectClose(v as number, K * wallRate(RATES[i]!) ** (N - 1) * 1e3, { rel: 1e-9 }));
  });
  test("a blank row stays empty and the others are unchanged", () => {
    const out = valuesOf(sheet.nPrime(col(10, null, ...RATES.slice(1)), col(stresses[0], 5, ...stresses.slice(1)), "global", 1));
    expect(out[1]).toBe("");
    expectClose(out[2] as number, N, { rel: 1e-9 });
  });
  test("too few points is #N/A", () => {
    expect(errorOf(sheet.nPrime(cell(10), cell(100))).code).toBe("#N/A");
  });
  test("unknown method and bad degree are #VALUE!", () => {
    expect(errorOf(sheet.nPrime(col(...RATES), col(...stresses), "spline")).message).toMatch(/^method: unknown method "spline"/);
    expect(errorOf(sheet.nPrime(col(...RATES), col(...stresses), "global", 7)).message).toBe(
      "degree: must be a whole number from 1 to 3, got 7",
    );
  });
  test("rows where n' ≤ 0 hold #NUM!; the other rows keep their values", () => {
    // finite differences of ln τ: rising between the first three points, falling after
    const out = sheet.shearRateWall(col(10, 100, 1000, 10000), col(100, 200, 210, 150), "difference");
    expect(out).toHaveLength(4);
    expect(typeof out[0]![0]).toBe("number");
    expect(typeof out[1]![0]).toBe("number");
    for (const r of out.slice(2)) {
      expect(r[0]).toBeInstanceOf(FakeCustomFunctionError);
      expect((r[0] as FakeCustomFunctionError).code).toBe("#NUM!");
      expect((r[0] as FakeCustomFunctionError).message).toMatch(/^shearRateWall: row [34]: n' = -/);
    }
  });
  test("negative stress is #NUM! naming the row of the range", () => {
    expect(errorOf(sheet.nPrime(col(10, 20, 30), col(1, -2, 3))).message).toBe("wallShearStress: row 2 must be greater than zero, got -2");
  });
});

/** Raw table: power-law melt with Bagley entrance loss ΔP_ent = 2τ_w·e, e = 2.5, D = 1 mm. */
function rawTable(): unknown[][] {
  const header = ["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]", "temperature [C]"];
  const rows: unknown[][] = [header];
  for (const L of [5, 10, 20]) {
    for (const a of RATES) {
      const q = (a * Math.PI) / 32; // Q = γ̇_a·πD³/32 with D = 1 mm, in mm³/s
      rows.push([1, L, q, (2 * stressOf(a) * (2 * L + 2.5)) / 1e5, 200]);
    }
  }
  return rows;
}

describe("RHEO.REDUCE(rawData, ...)", () => {
  test("spills a header row and the true flow curve of a power-law melt", () => {
    const out = sheet.reduceData(rawTable(), undefined, "global", 1);
    expect(out[0]).toEqual([
      "temperature [C]",
      "die_diameter [mm]",
      "shear_rate_apparent [1/s]",
      "wall_shear_stress [Pa]",
      "n_prime [-]",
      "shear_rate_wall [1/s]",
      "viscosity [Pa.s]",
      "viscosity_apparent [Pa.s]",
    ]);
    expect(out).toHaveLength(1 + RATES.length);
    out.slice(1).forEach((r, i) => {
      const a = RATES[i]!;
      expectClose(num(r[0]), 200, { rel: 1e-12 });
      expectClose(num(r[1]), 1, { rel: 1e-12 });
      expectClose(num(r[2]), a, { rel: 1e-9 });
      expectClose(num(r[3]), stressOf(a), { rel: 1e-9 });
      expectClose(num(r[4]), N, { rel: 1e-6 });
      expectClose(num(r[5]), wallRate(a), { rel: 1e-6 });
      expectClose(num(r[6]), K * wallRate(a) ** (N - 1), { rel: 1e-6 });
      expectClose(num(r[7]), stressOf(a) / a, { rel: 1e-9 });
    });
  });
  test("output units and warnings below the table", () => {
    const out = sheet.reduceData(rawTable(), "bagley", "global", 1, "kPa", "mPa.s", undefined, undefined, true);
    expect(out[0]![3]).toBe("wall_shear_stress [kPa]");
    expectClose(num(out[1]![3]), stressOf(RATES[0]!) / 1e3, { rel: 1e-9 });
    const widths = new Set(out.map((r) => r.length));
    expect(widths).toEqual(new Set([8]));
    expect(out.length).toBeGreaterThan(1 + RATES.length + 1);
  });
  test("text in the data is #VALUE! naming column and row of the range", () => {
    const raw = rawTable();
    raw[3]![3] = "n/a";
    const e = errorOf(sheet.reduceData(raw));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toBe('pressure [bar] (column 4): row 4 is text "n/a", not a number');
  });
  test("one die length with the Bagley correction is #N/A; endCorrection none works", () => {
    const raw = rawTable().slice(0, 1 + RATES.length);
    expect(errorOf(sheet.reduceData(raw)).code).toBe("#N/A");
    const out = sheet.reduceData(raw, "none", "global", 1);
    expect(out).toHaveLength(1 + RATES.length);
  });
  test("no header row or an unknown end correction is refused", () => {
    expect(errorOf(sheet.reduceData([[1, 2]])).code).toBe("#N/A");
    expect(errorOf(sheet.reduceData(rawTable(), "magic")).message).toBe('endCorrection: unknown choice "magic"; accepted: bagley, orifice, none');
  });
  test('endCorrection "orifice" subtracts a zero-length die (ISO 11443 orifice method, from memory)', () => {
    // An orifice die of L = 0.01 mm reads the entrance loss 2τ_w·e plus a negligible land
    // (2τ_w·0.02): the corrected stress of the 20 mm die is τ_w(1 − 0.01/20) = τ_w within 0.05 %.
    const raw = rawTable();
    for (const a of RATES) raw.push([1, 0.01, (a * Math.PI) / 32, (2 * stressOf(a) * (0.02 + 2.5)) / 1e5, 200]);
    const out = sheet.reduceData(raw, "orifice", "global", 1);
    expect(out).toHaveLength(1 + RATES.length);
    out.slice(1).forEach((r, i) => expectClose(num(r[3]), stressOf(RATES[i]!), { rel: 6e-4 }));
  });
});
