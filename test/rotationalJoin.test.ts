/**
 * joinRotational / fitJoinedCurve / readRotationalTable: a rotational curve (steady η(γ̇), or
 * |η*|(ω) under the Cox–Merz rule, Cox & Merz, J. Polym. Sci. 28 (1958) 619) joined to the
 * capillary flow curve, the overlap check, and the fit of the joined curve.
 *
 * Reference values: scripts/scipy_master_fit_reference.py → test/fixtures/scipy-master-fits.json,
 * case "join" (scipy.optimize.least_squares on the joined points; invented data from a known
 * Carreau–Yasuda truth with 1 % log-normal noise, seeded).
 */
import reference from "./fixtures/scipy-master-fits.json";
import { joinRotational, DEFAULT_JOIN_OPTIONS } from "../src/core/rotationalJoin";
import { fitCurve } from "../src/core/flowCurveFits";
import { fitJoinedCurve } from "../src/core/joinedFit";
import { reduce, type Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { readRotationalTable } from "../src/io/rotationalTable";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

const J = reference.join;

function thrown(fn: () => unknown): RheoError {
  try {
    fn();
  } catch (e) {
    if (e instanceof RheoError) return e;
    throw e;
  }
  throw new Error("expected a RheoError");
}

describe("the Cox–Merz join pins down η0 where the capillary curve alone cannot", () => {
  const rotational = { kind: "oscillatory" as const, rate: J.rotational.angularFrequency, viscosity: J.rotational.complexViscosity };
  test("joined Carreau–Yasuda fit: η0 within 3 % of the generating 6000 Pa·s (issue 14), scipy's optimum to 1e-5", () => {
    const joined = joinRotational(J.capillary, rotational);
    const fits = fitCurve({ shearRate: joined.shearRate, viscosity: joined.viscosity }, { models: ["carreau-yasuda"] });
    const fit = fits.verdict.fit;
    expect(fit?.model).toBe("carreau-yasuda");
    // @check rotationalJoin | the Cox–Merz join's Carreau–Yasuda fit: 4 parameters as scipy finds them on the same joined points | scipy 1.10 least_squares (test/fixtures/scipy-master-fits.json, case join); Cox & Merz, J. Polym. Sci. 28 (1958) 619 | rel 1e-5 | 4
    expectClose(fit?.parameters.eta0 as number, J.truth.eta0, { rel: 0.03 }, "eta0 vs truth");
    for (const [name, v] of Object.entries(J.parameters)) expectClose(fit?.parameters[name] as number, v, { rel: 1e-5 }, `${name} vs scipy`);
    for (const [name, se] of Object.entries(J.standardErrors)) expectClose(fit?.standardErrors[name] as number, se, { rel: 1e-3 }, `SE ${name} vs scipy`);
    expect(fit?.determined.eta0).toBe(true);
  });
  test("the capillary points alone leave η0 undetermined (the onset lies below their rates)", () => {
    const alone = fitCurve(J.capillary, { models: ["carreau-yasuda"] });
    expect(alone.verdict.fit?.determined.eta0).toBe(false);
    expect(alone.verdict.fit?.undetermined.eta0?.bound).toEqual({ side: "lower", value: Math.max(...J.capillary.viscosity) });
  });
  test("overlap 20–30 1/s: the ratio is near 1, within the 15 % tolerance; Cox–Merz is recorded", () => {
    const joined = joinRotational(J.capillary, rotational);
    expect(joined.overlap).not.toBeNull();
    expectClose(joined.overlap?.shearRateMin as number, 20, { rel: 1e-12 });
    expectClose(joined.overlap?.shearRateMax as number, 30, { rel: 1e-12 });
    expectClose(joined.overlap?.ratio as number, 1, { abs: 0.03 });
    expect(joined.overlap?.withinTolerance).toBe(true);
    expect(joined.warnings.map((w) => w.code)).toEqual(["COX_MERZ_APPLIED"]);
    expect(joined.source.filter((s) => s === "rotational")).toHaveLength(J.rotational.angularFrequency.length);
    expect([...joined.shearRate].sort((a, b) => a - b)).toEqual(joined.shearRate);
  });
});

describe("joinRotational(capillary, rotational): the overlap check", () => {
  // A power law is a straight line in log–log, so log–log interpolation reproduces it exactly and
  // a rotational curve 1.3 times the capillary one gives the ratio 1.3 exactly.
  const law = (rates: number[], k = 1) => rates.map((g) => k * 1e4 * Math.pow(g, -0.6));
  const cap = { shearRate: [10, 30, 100, 300, 1000], viscosity: law([10, 30, 100, 300, 1000]) };
  test("a rotational curve 1.3× the capillary one: ratio 1.3, largest deviation 30 %, ROTATIONAL_OVERLAP_MISMATCH", () => {
    const rates = [1, 3, 10, 20, 40];
    const j = joinRotational(cap, { kind: "steady", rate: rates, viscosity: law(rates, 1.3) });
    // @check rotationalJoin | overlap ratio of a power law 1.3 times another: log–log interpolation exact on a straight line | Ostwald–de Waele power law (straight in log–log); Cox & Merz, J. Polym. Sci. 28 (1958) 619 | rel 1e-12 | 2
    expectClose(j.overlap?.ratio as number, 1.3, { rel: 1e-12 });
    expectClose(j.overlap?.maxDeviation as number, 0.3, { rel: 1e-12 });
    expect(j.overlap?.withinTolerance).toBe(false);
    expect(j.warnings.map((w) => w.code)).toEqual(["ROTATIONAL_OVERLAP_MISMATCH"]);
    expect(j.warnings[0]?.message).toMatch(/1\.3 times the capillary one/);
  });
  test("a 10 % offset passes the default 15 % tolerance and fails a 5 % one", () => {
    const rates = [1, 3, 10, 20];
    expect(DEFAULT_JOIN_OPTIONS.tolerance).toBe(0.15);
    expect(joinRotational(cap, { kind: "steady", rate: rates, viscosity: law(rates, 1.1) }).overlap?.withinTolerance).toBe(true);
    expect(joinRotational(cap, { kind: "steady", rate: rates, viscosity: law(rates, 1.1) }, { tolerance: 0.05 }).overlap?.withinTolerance).toBe(false);
  });
  test("curves that share no rate range: no ratio, ROTATIONAL_NO_OVERLAP naming the gap", () => {
    const rates = [0.1, 1, 5];
    const j = joinRotational(cap, { kind: "steady", rate: rates, viscosity: law(rates) });
    expect(j.overlap).toBeNull();
    expect(j.warnings[0]?.code).toBe("ROTATIONAL_NO_OVERLAP");
    expect(j.warnings[0]?.message).toMatch(/end at 5 1\/s and the capillary data start at 10 1\/s/);
  });
  test("bad data name the argument and row", () => {
    expect(thrown(() => joinRotational(cap, { kind: "steady", rate: [1, -2], viscosity: [5, 4] })).message).toBe("rotational.shearRate: row 2 must be greater than zero, got -2");
    expect(thrown(() => joinRotational(cap, { kind: "oscillatory", rate: [1, 2], viscosity: [5] })).message).toBe("rotational.complexViscosity: has 1 values but rotational.angularFrequency has 2");
    expect(thrown(() => joinRotational(cap, { kind: "creep" as never, rate: [1], viscosity: [5] })).argument).toBe("rotational.kind");
    expect(thrown(() => joinRotational(cap, { kind: "steady", rate: [1], viscosity: [5] }, { tolerance: 0 })).argument).toBe("tolerance");
  });
});

describe("fitJoinedCurve(result, rotational): the capillary groups at the rotational temperature", () => {
  // Newtonian 1000 Pa·s through dies of 1 mm, L = 10 and 20 mm, at two temperatures (Hagen–Poiseuille + Bagley e = 2).
  const measurements = (temperatures: number[]): Measurement[] =>
    temperatures.flatMap((T) =>
      [10e-3, 20e-3].flatMap((L) => [10, 30, 100, 300].map((rate) => ({ temperature: T, dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(rate, 1e-3), pressure: 2 * 1000 * rate * ((2 * L) / 1e-3 + 2) }))),
    );
  const rot = { kind: "steady" as const, rate: [0.1, 1, 10], viscosity: [1000, 1000, 1000] };
  test("joins the group of the matching temperature (within 1 K) and fits the joined curve", () => {
    const result = reduce(measurements([463.15, 483.15]));
    const j = fitJoinedCurve(result, { ...rot, temperature: 483.6 });
    expect(j.groups).toEqual(["210 °C, D 1 mm"]);
    expect(j.join.source.filter((s) => s === "capillary")).toHaveLength(4);
    expect(j.fits.verdict.recommended).toBe("newtonian");
    // @check joinedFit | the joined curve of a 1000 Pa·s Newtonian liquid (capillary by Hagen–Poiseuille with Bagley e = 2, rotational 1000 Pa·s) gives μ = 1000 Pa·s | Hagen–Poiseuille (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. (2002), ch. 2; from memory) | rel 1e-9 | 1
    expectClose(j.fits.verdict.fit?.parameters.mu as number, 1000, { rel: 1e-9 });
    expect(j.warnings.every((w) => w.scope === "rotational + capillary, 210.5 °C")).toBe(true);
  });
  test("a temperature no capillary group has, or none with several capillary temperatures, is refused", () => {
    const result = reduce(measurements([463.15, 483.15]));
    expect(thrown(() => fitJoinedCurve(result, { ...rot, temperature: 473.15 })).message).toBe("rotational: its temperature 200 °C matches no capillary temperature (190 °C, 210 °C) within 1 K");
    expect(thrown(() => fitJoinedCurve(result, rot)).message).toMatch(/^rotational: the capillary data hold 2 temperatures \(190 °C, 210 °C\); add a "temperature \[C\]" column/);
    expect(fitJoinedCurve(reduce(measurements([463.15])), rot).groups).toEqual(["190 °C, D 1 mm"]);
  });
});

describe("readRotationalTable(cells): the rotational file", () => {
  test("oscillatory columns in rad/s and Pa.s, one temperature", () => {
    const t = readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]", "temperature [C]", "G' [Pa]"], [0.1, 5200, 210, 1], ["1", "4800", "210", 2], [null, null, null, null]]);
    expect(t.curve).toEqual({ kind: "oscillatory", rate: [0.1, 1], viscosity: [5200, 4800], temperature: 483.15 });
    expect(t.warnings.map((w) => w.code)).toEqual(["COLUMN_IGNORED"]);
  });
  test("a frequency in Hz is ω = 2π·f rad/s; viscosity in mPa.s is converted", () => {
    const t = readRotationalTable([["angular_frequency [Hz]", "complex_viscosity [mPa.s]"], [1, 2000]]);
    expectClose(t.curve.rate[0] as number, 2 * Math.PI, { rel: 1e-15 });
    expectClose(t.curve.viscosity[0] as number, 2, { rel: 1e-15 });
  });
  test("steady shear columns give a steady curve; a partly blank row is skipped with a warning", () => {
    const t = readRotationalTable([["shear_rate [1/s]", "viscosity [Pa.s]"], [0.5, 900], [1, ""], [2, 850]], { rowWord: "line", argument: "--rotational" });
    expect(t.curve).toEqual({ kind: "steady", rate: [0.5, 2], viscosity: [900, 850] });
    expect(t.warnings[0]?.message).toBe("--rotational: line 3 skipped: blank viscosity.");
  });
  test("one decimal mark for the whole table: \"3.547\" follows the table's decimal point, \"3,547\" its decimal comma", () => {
    // "0.01" can only be a decimal point; "0,01" only a decimal comma: each decides its table
    const point = readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], ["0.01", "5856.6"], ["3.547", "2658"]]);
    expect(point.curve.rate).toEqual([0.01, 3.547]);
    const comma = readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], ["3,547", "2658"], ["0,01", "5856,6"]]);
    expect(comma.curve.rate).toEqual([3.547, 0.01]);
    expect(comma.curve.viscosity).toEqual([2658, 5856.6]);
    // nothing decides: refused naming both readings, unless the caller knows the mark (a comma-separated file)
    const only = [["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], ["3.547", "2658"]];
    expect(thrown(() => readRotationalTable(only, { rowWord: "line", argument: "--rotational" })).message).toMatch(/^--rotational angular_frequency \[rad\/s\] \(column 1\): line 2 "3\.547" could be 3\.547 \(decimal point\) or 3547/);
    expect(readRotationalTable(only, { decimalMark: "." }).curve.rate).toEqual([3.547]);
  });
  test("errors name the argument, the column and the line", () => {
    const arg = { rowWord: "line" as const, argument: "--rotational" };
    expect(thrown(() => readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], [0.1, "n/a"]], arg)).message).toBe(
      '--rotational complex_viscosity [Pa.s] (column 2): line 2 is text "n/a", not a number',
    );
    expect(thrown(() => readRotationalTable([["angular_frequency [rad/s]", "complex_viscosity [Pa.s]"], [0, 10]], arg)).message).toBe(
      "--rotational angular_frequency [rad/s] (column 1): line 2 must be greater than zero, got 0",
    );
    expect(thrown(() => readRotationalTable([["angular_frequency [rpm]", "complex_viscosity [Pa.s]"]], arg)).message).toMatch(/^--rotational column 1: "angular_frequency \[rpm\]": unknown angularFrequency unit "rpm"; accepted: rad\/s/);
    expect(thrown(() => readRotationalTable([["shear_rate [1/s]", "complex_viscosity [Pa.s]"]], arg)).message).toMatch(/holds both an oscillatory pair/);
    expect(thrown(() => readRotationalTable([["angular_frequency [rad/s]"], [1]], arg)).message).toBe('--rotational: has "angular_frequency [rad/s]" but no "complex_viscosity [unit]" column');
    expect(thrown(() => readRotationalTable([["shear_rate [1/s]", "viscosity [Pa.s]"]], arg)).message).toBe("--rotational: has no data rows");
    expect(thrown(() => readRotationalTable([["shear_rate [1/s]", "viscosity [Pa.s]", "temperature [C]"], [1, 2, 190], [2, 2, 210]], arg)).message).toMatch(/holds several temperatures \(190 °C, 210 °C\)/);
  });
});
