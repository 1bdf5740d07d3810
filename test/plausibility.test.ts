/**
 * The plausibility table (src/core/plausibility.ts; ranges are common practice, no source) and
 * the unit slips it names. Unit factors: NIST SP 811 (2008), appendix B, as in units.ts.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { PLAUSIBLE_RANGES, checkPlausible, plausibilityMarkdown } from "../src/core/plausibility";
import { reduce } from "../src/core/reduce";
import { readRawTable } from "../src/io/rawTable";

const ROW = [190, 1, 20, 15, 1, 100];
const header = (d: string, t = "C", p = "bar") => [`temperature [${t}]`, `die_diameter [${d}]`, "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", `pressure [${p}]`];
const warningsOf = (cells: unknown[][]) => readRawTable(cells).warnings.filter((w) => w.code === "IMPLAUSIBLE_VALUE").map((w) => w.message);

describe("unit slips in the headers are named", () => {
  test("issue example: a die bore of 1 written under [µm] gives 1 µm: did you mean mm?", () => {
    // @check plausibility | a value given in µm stated in mm, and the unit that puts it in range (1 µm = 0.001 mm) | NIST SP 811 (2008) appendix B (the SI prefixes) | exact | 2
    expect(warningsOf([header("µm"), ROW])).toEqual([
      "die_diameter [µm] (column 2), row 2: 1 µm (= 0.001 mm) is below the usual range of a die bore (0.1 to 20 mm); did you mean mm or cm? (1 mm would be usual).",
    ]);
  });
  test("a temperature column headed [K] holding °C values (a melt at −83 °C)", () => {
    // @check plausibility | 190 K stated as −83.15 °C | NIST SP 811 (2008) §4.2.1.1, T(°C) = T(K) − 273.15 | exact | 1
    const [message] = warningsOf([header("mm", "K"), ROW]);
    expect(message).toMatch(/^temperature \[K\] \(column 1\), row 2: 190 K \(= −83\.15 °C\) is below the usual range of a test temperature \(−60 to 450 °C\); did you mean °C/);
  });
  test("pressures under [GPa] that are MPa (15 GPa)", () => {
    const [message] = warningsOf([header("mm", "C", "GPa"), [190, 1, 20, 15, 1, 15]]);
    expect(message).toMatch(/15 GPa \(= 1\.5e5 bar\) is above the usual range of a pressure \(0\.01 to 4000 bar\); did you mean bar, MPa or kPa\?/);
  });
  test("lengths in [m] that are mm: the largest offending value and its row are named", () => {
    const [message] = warningsOf([header("m"), ROW, [190, 2, 20, 15, 1, 100]]);
    expect(message).toMatch(/^die_diameter \[m\] \(column 2\), row 3: 2 m \(= 2000 mm\) is above/);
  });
  test("plausible data give no such warning", () => {
    expect(warningsOf([header("mm"), ROW])).toEqual([]);
  });
  test("checkPlausible(key, smallest, largest, unit): null inside, the side and the fitting units outside", () => {
    expect(checkPlausible("dieDiameter", 0.5, 3, "mm")).toBeNull();
    expect(checkPlausible("density", 0.76, 0.76, "kg/m3")).toEqual({ value: 0.76, side: "low", suggestedUnit: "g/cm3", fittingUnits: ["g/cm3"] });
    expect(checkPlausible("temperature", 463, 503, "C")).toMatchObject({ side: "high", suggestedUnit: "K" });
    expect(checkPlausible("viscosity", 5e-11, 1e-9, "Pa.s")).toEqual({ value: 5e-11, side: "low", suggestedUnit: null, fittingUnits: [] });
  });
});

describe("settings and results", () => {
  const data = [1, 2, 4, 8].flatMap((v) =>
    [10e-3, 20e-3].map((L) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: v * 1e-9, pressure: 2 * 5e4 * v ** 0.4 * ((2 * L) / 1e-3 + 3), temperature: 463.15 })),
  );
  test("issue example: a heat capacity of 2.3 J/(kg·K) (kJ meant) is named; the other heating inputs pass", () => {
    const r = reduce(data, { heating: { density: 760, heatCapacity: 2.3, conductivity: 0.25, temperatureCoefficient: 0.03 } });
    const messages = r.warnings.filter((w) => w.code === "IMPLAUSIBLE_VALUE").map((w) => w.message);
    expect(messages).toEqual(["Setting specific heat capacity: 2.3 J/(kg.K) is below the usual range of a specific heat capacity (500 to 5000 J/(kg.K)); did you mean kJ/(kg.K)? (2.3 kJ/(kg.K) would be usual)."]);
  });
  test("viscosities of 5e-11 Pa·s from a unit slip are named per group", () => {
    const slipped = data.map((m) => ({ ...m, pressure: m.pressure * 1e-12 }));
    const r = reduce(slipped);
    expect(r.warnings.some((w) => w.code === "IMPLAUSIBLE_VALUE" && /^190 °C, D 1 mm: apparent viscosity .* is below the usual range of a viscosity/.test(w.message))).toBe(true);
  });
});

describe("docs/input.md", () => {
  test("holds the table as the code has it", () => {
    const doc = readFileSync(join(__dirname, "..", "docs", "input.md"), "utf8");
    const table = /<!-- plausibility -->\n([\s\S]*?)\n<!-- plausibility:end -->/.exec(doc)?.[1];
    expect(table).toBe(plausibilityMarkdown());
    expect(Object.keys(PLAUSIBLE_RANGES).every((k) => table?.includes(`| ${k} |`))).toBe(true);
  });
});
