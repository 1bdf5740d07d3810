/**
 * The element-wise RHEO functions called as Excel calls them, and the range conventions they share
 * (README, "Conventions of the RHEO functions").
 */
import fc from "fast-check";
import * as sheet from "../src/functions/functions";
import { SheetError } from "../src/functions/adapter";
import { expectClose } from "./helpers/expectClose";
import { FakeCustomFunctionError, col, cell, errorOf, installOfficeRuntime, num, row, valuesOf } from "./helpers/sheet";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

// Piston displacement Q = v·πD²/4 (volume swept per unit time): 1 mm/min in a 15 mm bore is
// π·7.5²/60 mm³/s = 2.945243112740431 mm³/s.
const Q_1MM_PER_MIN_15MM = (Math.PI * 7.5 * 7.5) / 60;

describe("RHEO.FLOWRATE(pistonSpeed, barrelDiameter, speedUnit, lengthUnit, outputUnit)", () => {
  test("single cells, default units mm/min, mm → mm3/s", () => {
    expectClose(num(sheet.flowRate(cell(1), cell(15))[0]?.[0]), Q_1MM_PER_MIN_15MM, { rel: 1e-12 });
  });
  test("a column spills a column; the bore repeats", () => {
    const out = sheet.flowRate(col(1, 2, 4), cell(15));
    expect(out).toHaveLength(3);
    valuesOf(out).forEach((q, i) => expectClose(q as number, [1, 2, 4][i]! * Q_1MM_PER_MIN_15MM, { rel: 1e-12 }));
  });
  test("a row spills a row", () => {
    const out = sheet.flowRate(row(1, 2), cell(15));
    expect(out).toHaveLength(1);
    expect(out[0]).toHaveLength(2);
  });
  test("paired column of bores", () => {
    const out = valuesOf(sheet.flowRate(col(1, 1), col(15, 30)));
    expectClose(out[1] as number, 4 * Q_1MM_PER_MIN_15MM, { rel: 1e-12 });
  });
  test("units: 1 mm/s in 0.5906 in → cm3/min (NIST SP 811: 1 in = 25.4 mm)", () => {
    const bore = 15 / 25.4;
    const out = num(sheet.flowRate(cell(1), cell(bore), "mm/s", "in", "cm3/min")[0]?.[0]);
    expectClose(out, (Q_1MM_PER_MIN_15MM * 60 * 60) / 1000, { rel: 1e-12 });
  });
  test("omitted optional arguments may arrive as null", () => {
    const out = num(sheet.flowRate(cell(1), cell(15), null as unknown as string, null as unknown as string, "")[0]?.[0]);
    expectClose(out, Q_1MM_PER_MIN_15MM, { rel: 1e-12 });
  });
});

describe("range conventions", () => {
  test("numbers stored as text are read as numbers", () => {
    const out = valuesOf(sheet.flowRate(col(" 1 ", "2e0", "+4"), cell("15")));
    expectClose(out[2] as number, 4 * Q_1MM_PER_MIN_15MM, { rel: 1e-12 });
  });
  test("a blank (null, \"\", spaces) in any paired cell skips the row and keeps it empty", () => {
    const out = valuesOf(sheet.flowRate(col(1, null, "", 2, 3), col(15, 15, 15, "  ", 15)));
    expect(out.map((v) => (v === "" ? "" : "n"))).toEqual(["n", "", "", "", "n"]);
    expectClose(out[4] as number, 3 * Q_1MM_PER_MIN_15MM, { rel: 1e-12 });
  });
  test("a blank single cell against a longer range is #N/A", () => {
    const e = errorOf(sheet.flowRate(col(1, 2), cell(null)));
    expect(e.code).toBe("#N/A");
    expect(e.message).toBe("barrelDiameter: is blank; give a value or a range as long as the data");
  });
  test("a single blank call returns a blank cell", () => {
    expect(sheet.flowRate(cell(null), cell(15))).toEqual([[""]]);
  });
  test("text is #VALUE! naming argument and row", () => {
    const e = errorOf(sheet.flowRate(col(1, 2, 3, "n/a"), cell(15)));
    expect(e).toEqual({ code: "#VALUE!", message: 'pistonSpeed: row 4 is text "n/a"' });
  });
  test("in a row range the position is a column", () => {
    expect(errorOf(sheet.flowRate(row(1, "x"), cell(15))).message).toBe('pistonSpeed: column 2 is text "x"');
  });
  test("logical values are #VALUE!", () => {
    const e = errorOf(sheet.flowRate(col(1, true), cell(15)));
    expect(e).toEqual({ code: "#VALUE!", message: "pistonSpeed: row 2 is the logical value TRUE, not a number" });
  });
  test("error values inside a range are #VALUE! naming the error", () => {
    const e = errorOf(sheet.flowRate(col(1, new FakeCustomFunctionError("#DIV/0!")), cell(15)));
    expect(e.message).toBe("pistonSpeed: row 2 holds the error #DIV/0!");
  });
  test("paired ranges of unequal length: #VALUE! naming both", () => {
    const e = errorOf(sheet.flowRate(col(1, 2, 3), col(15, 15)));
    expect(e).toEqual({
      code: "#VALUE!",
      message: "barrelDiameter: has 2 cells but pistonSpeed has 3; paired ranges must have equal lengths",
    });
  });
  test("a 2-D block is #VALUE!", () => {
    expect(errorOf(sheet.flowRate([[1, 2], [3, 4]], cell(15))).message).toBe(
      "pistonSpeed: must be a single column or row, got a 2×2 range",
    );
  });
  test("an unknown unit is #VALUE! naming the argument and listing accepted units", () => {
    const e = errorOf(sheet.flowRate(cell(1), cell(15), "furlong/s"));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toMatch(/^speedUnit: unknown speed unit "furlong\/s"; accepted: m\/s, mm\/s, mm\/min/);
  });
  test("a unit of the wrong quantity is #VALUE!", () => {
    expect(errorOf(sheet.flowRate(cell(1), cell(15), "mm")).message).toMatch(/^speedUnit: unknown speed unit "mm"/);
  });
  test("negative piston speed is #NUM! with the row", () => {
    const e = errorOf(sheet.flowRate(col(1, -2), cell(15)));
    expect(e).toEqual({ code: "#NUM!", message: "pistonSpeed: row 2 must not be negative, got -2 mm/min" });
  });
  test("zero bore is #NUM!", () => {
    expect(errorOf(sheet.flowRate(cell(1), cell(0))).code).toBe("#NUM!");
  });
  test("errors are CustomFunctions.Error when the Office runtime is present, SheetError otherwise", () => {
    const inExcel = sheet.flowRate(cell("x"), cell(15))[0]?.[0];
    expect(inExcel).toBeInstanceOf(FakeCustomFunctionError);
    uninstall();
    try {
      const outside = sheet.flowRate(cell("x"), cell(15))[0]?.[0];
      expect(outside).toBeInstanceOf(SheetError);
      expect((outside as SheetError).code).toBe("#VALUE!");
    } finally {
      uninstall = installOfficeRuntime();
    }
  });
  test("no input makes a function throw or return NaN/Infinity (property test)", () => {
    const cellValue = fc.oneof(
      fc.double(),
      fc.integer(),
      fc.string({ maxLength: 4 }),
      fc.boolean(),
      fc.constant(null),
      fc.constant(""),
      fc.constantFrom("1e400", "-0", "NaN", "Infinity"),
    );
    const column = fc.array(cellValue, { minLength: 1, maxLength: 6 }).map((v) => v.map((x) => [x]));
    fc.assert(
      fc.property(column, column, column, (a, b, c) => {
        const results = [
          sheet.flowRate(a, b),
          sheet.wallStressApp(a, b, c),
          sheet.wallStressEnd(a, b, c, c),
          sheet.nPrime(a, b),
          sheet.viscosity(a, b),
          sheet.bagley(a, b, c),
          sheet.convert(a, "bar", "psi"),
        ];
        for (const grid of results) {
          for (const r of grid) {
            for (const v of r) {
              // a finite number, an empty cell of a spill, or an error that names what went wrong;
              // and no text at all: none of these calls asks for a header row
              const ok = (typeof v === "number" && Number.isFinite(v)) || v === "" || (v instanceof FakeCustomFunctionError && /^\S[^:]*: \S/.test(v.message));
              if (!ok) {
                throw new Error(`unexpected cell ${typeof v === "string" ? JSON.stringify(v) : String(v)} for ${JSON.stringify([a, b, c])}`);
              }
            }
          }
        }
        return true;
      }),
      { numRuns: 300, seed: 20240611 },
    );
  });
});

describe("RHEO.FLOWRATEMASS(massRate, density, ...)", () => {
  test("6 g/min at 0.75 g/cm3 = 8 cm3/min = 133.33 mm3/s (Q = ṁ/ρ)", () => {
    expectClose(num(sheet.flowRateMass(cell(6), cell(0.75))[0]?.[0]), 8000 / 60, { rel: 1e-12 });
  });
  test("g/10min and kg/m3 units, output cm3/min", () => {
    expectClose(num(sheet.flowRateMass(cell(60), cell(750), "g/10min", "kg/m3", "cm3/min")[0]?.[0]), 8, { rel: 1e-12 });
  });
  test("zero density is #NUM!", () => {
    expect(errorOf(sheet.flowRateMass(cell(6), cell(0))).message).toBe("density: row 1 must be greater than zero, got 0 g/cm3");
  });
});

describe("RHEO.SHEARRATEAPP(flowRate, dieDiameter, ...)", () => {
  // Hagen–Poiseuille Newtonian wall rate 32Q/(πD³) (Macosko 1994, ch. 6): 10 mm³/s in a 1 mm die.
  test("10 mm3/s through 1 mm: 320/π 1/s", () => {
    expectClose(num(sheet.shearRateApp(cell(10), cell(1))[0]?.[0]), 320 / Math.PI, { rel: 1e-12 });
  });
  test("a column with cm3/min", () => {
    const out = valuesOf(sheet.shearRateApp(col(0.6, 1.2), cell(1), "cm3/min"));
    expectClose(out[1] as number, 640 / Math.PI, { rel: 1e-12 });
  });
});

describe("wall stresses", () => {
  // τ = ΔP·D/(4L) (force balance on the melt cylinder, Macosko 1994, ch. 6, from memory): 100 bar, D 1 mm, L 20 mm.
  test("RHEO.WALLSTRESSAPP: 100 bar, 1 mm × 20 mm → 125 kPa", () => {
    expectClose(num(sheet.wallStressApp(cell(100), cell(1), cell(20))[0]?.[0]), 1.25e5, { rel: 1e-12 });
    expectClose(num(sheet.wallStressApp(cell(10), cell(1), cell(20), "MPa", "mm", "kPa")[0]?.[0]), 125, { rel: 1e-12 });
  });
  test("RHEO.WALLSTRESS: (100 − 20) bar → 100 kPa (Bagley 1957)", () => {
    expectClose(num(sheet.wallStress(cell(100), cell(20), cell(1), cell(20))[0]?.[0]), 1e5, { rel: 1e-12 });
  });
  test("RHEO.WALLSTRESSEND: ΔP/(2(L/R + e)) with e = 2: 1e7/84 Pa", () => {
    expectClose(num(sheet.wallStressEnd(cell(100), cell(2), cell(1), cell(20))[0]?.[0]), 1e7 / 84, { rel: 1e-12 });
  });
  test("the two corrections agree when ΔPent = 2τ_w·e (Bagley 1957)", () => {
    const pressures = col(40, 80, 160);
    const viaEnd = valuesOf(sheet.wallStressEnd(pressures, cell(2.5), cell(1), cell(10)));
    // with e given, τ = ΔP/(2(L/R + e)); the same line's intercept is ΔPent = 2τ·e.
    const entrance = viaEnd.map((t) => (2 * (t as number) * 2.5) / 1e5);
    const viaEntrance = valuesOf(sheet.wallStress(pressures, col(...entrance), cell(1), cell(10)));
    viaEnd.forEach((t, i) => expectClose(viaEntrance[i] as number, t as number, { rel: 1e-12 }));
  });
  test("negative pressure is #NUM!, zero die length is #NUM!", () => {
    expect(errorOf(sheet.wallStressApp(col(100, -1), cell(1), cell(20))).message).toBe(
      "pressure: row 2 must not be negative, got -1 bar",
    );
    expect(errorOf(sheet.wallStressApp(cell(100), cell(1), cell(0))).code).toBe("#NUM!");
  });
  test("e so negative that L/R + e ≤ 0 is #NUM!", () => {
    expect(errorOf(sheet.wallStressEnd(cell(100), cell(-50), cell(1), cell(20))).code).toBe("#NUM!");
  });
});

describe("RHEO.VISCOSITYAPP(shearRateApparent, wallShearStress, ...)", () => {
  test("η_a = τ/γ̇_a: 125 kPa at 100 1/s = 1250 Pa.s", () => {
    expectClose(num(sheet.viscosityApp(cell(100), cell(125000))[0]?.[0]), 1250, { rel: 1e-12 });
    expectClose(num(sheet.viscosityApp(cell(100), cell(125), "kPa", "mPa.s")[0]?.[0]), 1.25e6, { rel: 1e-12 });
  });
  test("zero rate is #NUM!", () => {
    expect(errorOf(sheet.viscosityApp(col(100, 0), cell(1))).message).toBe("shearRateApparent: row 2 must be greater than zero, got 0");
  });
});

describe("RHEO.CONVERT(value, fromUnit, toUnit, quantity)", () => {
  // NIST SP 811 (2008) B.8: 1 psi = 6894.757 Pa; 1 bar = 1e5 Pa.
  test("1000 psi = 68.94757 bar", () => {
    expectClose(num(sheet.convert(cell(1000), "psi", "bar")[0]?.[0]), 68.94757293168, { rel: 1e-12 });
  });
  test("keeps the shape of a 2-D block; blanks stay blank", () => {
    const out = sheet.convert([[1, null], ["2", 3]], "bar", "kPa");
    expect(out).toEqual([[100, ""], [200, 300]]);
  });
  test("temperature is affine; differences need the quantity", () => {
    expectClose(num(sheet.convert(cell(200), "C", "F")[0]?.[0]), 392, { rel: 1e-13 });
    expectClose(num(sheet.convert(cell(10), "C", "F", "temperatureDifference")[0]?.[0]), 18, { rel: 1e-13 });
  });
  test("incompatible units are #VALUE! naming both", () => {
    const e = errorOf(sheet.convert(cell(1), "bar", "mm"));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toBe('toUnit: "bar" is a pressure unit but "mm" is a length unit; they cannot be converted');
  });
  test("text in a block names row and column", () => {
    expect(errorOf(sheet.convert([[1, 2], [3, "x"]], "bar", "Pa")).message).toBe('value: row 2, column 2 is text "x"');
  });
  test("an unknown quantity is #VALUE!", () => {
    expect(errorOf(sheet.convert(cell(1), "bar", "Pa", "stress")).message).toMatch(/^quantity: unknown choice "stress"/);
  });
});

describe("RHEO.UNITS(quantity)", () => {
  test("lists one quantity's units as a column", () => {
    expect(sheet.units("viscosity")).toEqual([["Pa.s"], ["mPa.s"], ["kPa.s"], ["P"], ["cP"]]);
  });
  test("lists every quantity with its units when omitted", () => {
    const out = sheet.units();
    expect(out.every((r) => r.length === 2)).toBe(true);
    expect(out.find((r) => r[0] === "pressure")?.[1]).toMatch(/^Pa, kPa, MPa/);
  });
});
