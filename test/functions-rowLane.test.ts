/**
 * The per-row lane of the element-wise worksheet functions (src/functions/adapter/rowCells.ts)
 * answers a call whose data arguments are all single cells holding numbers; everything else goes
 * the general way (mapRows). The lane must give exactly what the general way gives: here each
 * call with single cells is repeated with every data range doubled to two equal rows (which the
 * lane never takes), and the first row of that answer must be the same number, bit for bit, or
 * the same kind of error. Units are drawn from valid, blank, omitted and unknown texts in a
 * random order, so the lane's memory of the last unit text is exercised as well.
 *
 * The values themselves are checked against closed forms in test/functions.test.ts and
 * test/fuzz-functions.test.ts; this file checks only that the two paths agree.
 */
import fc from "fast-check";
import { acceptedUnits, type Quantity } from "../src/core/units";
import * as sheet from "../src/functions/functions";
import * as methods from "../src/functions/methods";
import { AS_IS, SI_RESULT, UnitArgument, rowCells2, rowCells3, rowCells4 } from "../src/functions/adapter";
import { expectClose } from "./helpers/expectClose";
import { FakeCustomFunctionError, installOfficeRuntime } from "./helpers/sheet";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

type Fn = (...args: unknown[]) => unknown[][];

/** A laned function: its data arguments, then its unit arguments' quantities (null: not a unit). */
interface Laned {
  name: string;
  fn: Fn;
  data: number;
  units: (Quantity | null)[];
}

const LANED: Laned[] = [
  { name: "flowRate", fn: sheet.flowRate as Fn, data: 2, units: ["speed", "length", "volumetricFlow"] },
  { name: "flowRateMass", fn: sheet.flowRateMass as Fn, data: 2, units: ["massRate", "density", "volumetricFlow"] },
  { name: "shearRateApp", fn: sheet.shearRateApp as Fn, data: 2, units: ["volumetricFlow", "length"] },
  { name: "wallStressApp", fn: sheet.wallStressApp as Fn, data: 3, units: ["pressure", "length", "pressure"] },
  { name: "wallStress", fn: sheet.wallStress as Fn, data: 4, units: ["pressure", "length", "pressure"] },
  { name: "wallStressEnd", fn: sheet.wallStressEnd as Fn, data: 4, units: ["pressure", "length", "pressure"] },
  { name: "viscosityApp", fn: sheet.viscosityApp as Fn, data: 2, units: ["pressure", "viscosity"] },
  { name: "slitShearRateApp", fn: methods.slitShearRateApp as Fn, data: 3, units: ["volumetricFlow", "length"] },
  { name: "slitWallStress", fn: methods.slitWallStress as Fn, data: 4, units: ["pressure", "length", "pressure"] },
  { name: "heating", fn: methods.heating as Fn, data: 3, units: ["pressure", "density", "heatCapacity"] },
];

/** Cell values: mostly plausible magnitudes, some zero, negative, tiny or huge (never −0: Excel has none). */
const value = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: -3, max: 4, noNaN: true }).map((e) => Math.pow(10, e)) },
  { weight: 1, arbitrary: fc.constantFrom(0, -1, -250, 1e-300, 1e300, 7.5e-9, 123456789) },
);

/** A unit argument: omitted, blank, a valid unit of the quantity (various spellings), or junk. */
function unitText(quantity: Quantity | null): fc.Arbitrary<unknown> {
  const valid = quantity ? acceptedUnits(quantity) : ["1"];
  return fc.oneof(
    { weight: 2, arbitrary: fc.constantFrom(undefined, null, "", "  ") },
    { weight: 5, arbitrary: fc.constantFrom(...valid) },
    { weight: 1, arbitrary: fc.constantFrom(...valid).map((u) => ` ${u.toUpperCase()} `) },
    { weight: 1, arbitrary: fc.constantFrom("furlong", "bar/s", 5, true, "mm3") },
  );
}

const isNumber = (v: unknown): v is number => typeof v === "number";

describe("the per-row lane gives what the general path gives", () => {
  test.each(LANED.map((f) => [f.name, f] as const))("%s", (_name, f) => {
    let answered = 0;
    fc.assert(
      fc.property(fc.array(value, { minLength: f.data, maxLength: f.data }), fc.tuple(...f.units.map(unitText)), (values, units) => {
        const single = f.fn(...values.map((v) => [[v]]), ...units);
        const doubled = f.fn(...values.map((v) => [[v], [v]]), ...units);
        const one = (single[0] as unknown[])[0];
        const first = (doubled[0] as unknown[])[0];
        expect(single).toHaveLength(1);
        if (isNumber(one)) {
          answered++;
          expect(doubled).toHaveLength(2);
          expect(Object.is(first, one)).toBe(true);
          expect(Object.is((doubled[1] as unknown[])[0], one)).toBe(true);
        } else {
          expect(one).toBeInstanceOf(FakeCustomFunctionError);
          expect(first).toBeInstanceOf(FakeCustomFunctionError);
          expect((first as FakeCustomFunctionError).code).toBe((one as FakeCustomFunctionError).code);
        }
      }),
      { seed: 20261203, numRuns: 400 },
    );
    // enough generated calls are valid that the comparison is not vacuous
    expect(answered).toBeGreaterThan(25);
  });

  test("a single-cell error keeps its message (the lane builds none: the general path does)", () => {
    const e = (sheet.wallStressApp([[-5]], [[1]], [[20]])[0] as unknown[])[0] as FakeCustomFunctionError;
    expect(e.code).toBe("#NUM!");
    expect(e.message).toMatch(/^pressure/);
    const u = (sheet.wallStressApp([[5]], [[1]], [[20]], "furlong")[0] as unknown[])[0] as FakeCustomFunctionError;
    expect(u.code).toBe("#VALUE!");
    expect(u.message).toMatch(/^pressureUnit: unknown pressure unit "furlong"; accepted: /);
  });

  test("an unknown unit text is refused and not remembered: the next valid text converts", () => {
    expect(((sheet.flowRate([[10]], [[15]], "furlong")[0] as unknown[])[0] as FakeCustomFunctionError).code).toBe("#VALUE!");
    // Q = v·π·Db²/4 with v = 10 mm/min = 1/6 mm/s and Db = 15 mm: mm3/s
    expectClose((sheet.flowRate([[10]], [[15]], "mm/min")[0] as unknown[])[0] as number, (10 / 60) * ((Math.PI * 15 ** 2) / 4), { rel: 1e-12 });
    expect(((sheet.flowRate([[10]], [[15]], "furlong")[0] as unknown[])[0] as FakeCustomFunctionError).code).toBe("#VALUE!");
  });
});

/*
 * The lane itself (src/functions/adapter/rowCells.ts): it answers only 1×1 ranges holding finite
 * numbers with known units, and declines (undefined) everything else, whatever a caller passes.
 * The answers are checked against the arithmetic written out here (SI = value·factor + 0, the
 * result divided by the output factor).
 */
describe("the lane declines what it does not take", () => {
  const sum2 = (a: number, b: number) => a + b;
  const sum3 = (a: number, b: number, c: number) => a + b + c;
  const sum4 = (a: number, b: number, c: number, d: number) => a + b + c + d;
  const throws = (): number => {
    throw new Error("core error");
  };

  test("1×1 ranges of finite numbers: value·factor + 0 into the core, the result ÷ the output factor", () => {
    expect(rowCells2(sum2, [[2]], 1e5, [[3]], 1e-3, 10)).toEqual([[(2 * 1e5 + 0 + (3 * 1e-3 + 0)) / 10]]);
    expect(rowCells3(sum3, [[2]], 1e5, [[3]], AS_IS, [[-0.5]], 1e-3, SI_RESULT)).toEqual([[2 * 1e5 + 3 + -0.5 * 1e-3]]);
    expect(rowCells4(sum4, [[1]], 2, [[3]], 4, [[5]], 6, [[7]], 8, 4)).toEqual([[(2 + 12 + 30 + 56) / 4]]);
    // a dimensionless argument passes as it is (−0 stays −0); SI_RESULT leaves the result as it is
    const negativeZero = rowCells2((a) => a, [[-0]], AS_IS, [[1]], 1, SI_RESULT) as number[][];
    expect(Object.is((negativeZero[0] as number[])[0], -0)).toBe(true);
  });

  const cells: unknown[] = ["5", "", " ", true, false, null, undefined, NaN, Infinity, -Infinity, {}, [1], 5n];
  test.each(cells.map((c) => [String(c), c] as const))("a cell holding %s", (_name, cell) => {
    expect(rowCells2(sum2, [[cell]], 1, [[1]], 1, 1)).toBeUndefined();
    expect(rowCells2(sum2, [[1]], 1, [[cell]], 1, 1)).toBeUndefined();
    expect(rowCells3(sum3, [[1]], 1, [[1]], 1, [[cell]], AS_IS, 1)).toBeUndefined();
    expect(rowCells4(sum4, [[1]], 1, [[1]], 1, [[1]], 1, [[cell]], 1, 1)).toBeUndefined();
  });

  const shapes: [string, unknown][] = [
    ["a row of two", [[1, 2]]],
    ["a column of two", [[1], [2]]],
    ["no rows", []],
    ["an empty row", [[]]],
    ["a number", 5],
    ["a text", "ab"],
    ["null", null],
    ["undefined", undefined],
    ["an object with a row but no length", { 0: [1] }],
  ];
  test.each(shapes)("a range that is %s", (_name, range) => {
    expect(rowCells2(sum2, range, 1, [[1]], 1, 1)).toBeUndefined();
    expect(rowCells3(sum3, [[1]], 1, range, 1, [[1]], 1, 1)).toBeUndefined();
    expect(rowCells4(sum4, [[1]], 1, [[1]], 1, [[1]], 1, range, 1, 1)).toBeUndefined();
  });

  test("a unit factor or output factor that is not finite, a core error, a result that is not finite", () => {
    expect(rowCells2(sum2, [[1]], NaN, [[1]], 1, 1)).toBeUndefined(); // an unknown unit or one with an offset
    expect(rowCells3(sum3, [[1]], 1, [[1]], 1, [[1]], NaN, 1)).toBeUndefined();
    expect(rowCells2(sum2, [[1]], 1, [[1]], 1, NaN)).toBeUndefined();
    expect(rowCells2(sum2, [[1]], 1, [[1]], 1, AS_IS)).toBeUndefined(); // AS_IS is no output factor: ÷0 declines
    expect(rowCells3(throws, [[1]], 1, [[1]], 1, [[1]], 1, 1)).toBeUndefined();
    expect(rowCells2(sum2, [[1e300]], 1e10, [[1]], 1, 1)).toBeUndefined(); // overflow in the conversion
    expect(rowCells2((a, b) => a / b, [[1]], 1, [[0]], 1, 1)).toBeUndefined(); // the core's result is infinite
  });
});

describe("UnitArgument.factor", () => {
  test("omitted (undefined or null) is the default unit; a text given is looked up; an unknown one is NaN", () => {
    const length = new UnitArgument("lengthUnit", "length", "mm");
    expect(length.factor(undefined)).toBe(1e-3);
    expect(length.factor(null)).toBe(1e-3);
    expect(length.factor("in")).toBe(0.0254); // 1 in = 25.4 mm exactly (NIST SP 811, appendix B)
    expect(length.factor(undefined)).toBe(1e-3); // an omitted unit between texts: still the default
    expect(length.factor("in")).toBe(0.0254);
    expect(length.factor("furlong")).toBeNaN();
    expect(length.factor("m")).toBe(1);
    expect(new UnitArgument("temperature", "temperature", "C").factor(undefined)).toBeNaN(); // a unit with an offset
  });
});
