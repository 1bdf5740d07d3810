import { acceptedUnits, convertUnit, fromSI, toSI } from "../src/core/units";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

describe("toSI / fromSI against defining values", () => {
  // NIST SP 811 (2008) appendix B.8: 1 psi = 6.894 757 E+03 Pa (6894.757293168 from lbf/in²).
  test("1 psi = 6894.757 Pa (NIST SP 811)", () => expectClose(toSI(1, "psi", "pressure"), 6894.757, { rel: 1e-7 }));
  // 1 bar = 100 kPa exactly: SI Brochure, 8th ed. (BIPM 2006), Table 8 (from memory; the 9th ed.
  // of 2019 no longer lists the bar); NIST SP 811 (2008).
  test("1 bar = 1e5 Pa (SI brochure)", () => expect(toSI(1, "bar", "pressure")).toBe(1e5));
  test("MPa and kPa", () => {
    expect(toSI(2.5, "MPa", "pressure")).toBe(2.5e6);
    expect(toSI(2.5, "kPa", "pressure")).toBe(2500);
  });
  // International yard and pound agreement (1959), NIST SP 811: 1 in = 0.0254 m exactly.
  test("1 in = 0.0254 m", () => expect(toSI(1, "in", "length")).toBe(0.0254));
  test("µm, um and micron are one unit", () => {
    for (const u of ["µm", "μm", "um", "micron"]) expectClose(toSI(500, u, "length"), 5e-4, { rel: 1e-15 });
  });
  // ITS-90 / SI brochure: T/K = t/°C + 273.15; NIST SP 811 B.9: T/K = (t/°F + 459.67)/1.8.
  test("temperatures: 200 °C = 473.15 K, 392 °F = 473.15 K", () => {
    expectClose(toSI(200, "°C", "temperature"), 473.15, { rel: 1e-15 });
    expectClose(toSI(200, "C", "temperature"), 473.15, { rel: 1e-15 });
    expectClose(toSI(392, "°F", "temperature"), 473.15, { rel: 1e-14 });
    expectClose(fromSI(273.15, "F", "temperature"), 32, { rel: 1e-14 });
  });
  // CGS definitions (NIST SP 811 B.8): 1 P = 0.1 Pa·s, 1 cP = 1 mPa·s.
  test("viscosity: P, cP, mPa.s, Pa·s spellings", () => {
    expect(toSI(1, "P", "viscosity")).toBeCloseTo(0.1, 15);
    expect(toSI(1, "cP", "viscosity")).toBe(toSI(1, "mPa.s", "viscosity"));
    expect(toSI(3, "Pa·s", "viscosity")).toBe(3);
    expect(toSI(3, "Pa s", "viscosity")).toBe(3);
  });
  test("speeds: 60 mm/min = 1 mm/s", () => expectClose(toSI(60, "mm/min", "speed"), 1e-3, { rel: 1e-15 }));
  test("flows: 1 cm3/min = 1e-6/60 m3/s; superscript spelling accepted", () => {
    expectClose(toSI(1, "cm3/min", "volumetricFlow"), 1e-6 / 60, { rel: 1e-15 });
    expectClose(toSI(1, "cm³/min", "volumetricFlow"), 1e-6 / 60, { rel: 1e-15 });
    expectClose(toSI(1, "mm3/s", "volumetricFlow"), 1e-9, { rel: 1e-15 });
  });
  test("mass rates: 6 g/min = 60 g/10min = 0.36 kg/h", () => {
    const a = toSI(6, "g/min", "massRate");
    expectClose(toSI(60, "g/10min", "massRate"), a, { rel: 1e-14 });
    expectClose(toSI(0.36, "kg/h", "massRate"), a, { rel: 1e-14 });
  });
});

describe("convertUnit(value, from, to)", () => {
  test("infers the quantity", () => expectClose(convertUnit(1000, "psi", "bar"), 68.94757293168, { rel: 1e-12 }));
  test("temperature is affine", () => expectClose(convertUnit(100, "C", "F"), 212, { rel: 1e-13 }));
  test("refuses different quantities, naming both units", () => {
    expect(() => convertUnit(1, "bar", "mm")).toThrow(/"bar" is a pressure unit but "mm" is a length unit/);
  });
});

describe("unknown units", () => {
  test("name the unit and list the accepted ones", () => {
    let err: unknown;
    try {
      toSI(1, "psia", "pressure", "pressure");
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RheoError);
    expect((err as RheoError).kind).toBe("value");
    expect((err as RheoError).message).toBe(
      `pressure: unknown pressure unit "psia"; accepted: ${acceptedUnits("pressure").join(", ")}`,
    );
  });
  test("convertUnit names fromUnit or toUnit", () => {
    expect(() => convertUnit(1, "furlong", "m")).toThrow(/^fromUnit: unknown unit "furlong"/);
    expect(() => convertUnit(1, "m", "furlong")).toThrow(/^toUnit: unknown unit "furlong"/);
  });
});
