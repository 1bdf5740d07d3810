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
