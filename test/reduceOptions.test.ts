/**
 * src/io/reduceOptions.ts: one reader of reduce settings for the command line, the pane and
 * RHEO.REDUCE. The same settings given the way each surface gives them must give the same SI
 * options; every error names the setting as that surface calls it; all errors are collected.
 * Unit factors: NIST SP 811 (2008) appendix B (1 bar = 1e5 Pa exactly).
 */
import { CLI_SETTINGS_SOURCE, KEYED_SETTINGS_SOURCE, REDUCE_SETTINGS, collectReduceSettings, readReduceSettings } from "../src/io/reduceOptions";
import { REDUCE_SETTING_WORDS, reduceSettingFlags } from "../src/io/reduceSettingWords";
import { readNumberText, readQuantityText } from "../src/io/numberText";
import { RheoError } from "../src/core/errors";
import { reduceData } from "../src/functions/functions";
import { main } from "../src/cli/main";

describe("readNumberText(text, argument)", () => {
  test.each([
    ["15", 15],
    ["0,25", 0.25],
    ["0.250", 0.25],
    ["1.234,5", 1234.5],
    ["1,234.5", 1234.5],
    ["1 234,5", 1234.5],
    ["1.000.000", 1e6],
    ["2.5e5", 2.5e5],
    ["-3,5", -3.5],
    [".5", 0.5],
  ])("reads %s as %d", (text, value) => expect(readNumberText(text, "x")).toBe(value));

  test.each(["1,000", "2.500", "12,345"])("refuses %s: two readings, both named", (text) => {
    expect(() => readNumberText(text, "fullScale")).toThrow(/^fullScale: ".*" can be read as [\d.]+ or as \d+/);
    try {
      readNumberText(text, "fullScale");
    } catch (e) {
      expect((e as RheoError).code).toBe("AMBIGUOUS_NUMBER");
    }
  });

  test.each(["", "abc", "1,2,3", "1.2.3", "1,23.4"])("refuses %j as not a number", (text) => {
    expect(() => readNumberText(text, "x")).toThrow(/^x: expected a number/);
  });

  test("readQuantityText splits value and unit, space groups included", () => {
    expect(readQuantityText("15 mm", "x")).toEqual({ value: 15, unit: "mm" });
    expect(readQuantityText("0.03 1/K", "x")).toEqual({ value: 0.03, unit: "1/K" });
    expect(readQuantityText("1 234,5 bar", "x")).toEqual({ value: 1234.5, unit: "bar" });
    expect(readQuantityText("700bar", "x")).toEqual({ value: 700, unit: "bar" });
  });
});

describe("REDUCE_SETTINGS", () => {
  test("every setting has words, and every flag appears in the command-line table", () => {
    expect(Object.keys(REDUCE_SETTING_WORDS).sort()).toEqual(REDUCE_SETTINGS.map((s) => s.key).sort());
    const flags = reduceSettingFlags();
    for (const s of REDUCE_SETTINGS) {
      expect(REDUCE_SETTING_WORDS[s.key]?.label.length).toBeGreaterThan(2);
      if (s.flag) expect(flags[s.flag]?.value).toBe(s.kind.type !== "switch");
    }
    expect(new Set(REDUCE_SETTINGS.map((s) => s.flag).filter(Boolean)).size).toBe(REDUCE_SETTINGS.filter((s) => s.flag).length);
  });
});

describe("readReduceSettings(raw, source)", () => {
  test("the command line, the pane and a settings range give the same SI options", () => {
    const cli = readReduceSettings(
      { endCorrection: "orifice", transducer: "700 bar, 0.25 %", heating: "density=0.76 g/cm3, cp=2.3 kJ/(kg.K), k=0.25 W/(m.K)", barrelDiameter: "15 mm", rabinowitschMethod: "local", rabinowitschDegree: "2", rabinowitschWindow: "5" },
      CLI_SETTINGS_SOURCE,
    );
    const pane = readReduceSettings(
      { endCorrection: "Orifice", transducerFullScale: "700", transducerAccuracy: "0,25", heating: true, heatingDensity: "0.76", heatingHeatCapacity: "2,3", heatingConductivity: 0.25, barrelDiameter: 15, rabinowitschMethod: "local", rabinowitschDegree: 2, rabinowitschWindow: 5 },
      KEYED_SETTINGS_SOURCE,
    );
    expect(pane).toEqual(cli);
    expect(cli.options.transducer).toEqual({ fullScale: 7e7, accuracy: 0.0025 });
    expect(cli.input.barrelDiameter).toBeCloseTo(0.015, 15);
  });

  test("a dimensional value without a unit is refused on the command line unless --si", () => {
    expect(() => readReduceSettings({ barrelDiameter: "15" }, CLI_SETTINGS_SOURCE)).toThrow(/^--barrel-diameter: needs a unit, e.g. "15 mm"/);
    expect(readReduceSettings({ barrelDiameter: "0.015", si: true }, CLI_SETTINGS_SOURCE).input.barrelDiameter).toBe(0.015);
  });

  test("collects every error at once, each naming its setting", () => {
    const { errors } = collectReduceSettings({ endCorrection: "both", transducerFullScale: "1,000", heating: true, heatingDensity: "-1", nonsense: 1 }, KEYED_SETTINGS_SOURCE);
    const named = errors.map((e) => e.argument).sort();
    expect(named).toEqual(["endCorrection", "heatingConductivity", "heatingDensity", "heatingHeatCapacity", "nonsense", "transducerFullScale"].sort());
    expect(errors.find((e) => e.argument === "transducerFullScale")?.code).toBe("AMBIGUOUS_NUMBER");
  });

  test("contradictions and repeats are refused", () => {
    expect(() => readReduceSettings({ orifice: true, endCorrection: "none" }, CLI_SETTINGS_SOURCE)).toThrow(/^--orifice: contradicts --end-correction none/);
    expect(() => readReduceSettings({ transducer: "700 bar, 0.25 %", transducerFullScale: "500 bar" }, CLI_SETTINGS_SOURCE)).toThrow(/is given twice/);
    expect(() => readReduceSettings({ rabinowitschMethod: "local", rabinowitschDegree: "3" }, CLI_SETTINGS_SOURCE)).toThrow(/^--degree: must be a whole number from 1 to 2 for the local method/);
    expect(() => readReduceSettings({ shift: "wlf" }, CLI_SETTINGS_SOURCE)).toThrow(/^--tref: is required with --shift/);
    expect(readReduceSettings({ shift: "wlf" }, KEYED_SETTINGS_SOURCE).fits.shift).toEqual({ law: "wlf", referenceTemperature: null });
  });

  test("the command line refuses a flag given twice", async () => {
    let err = "";
    const code = await main(["reduce", "x.csv", "--density", "0.76 g/cm3", "--density", "0.8 g/cm3"], { readFile: () => "", stdout: () => undefined, stderr: (t) => (err += t) });
    expect(code).toBe(1);
    expect(err).toMatch(/--density: is given twice/);
  });
});

describe("RHEO.REDUCE settings argument", () => {
  // power law K = 1e4 Pa·s^n, n = 0.5 through two dies (L/D 10 and 20, e = 2): exact data
  const raw: unknown[][] = [["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]"]];
  for (const L of [10, 20]) {
    for (const rate of [10, 30, 100, 300]) {
      const tau = 1e4 * (rate * 0.875) ** 0.5; // wall rate (3n+1)/(4n)·γ̇_a = 1.25 γ̇_a for n = 0.5: here only the shape matters
      raw.push([1, L, (rate * Math.PI) / 32, (2 * tau * (2 * L + 2)) / 1e5]);
    }
  }

  test("a settings range adds reduce settings; a setting given twice is refused", () => {
    const out = reduceData(raw, "bagley", undefined, undefined, undefined, undefined, undefined, undefined, true, [["transducer", "700 bar, 0.25 %"]]);
    expect(out[0]?.[0]).toBe("temperature [C]");
    const twice = reduceData(raw, "bagley", undefined, undefined, undefined, undefined, undefined, undefined, false, [["endCorrection", "none"]]);
    expect((twice[0]?.[0] as { message: string }).message).toMatch(/^endCorrection: is given twice/);
    const fit = reduceData(raw, "bagley", undefined, undefined, undefined, undefined, undefined, undefined, false, [["model", "cross"]]);
    expect((fit[0]?.[0] as { message: string }).message).toMatch(/^settings model: RHEO.REDUCE spills the flow curve only/);
    // the fit settings added with the verdict, the fit across temperatures and the rotational join are refused the same way
    for (const [key, value] of [["material", "paste"], ["master", "cross-wlf"], ["rotational", "rot.csv"]]) {
      const out = reduceData(raw, "bagley", undefined, undefined, undefined, undefined, undefined, undefined, false, [[key, value]]);
      expect((out[0]?.[0] as { message: string }).message).toMatch(new RegExp(`^settings ${key}: RHEO.REDUCE spills the flow curve only`));
    }
  });
});
