/**
 * The fitting RHEO functions (FIT, MODEL, COMPAREFITS, SHIFT, SHIFTFIT) called as Excel calls
 * them: 2-D arrays, blanks as null or "", numbers as text, omitted arguments as null.
 */
import * as sheet from "../src/functions/fitting";
import { fitSpill, FIT_HEADER, COMPARE_HEADER } from "../src/functions/fitTables";
import { defaultModels, fitCurve } from "../src/core/flowCurveFits";
import { fitModel } from "../src/core/fit";
import { getModel, MODEL_IDS } from "../src/core/models";
import { fitArrheniusShift } from "../src/core/temperature";
import reference from "./fixtures/scipy-fits.json";
import { expectClose } from "./helpers/expectClose";
import { FakeCustomFunctionError, cell, col, errorOf, installOfficeRuntime, num, row, valuesOf } from "./helpers/sheet";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

interface ReferenceCase {
  name: string;
  model: string;
  fixed: Record<string, number>;
  data: { shearRate: number[]; viscosity: number[] };
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
}
const CASES = reference.cases as unknown as ReferenceCase[];
const scipyCase = (model: string) => CASES.find((c) => c.model === model) as ReferenceCase;
const tQuantile = (p: number, dof: number) => (reference.tQuantiles.find((q) => q.p === p && q.dof === dof) as { t: number }).t;

/** The row of a FIT spill whose first cell is `label`. */
function line(spill: unknown[][], label: string): unknown[] {
  const found = spill.find((r) => r[0] === label);
  if (!found) throw new Error(`no row "${label}" in ${JSON.stringify(spill.map((r) => r[0]))}`);
  return found;
}

const rates = (lo: number, hi: number, count: number) => Array.from({ length: count }, (_, i) => lo * Math.pow(hi / lo, i / (count - 1)));

describe("RHEO.FIT(shearRate, viscosity, model, ...)", () => {
  // Closed form: a constant fitted by least squares is the mean; its standard error s/√n with
  // s the sample standard deviation (n − 1); CI mean ± t(0.975, n − 1)·SE. Values evaluated with
  // Python's statistics module; t = scipy.stats.t.ppf(0.975, 4) from the committed fixture.
  const etaN = [10.2, 9.7, 10.5, 9.9, 10.1];
  test("newtonian, linear residuals: μ = arithmetic mean 10.08, SE = s/√n = 0.135647, 95 % CI μ·exp(±t(0.975, 4)·SE/μ)", () => {
    const out = sheet.fit(col(1, 2, 5, 10, 20), col(...etaN), "newtonian", null as never, "linear");
    const mu = line(out, "mu");
    expectClose(num(mu[1]), 10.08, { rel: 1e-9 });
    expectClose(num(mu[2]), 0.1356465996625054, { rel: 1e-6 });
    const t = tQuantile(0.975, 4);
    // interval in ln μ (delta method: SE(ln μ) = SE/μ; Bates & Watts 1988 §3.5)
    expectClose(num(mu[3]), 10.08 * Math.exp((-t * 0.1356465996625054) / 10.08), { rel: 1e-6 });
    expectClose(num(mu[4]), 10.08 * Math.exp((t * 0.1356465996625054) / 10.08), { rel: 1e-6 });
    expect(mu[5]).toBe("Pa.s");
    expect(line(out, "RMSE")[5]).toBe("Pa.s");
  });
  test("newtonian, log residuals (default): μ = geometric mean 10.076357, SE = μ·s(ln η)/√n = 0.135397", () => {
    const out = sheet.fit(col(1, 2, 5, 10, 20), col(...etaN), "newtonian");
    expectClose(num(line(out, "mu")[1]), 10.07635720355219, { rel: 1e-9 });
    expectClose(num(line(out, "mu")[2]), 0.13539668321745466, { rel: 1e-6 });
    expect(line(out, "RMSE")[5]).toBe("-");
  });

  // Source: scripts/scipy_fit_reference.py → test/fixtures/scipy-fits.json (scipy.optimize.least_squares).
  test("power law on the scipy reference data: same K, n to 1e-5 and standard errors to 1e-3; table layout", () => {
    const c = scipyCase("power-law");
    const out = sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "power-law", null as never, null as never, null as never, null as never, null as never, null as never, true);
    expect(out[0]).toEqual([...FIT_HEADER]);
    expect(out.map((r) => r[0])).toEqual(["parameter", "K", "n", "R²", "RMSE", "AIC", "points", "converged", "stop reason", "well determined", "rate min", "rate max"]);
    expect(line(out, "well determined")[1]).toBe(true);
    expect([line(out, "rate min")[1], line(out, "rate max")[1]]).toEqual([Math.min(...c.data.shearRate), Math.max(...c.data.shearRate)]);
    out.forEach((r) => expect(r).toHaveLength(6));
    for (const name of ["K", "n"]) {
      expectClose(num(line(out, name)[1]), c.parameters[name] as number, { rel: 1e-5 }, name);
      expectClose(num(line(out, name)[2]), c.standardErrors[name] as number, { rel: 1e-3 }, `SE ${name}`);
    }
    expect(line(out, "K")[5]).toBe("Pa.s^n");
    expect(line(out, "n")[5]).toBe("-");
    expect(line(out, "points")[1]).toBe(20);
    expect(line(out, "converged")[1]).toBe(true);
    expect(typeof line(out, "stop reason")[1]).toBe("string");
  });
  test('Carreau–Yasuda with fixed "etaInf=0" matches scipy; the fixed row says "fixed"', () => {
    const c = scipyCase("carreau-yasuda");
    const out = sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "Carreau-Yasuda", cell("etaInf=0"));
    for (const [name, value] of Object.entries(c.parameters)) expectClose(num(line(out, name)[1]), value, { rel: 1e-5 }, name);
    expect(line(out, "etaInf").slice(1)).toEqual([0, "fixed", "", "", "Pa.s"]);
    // the same held value given as a two-column range
    const byRange = sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "carreau-yasuda", [["etaInf", 0]]);
    expect(byRange).toEqual(out);
  });
  test("rows work like columns; blank rows are skipped; numbers as text are read; units convert to SI", () => {
    const g = rates(1, 1000, 8);
    const etaPas = g.map((x) => 5e3 * Math.pow(x, 0.4 - 1) * (1 + 1e-3 * Math.sin(7 * x)));
    const base = sheet.fit(col(...g), col(...etaPas), "power-law");
    const asRow = sheet.fit(row(...g), row(...etaPas), "power-law");
    expect(asRow).toEqual(base);
    const withBlanks = sheet.fit(col(...g, null, ""), col(...etaPas.map((v) => v * 1e3), 5, 6), "power-law", null as never, null as never, null as never, null as never, "mPa.s");
    expectClose(num(line(withBlanks, "K")[1]), num(line(base, "K")[1]), { rel: 1e-9 });
    const asText = sheet.fit(col(...g.map(String)), col(...etaPas.map((v) => ` ${v} `)), "power-law");
    expectClose(num(line(asText, "n")[1]), num(line(base, "n")[1]), { rel: 1e-12 });
  });
  test("weights of 0 leave points out (the fit equals the fit without them)", () => {
    const g = rates(1, 1000, 8);
    const eta = g.map((x) => 5e3 * Math.pow(x, -0.6) * (1 + 0.01 * Math.cos(3 * x)));
    const outlier = [...eta];
    outlier[3] = (outlier[3] as number) * 3;
    const weighted = sheet.fit(col(...g), col(...outlier), "power-law", null as never, null as never, col(1, 1, 1, 0, 1, 1, 1, 1));
    const without = sheet.fit(col(...g.filter((_, i) => i !== 3)), col(...eta.filter((_, i) => i !== 3)), "power-law");
    expectClose(num(line(weighted, "K")[1]), num(line(without, "K")[1]), { rel: 1e-9 });
  });
  test("cross-wlf takes a temperature per point (°C by default) and matches the core fit in K", () => {
    const c = scipyCase("cross-wlf") as ReferenceCase & { data: { temperature: number[] } };
    const tempsC = c.data.temperature.map((t) => t - 273.15);
    const out = sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "cross-wlf", null as never, null as never, null as never, col(...tempsC));
    const core = fitModel("cross-wlf", c.data);
    for (const spec of getModel("cross-wlf").parameters) expectClose(num(line(out, spec.name)[1]), core.parameters[spec.name] as number, { rel: 1e-9 }, spec.name);
    expect(line(out, "A2")[2]).toBe("fixed");
  });
  test("exact data: AIC is #NUM! with the reason (−∞), the parameters are exact", () => {
    const g = [0.1, 1, 10, 100];
    const out = sheet.fit(col(...g), col(...g.map((x) => 1e4 * Math.pow(x, -0.6))), "power-law");
    expectClose(num(line(out, "K")[1]), 1e4, { rel: 1e-9 });
    const aic = line(out, "AIC")[1] as FakeCustomFunctionError;
    expect(aic).toBeInstanceOf(FakeCustomFunctionError);
    expect([aic.code, aic.message]).toEqual(["#NUM!", expect.stringContaining("zero residuals")]);
  });
  test("a fit that stops before converging still spills: converged FALSE, the stop reason, a NOT_CONVERGED warning row", () => {
    const c = scipyCase("carreau-yasuda");
    const fit = fitModel("carreau-yasuda", c.data, { maxIterations: 2 });
    expect(fit.converged).toBe(false);
    const out = fitSpill(getModel("carreau-yasuda"), fit, false);
    expect(line(out, "converged")[1]).toBe(false);
    expect(line(out, "stop reason")[1]).toBe("max-iterations");
    expect(out.filter((r) => r[0] === "warning").map((r) => r[1])).toContain("NOT_CONVERGED");
    // RHEO.MODEL refuses such parameters
    const e = errorOf(sheet.modelViscosity("carreau-yasuda", out, cell(1)));
    expect(e).toEqual({ code: "#VALUE!", message: expect.stringMatching(/^parameters: row \d+: comes from a fit that did not converge/) });
  });

  const g = col(1, 10, 100, 1000);
  const eta = col(900, 400, 160, 60);
  const errors: [string, () => unknown[][], string, RegExp][] = [
    ["unknown model lists the accepted ids", () => sheet.fit(g, eta, "carreau-yasudda"), "#VALUE!", new RegExp(`^model: unknown model "carreau-yasudda"; accepted: ${MODEL_IDS.join(", ")}$`)],
    ["blank model", () => sheet.fit(g, eta, ""), "#N/A", /^model: is required; accepted: newtonian, power-law/],
    ["too few points for the free parameters", () => sheet.fit(col(1, 10, 100), col(900, 400, 160), "carreau"), "#N/A", /^shearRate: 3 points with positive weight cannot determine 4 free parameters of carreau; at least 5 are needed$/],
    ["text in viscosity names the row", () => sheet.fit(g, col(900, "n/a", 160, 60), "power-law"), "#VALUE!", /^viscosity: row 2 is text "n\/a"$/],
    ["a logical value", () => sheet.fit(g, col(900, true, 160, 60), "power-law"), "#VALUE!", /^viscosity: row 2 is the logical value TRUE, not a number$/],
    ["a non-positive viscosity names the row in the range (blank rows counted)", () => sheet.fit(col(1, null, 10, 100, 1000), col(900, 1, 400, -160, 60), "power-law"), "#NUM!", /^viscosity: row 4 must be greater than zero/],
    ["unequal lengths", () => sheet.fit(g, col(900, 400, 160), "power-law"), "#VALUE!", /^viscosity: has 3 cells but shearRate has 4/],
    ["unknown parameter in fixed", () => sheet.fit(g, eta, "carreau", cell("eta_inf=0")), "#VALUE!", /^fixed\.eta_inf: unknown parameter "eta_inf" for carreau; accepted: eta0, etaInf, lambda, n$/],
    ["malformed fixed text", () => sheet.fit(g, eta, "carreau", cell("etaInf 0=")), "#VALUE!", /^fixed: expected name=value pairs/],
    ["fixed value outside the bounds", () => sheet.fit(g, eta, "carreau", cell("n=-1")), "#NUM!", /^fixed\.n: must be greater than 0 for carreau, got -1$/],
    ["fixed holding every parameter", () => sheet.fit(g, eta, "power-law", cell("K=1000, n=0.5")), "#VALUE!", /^options\.fixed: holds every parameter of power-law/],
    ["unknown residual space", () => sheet.fit(g, eta, "power-law", null as never, "relative"), "#VALUE!", /^residuals: unknown choice "relative"; accepted: log, linear$/],
    ["unknown viscosity unit", () => sheet.fit(g, eta, "power-law", null as never, null as never, null as never, null as never, "cps"), "#VALUE!", /^viscosityUnit: unknown viscosity unit "cps"; accepted: Pa\.s/],
    ["cross-wlf without temperature", () => sheet.fit(g, eta, "cross-wlf"), "#N/A", /^temperature: cross-wlf needs one temperature \(K\) per point$/],
    ["negative weight", () => sheet.fit(g, eta, "power-law", null as never, null as never, col(1, -1, 1, 1)), "#NUM!", /^weights: row 2 must not be negative, got -1$/],
    ["header not a switch", () => sheet.fit(g, eta, "power-law", null as never, null as never, null as never, null as never, null as never, null as never, "yes" as never), "#VALUE!", /^header: must be TRUE or FALSE, got "yes"$/],
  ];
  for (const [name, call, code, message] of errors) {
    test(`error: ${name} → ${code}`, () => {
      expect(errorOf(call())).toEqual({ code, message: expect.stringMatching(message) });
    });
  }
});

describe("RHEO.MODEL(model, parameters, shearRate, ...)", () => {
  test("power law K·γ̇^(n−1) from text parameters (closed form: 1e4·10^−0.6 = 2511.886 Pa·s), aligned, blanks kept", () => {
    const out = sheet.modelViscosity("power-law", cell("K=1e4, n=0.4"), col(1, null, 10));
    expect(valuesOf(out)).toEqual([expect.any(Number), "", expect.any(Number)]);
    expectClose(num(out[0]?.[0]), 1e4, { rel: 1e-12 });
    expectClose(num(out[2]?.[0]), 2511.886431509580, { rel: 1e-12 });
    const inMilli = sheet.modelViscosity("power-law", [["K", 1e4], ["n", "0.4"]], row(1, 10), null as never, "mPa.s");
    expect(inMilli).toHaveLength(1);
    expectClose(num(inMilli[0]?.[0]), 1e7, { rel: 1e-12 });
  });
  test("reads the RHEO.FIT spill itself (header and statistic rows skipped) and reproduces the fitted curve", () => {
    const c = scipyCase("power-law");
    const spill = sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "power-law", null as never, null as never, null as never, null as never, null as never, null as never, true);
    const out = valuesOf(sheet.modelViscosity("power-law", spill, col(1, 100)));
    const K = c.parameters.K as number;
    const n = c.parameters.n as number;
    expectClose(out[0] as number, K, { rel: 1e-5 });
    expectClose(out[1] as number, K * Math.pow(100, n - 1), { rel: 1e-4 });
  });
  test("cross-wlf with a temperature per rate (°C) equals the core evaluated in K", () => {
    const p = { D1: 1e12, A1: 28, A2: 51.6, Tstar: 373.15, tauStar: 3e4, n: 0.3 };
    const params = Object.entries(p).map(([k, v]) => [k, v]);
    const out = valuesOf(sheet.modelViscosity("cross-wlf", params, col(10, 100), col(200, 220)));
    const viaK = valuesOf(sheet.modelViscosity("cross-wlf", params, col(10, 100), col(473.15, 493.15), null as never, "K"));
    expect(out).toEqual(viaK);
    expect(out[0] as number).toBeGreaterThan(out[1] as number);
  });
  const errors: [string, () => unknown[][], string, RegExp][] = [
    ["missing parameter lists the needed ones", () => sheet.modelViscosity("carreau", cell("eta0=1000, lambda=1"), cell(1)), "#N/A", /^parameters: carreau needs eta0, etaInf, lambda, n; missing: etaInf, n$/],
    ["unknown parameter", () => sheet.modelViscosity("power-law", cell("K=1, n=0.5, m=2"), cell(1)), "#VALUE!", /^parameters: unknown parameter "m" for power-law; accepted: K, n$/],
    ["blank parameters", () => sheet.modelViscosity("power-law", cell(null), cell(1)), "#N/A", /^parameters: is required: K, n \(SI\)/],
    ["a one-column range of names", () => sheet.modelViscosity("power-law", col("K", "n"), cell(1)), "#VALUE!", /^parameters: must have two columns/],
    ["a name without a value", () => sheet.modelViscosity("power-law", [["K", 1], ["n", null]], cell(1)), "#N/A", /^parameters: row 2: n has no value$/],
    ["temperature for an isothermal model", () => sheet.modelViscosity("power-law", cell("K=1, n=0.5"), cell(1), cell(200)), "#VALUE!", /^temperature: power-law does not depend on temperature/],
    ["non-positive rate names the row", () => sheet.modelViscosity("power-law", cell("K=1, n=0.5"), col(1, 0)), "#NUM!", /^shearRate: row 2 must be greater than zero, got 0$/],
    ["unknown model", () => sheet.modelViscosity("ostwald", cell("K=1, n=0.5"), cell(1)), "#VALUE!", /^model: unknown model "ostwald"; accepted: /],
  ];
  for (const [name, call, code, message] of errors) {
    test(`error: ${name} → ${code}`, () => {
      expect(errorOf(call())).toEqual({ code, message: expect.stringMatching(message) });
    });
  }
});

describe("RHEO.COMPAREFITS(shearRate, viscosity, models, ...)", () => {
  const c = scipyCase("carreau-yasuda");
  test("Carreau–Yasuda data: carreau-yasuda ranks first; ΔAIC 0 for the best; weights sum to 1; same AIC as RHEO.FIT with a melt's η∞ = 0", () => {
    const out = sheet.compareFits(col(...c.data.shearRate), col(...c.data.viscosity), col("power-law", "carreau-yasuda", "cross"), null as never, null as never, null as never, true);
    expect(out[0]).toEqual([...COMPARE_HEADER]);
    const body = out.slice(1);
    expect(body.map((r) => r[1])).toContain("carreau-yasuda");
    expect(body[0]?.slice(0, 2)).toEqual([1, "carreau-yasuda"]);
    expect(body[0]?.[3]).toBe(0);
    expectClose(body.reduce((s, r) => s + num(r[4]), 0), 1, { rel: 1e-12 });
    // a melt (the default material) holds η∞ at 0 in the plateau models (src/core/flowCurveFits.ts)
    const fitAic = num(line(sheet.fit(col(...c.data.shearRate), col(...c.data.viscosity), "carreau-yasuda", cell("etaInf=0")), "AIC")[1]);
    expectClose(num(body[0]?.[2]), fitAic, { rel: 1e-9 });
    // Burnham & Anderson (2002), ch. 2 (from memory): w_i = exp(−ΔAIC_i/2)/Σ exp(−ΔAIC_j/2)
    const deltas = body.map((r) => num(r[3]));
    const total = deltas.reduce((s, d) => s + Math.exp(-d / 2), 0);
    body.forEach((r, i) => expectClose(num(r[4]), Math.exp(-(deltas[i] as number) / 2) / total, { rel: 1e-9 }));
  });
  test("models as text; models that cannot be fitted are listed last with converged FALSE and the reason", () => {
    const out = sheet.compareFits(col(1, 10, 100, 1000), col(900, 420, 150, 61), cell("power-law, carreau-yasuda"));
    expect(out.map((r) => r[1])).toEqual(["power-law", "carreau-yasuda"]);
    expect(out[1]?.[0]).toBe("");
    expect(out[1]?.[7]).toBe(false);
    // a melt holds η∞ = 0, which leaves four free parameters of Carreau–Yasuda for four points
    expect(out[1]?.[8]).toMatch(/4 points with positive weight cannot determine 4 free parameters of carreau-yasuda/);
  });
  test("blank models: the core's one default list of the material (melt: no yield stress; paste: with it)", () => {
    const melt = sheet.compareFits(col(...c.data.shearRate), col(...c.data.viscosity), null as never);
    expect(new Set(melt.map((r) => r[1]))).toEqual(new Set(defaultModels("melt")));
    const paste = sheet.compareFits(col(...c.data.shearRate), col(...c.data.viscosity), null as never, null as never, null as never, null as never, null as never, "paste");
    expect(new Set(paste.map((r) => r[1]))).toEqual(new Set(defaultModels("paste")));
    expect(defaultModels("paste")).toEqual(expect.arrayContaining(["bingham", "herschel-bulkley", "casson"]));
  });
  test("exactly one row is recommended, the core verdict's model, its note giving the reason", () => {
    const out = sheet.compareFits(col(...c.data.shearRate), col(...c.data.viscosity), null as never, null as never, null as never, null as never, true);
    const body = out.slice(1);
    const recommended = body.filter((r) => r[10] === true);
    expect(recommended).toHaveLength(1);
    const verdict = fitCurve(c.data, {}).verdict;
    expect(recommended[0]?.[1]).toBe(verdict.recommended);
    expect(recommended[0]?.[9]).toBe(verdict.status === "well-determined");
    expect(String(recommended[0]?.[8])).toContain(verdict.reason);
  });
  const errors: [string, () => unknown[][], string, RegExp][] = [
    ["unknown model in the list", () => sheet.compareFits(col(1, 10, 100), col(3, 2, 1), cell("cross, karo")), "#VALUE!", /^models: unknown model "karo"; accepted: newtonian/],
    ["a number among the models", () => sheet.compareFits(col(1, 10, 100), col(3, 2, 1), row("cross", 4)), "#VALUE!", /^models: must hold model names, got 4/],
    ["no model can be fitted", () => sheet.compareFits(col(1, 10), col(3, 2), cell("carreau, cross")), "#N/A", /^models: no model gave a converged fit: carreau: shearRate: 2 points/],
    ["bad data fail once", () => sheet.compareFits(col(1, 10, 100), col(3, "x", 1), cell("cross")), "#VALUE!", /^viscosity: row 2 is text "x"$/],
  ];
  for (const [name, call, code, message] of errors) {
    test(`error: ${name} → ${code}`, () => {
      expect(errorOf(call())).toEqual({ code, message: expect.stringMatching(message) });
    });
  }
});

describe("RHEO.SHIFT(temperature, referenceTemperature, law, activationEnergyOrC1, ...)", () => {
  // Closed forms evaluated with Python's math module: Arrhenius a_T = exp[(Ea/R)(1/T − 1/Tref)],
  // R = 8.314462618 J/(mol·K) (CODATA 2018); WLF log10 a_T = −C1(T − Tref)/(C2 + T − Tref)
  // (Williams, Landel & Ferry 1955).
  test("Arrhenius, Ea = 55 kJ/mol, Tref 210 °C: a_T(190 °C) = 1.806205, a_T(230 °C) = 0.580291", () => {
    const out = valuesOf(sheet.shift(col(190, 210, 230), cell(210), "arrhenius", cell(55), null as never, null as never, "kJ/mol"));
    expectClose(out[0] as number, 1.8062047153911625, { rel: 1e-12 });
    expect(out[1]).toBe(1);
    expectClose(out[2] as number, 0.5802909341059188, { rel: 1e-12 });
    const inK = valuesOf(sheet.shift(row(463.15, 503.15), cell(483.15), "Arrhenius", cell(55000), null as never, "K"));
    expectClose(inK[0] as number, 1.8062047153911625, { rel: 1e-12 });
  });
  test("WLF with the universal constants (C2 default 51.6 K): T − Tref = 10 K gives 10^(−17.44·10/61.6) = 1.475133e-3", () => {
    expectClose(num(sheet.shift(cell(110), cell(100), "wlf", cell(17.44))[0]?.[0]), 0.0014751329666105512, { rel: 1e-12 });
    expectClose(num(sheet.shift(cell(120), cell(100), "WLF", cell(8.86), cell(101.6))[0]?.[0]), 0.03489499640301401, { rel: 1e-12 });
  });
  const errors: [string, () => unknown[][], string, RegExp][] = [
    ["unknown law", () => sheet.shift(cell(200), cell(210), "eyring", cell(1)), "#VALUE!", /^law: unknown choice "eyring"; accepted: arrhenius, wlf$/],
    ["blank law", () => sheet.shift(cell(200), cell(210), "", cell(1)), "#N/A", /^law: is required; accepted: arrhenius, wlf$/],
    ["C2 with arrhenius", () => sheet.shift(cell(200), cell(210), "arrhenius", cell(5e4), cell(51.6)), "#VALUE!", /^C2: belongs to the wlf law/],
    ["energy unit with wlf", () => sheet.shift(cell(200), cell(210), "wlf", cell(17.44), null as never, null as never, "kJ/mol"), "#VALUE!", /^energyUnit: belongs to the arrhenius law/],
    ["WLF below Tref − C2 (the law diverges)", () => sheet.shift(col(200, 100), cell(210), "wlf", cell(17.44)), "#NUM!", /^temperature: row 2 must satisfy C2 \+ T − Tref > 0/],
    ["text temperature", () => sheet.shift(col(200, "hot"), cell(210), "arrhenius", cell(5e4)), "#VALUE!", /^temperature: row 2 is text "hot"$/],
    ["below absolute zero", () => sheet.shift(cell(-300), cell(210), "arrhenius", cell(5e4)), "#NUM!", /^temperature: /],
  ];
  for (const [name, call, code, message] of errors) {
    test(`error: ${name} → ${code}`, () => {
      expect(errorOf(call())).toEqual({ code, message: expect.stringMatching(message) });
    });
  }
});

describe("RHEO.SHIFTFIT(temperature, shearRate, viscosity, referenceTemperature, ...)", () => {
  /**
   * Exact superposed data on a power-law master curve, η = a_T·K·(a_T·γ̇)^(n−1): the shift fit's
   * polynomial describes it exactly, so the generating Ea = 60 kJ/mol (invented) is recovered to
   * rounding (Dealy & Wang, Melt Rheology (2013), time–temperature superposition, from memory).
   */
  function superposed(law: (T: number) => number) {
    const T: number[] = [];
    const g: number[] = [];
    const eta: number[] = [];
    for (const tc of [180, 200, 220]) {
      const aT = law(tc + 273.15);
      for (const rate of rates(5, 5000, 7)) {
        T.push(tc);
        g.push(rate);
        eta.push(aT * 8e3 * Math.pow(aT * rate, 0.35 - 1));
      }
    }
    return { T, g, eta };
  }
  const R = 8.314462618;
  test("Arrhenius: Ea = 60 kJ/mol recovered, a_T at each temperature, Tref echoed in °C", () => {
    const Ea = 60e3;
    const d = superposed((T) => Math.exp((Ea / R) * (1 / T - 1 / 473.15)));
    const out = sheet.shiftFit(col(...d.T), col(...d.g), col(...d.eta), cell(200));
    expect(out[0]?.[0]).toBe("Ea");
    expectClose(num(out[0]?.[1]), Ea, { rel: 1e-6 });
    expect(out[0]?.[3]).toBe("J/mol");
    expect(line(out, "Tref")[1]).toBe(200);
    expect(line(out, "converged")[1]).toBe(true);
    const block = out.slice(out.findIndex((r) => r[0] === "temperature [C]") + 1);
    expect(block.map((r) => r[0])).toEqual([180, 200, 220]);
    expectClose(num(block[1]?.[1]), 1, { rel: 1e-9 });
    expectClose(num(block[0]?.[1]), Math.exp((Ea / R) * (1 / 453.15 - 1 / 473.15)), { rel: 1e-6 });
    // same as the core on the same curves
    const core = fitArrheniusShift(
      [180, 200, 220].map((tc) => ({ temperature: tc + 273.15, shearRate: d.g.filter((_, i) => d.T[i] === tc), viscosity: d.eta.filter((_, i) => d.T[i] === tc) })),
      473.15,
    );
    expectClose(num(out[0]?.[1]), core.activationEnergy, { rel: 1e-12 });
  });
  test("WLF: C1 = 8.86, C2 = 101.6 K (invented melt above Tg) recovered from three temperatures", () => {
    const d = superposed((T) => Math.pow(10, (-8.86 * (T - 473.15)) / (101.6 + T - 473.15)));
    const out = sheet.shiftFit(col(...d.T), col(...d.g), col(...d.eta), cell(200), "wlf");
    expectClose(num(line(out, "C1")[1]), 8.86, { rel: 1e-5 });
    expectClose(num(line(out, "C2")[1]), 101.6, { rel: 1e-5 });
  });
  test("error: one temperature only → #N/A", () => {
    const out = sheet.shiftFit(col(200, 200, 200, 200, 200, 200), col(1, 2, 5, 10, 20, 50), col(900, 800, 600, 400, 300, 200), cell(200));
    expect(errorOf(out)).toEqual({ code: "#N/A", message: "temperature: needs points at two or more temperatures; every row is at 200 C" });
  });
  test("error: a non-positive viscosity names the row → #NUM!", () => {
    const out = sheet.shiftFit(col(200, 220), col(1, 2), col(900, 0), cell(200));
    expect(errorOf(out)).toEqual({ code: "#NUM!", message: "viscosity: row 2 must be greater than zero, got 0" });
  });
});
