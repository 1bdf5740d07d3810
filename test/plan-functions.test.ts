/**
 * RHEO.PLAN and RHEO.LOTCHECK called as Excel calls them: ranges as 2-D arrays, omitted optional
 * arguments as null, errors returned as cell errors.
 */
import * as sheet from "../src/functions/planning";
import { col, errorOf, installOfficeRuntime, num } from "./helpers/sheet";
import { expectClose } from "./helpers/expectClose";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

/** Settings range as typed in a sheet: names in column A, numbers in default units or text. */
const settings = (over: [string, unknown][] = []): unknown[][] => {
  const base: [string, unknown][] = [
    ["barrelDiameter", 15],
    ["usable length", "200 mm"],
    ["density", 1.26],
    ["dwellTime", 60],
    ["shearRateMin", 100],
    ["shearRateMax", 10000],
    ["points", 3],
    ["priorModel", "newtonian"],
    ["priorParameters", "mu=1.4"],
    ["endCorrection", 0],
    ["", ""],
  ];
  const map = new Map(base);
  for (const [k, v] of over) map.set(k, v);
  return [...map.entries()];
};
const dies = [
  ["name", "type", "diameter [mm]", "length [mm]"],
  ["L20", "capillary", 1, 20],
];
const transducers = [
  ["name", "full_scale [bar]", "accuracy [%]"],
  ["P10", 10, 0.25],
  ["P100", 100, 0.25],
];

describe("RHEO.PLAN(settings, dies, transducers, output)", () => {
  test("steps: header row, one row per step; pressures in bar match Hagen–Poiseuille", () => {
    const out = sheet.plan(settings(), dies, transducers, undefined);
    const header = out[0] as string[];
    expect(header[0]).toBe("die");
    const p = header.indexOf("pressure [bar]");
    const speed = header.indexOf("piston_speed [mm/min]");
    expect(out).toHaveLength(4);
    // ΔP = 2μγ̇·L/R (Hagen–Poiseuille, Bird, Stewart & Lightfoot 2002, eq. 2.3-21, from memory) = 11 200 Pa at 100 1/s
    [0.112, 1.12, 11.2].forEach((bar, i) => expectClose(num(out[i + 1]![p]), bar, { rel: 1e-6 }));
    // v = γ̇D³/(8D_b²) = 100 · 1 / (8 · 225) mm/s = 0.05556 mm/s = 3.3333 mm/min
    expectClose(num(out[1]![speed]), 3.33333, { rel: 1e-5 });
    expect(out[1]![header.indexOf("range")]).toBe("LOW");
  });

  test("summary: one row per die and a total; warnings lists codes", () => {
    const summary = sheet.plan(settings(), dies, transducers, "summary");
    expect(summary.map((r) => r[0])).toEqual(["die", "L20", "total"]);
    expect(String(summary[2]![3])).toMatch(/barrel holds 35.34 cm3 = 44.53 g/);
    const warnings = sheet.plan(settings(), dies, transducers, "warnings");
    expect(warnings.map((r) => r[0])).toContain("PLAN_PRESSURE_LOW");
  });

  test("bad settings come back as one cell error naming the setting", () => {
    const e = errorOf(sheet.plan(settings([["barrelDiameter", "15 quarts"]]), dies, transducers, undefined));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toMatch(/^barrelDiameter: unknown length unit "quarts"/);
    expect(errorOf(sheet.plan(settings([["barrel bore", 15]]), dies, transducers, undefined)).message).toMatch(/unknown name "barrel bore"; accepted: barrelDiameter/);
    expect(errorOf(sheet.plan(settings(), [["name", "colour"], ["a", "red"]], transducers, undefined)).message).toMatch(/dies header column 2: unknown name "colour"/);
    expect(errorOf(sheet.plan(settings(), dies, transducers, "everything")).message).toMatch(/output: unknown choice "everything"/);
  });
});

describe("RHEO.LOTCHECK(lotShearRate, lotViscosity, referenceShearRate, reference, tolerance, parameters, viscosityUnit, temperature)", () => {
  const refRates = col(10, 100, 1000);
  const refVisc = col(2000, 800, 200);
  test("reference table: deviation %, PASS/FAIL per rate, verdict and worst point (band edges ±10 %)", () => {
    const out = sheet.lotCheck(col(10, 100, 1000), col(2000, 880.1, 200), refRates, refVisc, null as never, null as never, null as never, null as never);
    expect(out[0]).toEqual(["shear_rate [1/s]", "reference_viscosity [Pa.s]", "band_lower [Pa.s]", "band_upper [Pa.s]", "lot_viscosity [Pa.s]", "deviation [%]", "status"]);
    expect(out.slice(1, 4).map((r) => r[6])).toEqual(["PASS", "FAIL", "PASS"]);
    expectClose(num(out[2]![5]), 10.0125, { rel: 1e-9 });
    const verdict = out.find((r) => r[0] === "verdict");
    expect(verdict?.[1]).toBe("FAIL");
    expect(out.find((r) => r[0] === "worst_shear_rate [1/s]")?.[1]).toBe(100);
    const inside = sheet.lotCheck(col(10, 100, 1000), col(2000, 879.9, 200), refRates, refVisc, 10, null as never, null as never, null as never);
    expect(inside.find((r) => r[0] === "verdict")?.[1]).toBe("PASS");
  });

  test("viscosityUnit mPa.s applies to inputs and outputs; blank lot rows are skipped", () => {
    const out = sheet.lotCheck(col(10, null, 100, 1000), col(2.1e6, null, 8e5, 2e5), refRates, col(2e6, 8e5, 2e5), 10, undefined, "mPa.s", undefined);
    expect(out[0]![1]).toBe("reference_viscosity [mPa.s]");
    expectClose(num(out[1]![5]), 5, { rel: 1e-9 });
    expectClose(num(out[1]![4]), 2.1e6, { rel: 1e-12 });
  });

  test("model reference: power law at the lot's rates when referenceShearRate is blank", () => {
    // η = 1e4·γ̇^(−0.6): 2511.886 Pa·s at 10 1/s (invented parameters)
    const out = sheet.lotCheck(col(10, 100), col(2511.886, 700), [[null]], [["power-law"]], 10, "K=1e4, n=0.4", undefined, undefined);
    expectClose(num(out[1]![1]), 2511.886, { rel: 1e-6 });
    expect(out[2]![6]).toBe("FAIL"); // 700 / 630.957 − 1 = +10.9 %
  });

  test("out-of-range reference rates: NOT COMPARED and a warning row", () => {
    // at 100 1/s, midway in log between 20 and 500 1/s: √(1280 · 500) = 800 Pa·s
    const out = sheet.lotCheck(col(20, 500), col(1280, 500), refRates, refVisc, 10, undefined, undefined, undefined);
    expect(out.slice(1, 4).map((r) => r[6])).toEqual(["NOT COMPARED", "PASS", "NOT COMPARED"]);
    expect(out.some((r) => r[0] === "LOT_POINTS_NOT_COMPARED")).toBe(true);
  });

  test("errors name the argument", () => {
    expect(errorOf(sheet.lotCheck(col(10, 100), col(1, "n/a"), refRates, refVisc, 10, undefined, undefined, undefined)).message).toMatch(/^lotViscosity: row 2 is text "n\/a"/);
    expect(errorOf(sheet.lotCheck(col(10, 100), col(1, 2), refRates, col(1, 2), 10, undefined, undefined, undefined)).message).toMatch(/^reference: has 2 cells but referenceShearRate has 3/);
    expect(errorOf(sheet.lotCheck(col(10, 100), col(1, 2), refRates, refVisc, -1, undefined, undefined, undefined)).message).toMatch(/^tolerance:/);
    expect(errorOf(sheet.lotCheck(col(10, 100), col(1, 2), [[null]], [["power-law"]], 10, "K=1e4", undefined, undefined)).message).toMatch(/missing: n/);
  });
});
