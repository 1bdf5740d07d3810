/**
 * RHEO.MASTERFIT(temperature, shearRate, viscosity, model, law, referenceTemperature, ...) called
 * as Excel calls it, and RHEO.MODEL reading its spill.
 *
 * Reference values: scripts/scipy_master_fit_reference.py → test/fixtures/scipy-master-fits.json
 * (scipy.optimize.least_squares on the same points; invented data from a known truth, seeded).
 */
import * as sheet from "../src/functions/fitting";
import { MASTER_HEADER } from "../src/functions/fitTables";
import { evaluateModel } from "../src/core/models";
import reference from "./fixtures/scipy-master-fits.json";
import { expectClose } from "./helpers/expectClose";
import { cell, col, errorOf, installOfficeRuntime, num, valuesOf } from "./helpers/sheet";

let uninstall: () => void;
beforeAll(() => {
  uninstall = installOfficeRuntime();
});
afterAll(() => uninstall());

interface MasterCase {
  model: string;
  law: string;
  referenceTemperature: number | null;
  data: { temperature: number[]; shearRate: number[]; viscosity: number[] };
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
}
const CASES = reference.masterCases as unknown as MasterCase[];
const cy = CASES[0] as MasterCase;
const cw = CASES.find((c) => c.model === "cross-wlf") as MasterCase;

function line(spill: unknown[][], label: string): unknown[] {
  const found = spill.find((r) => r[0] === label);
  if (!found) throw new Error(`no row "${label}" in ${JSON.stringify(spill.map((r) => r[0]))}`);
  return found;
}


describe("RHEO.MASTERFIT", () => {
  test("Carreau–Yasuda × Arrhenius in kelvin: scipy's optimum and standard errors, Ea in J/mol, aT block", () => {
    const out = sheet.masterFit(col(...cy.data.temperature), col(...cy.data.shearRate), col(...cy.data.viscosity), "carreau-yasuda", "arrhenius", cell(473.15), null as never, null as never, "K");
    for (const [name, v] of Object.entries(cy.parameters)) expectClose(num(line(out, name)[1]), v, { rel: 1e-5 }, name);
    for (const [name, se] of Object.entries(cy.standardErrors)) expectClose(num(line(out, name)[2]), se, { rel: 1e-3 }, `SE ${name}`);
    expect(line(out, "activationEnergy")[5]).toBe("J/mol");
    expect(line(out, "eta0")[6]).toBe(true);
    expect(line(out, "etaInf").slice(1, 3)).toEqual([0, "held"]);
    expect(line(out, "Tref")[1]).toBe(473.15);
    expect(line(out, "converged")[1]).toBe(true);
    const at = out.findIndex((r) => r[0] === "temperature [K]");
    expect(out.slice(at + 1, at + 4).map((r) => r[0])).toEqual([443.15, 473.15, 503.15]);
    expect(out.slice(at + 1, at + 4)[1]?.[1]).toBe(1);
    out.forEach((r) => expect(r).toHaveLength(MASTER_HEADER.length));
  });
  test("temperatures in °C (the default unit) give the same fit", () => {
    const kelvin = sheet.masterFit(col(...cy.data.temperature), col(...cy.data.shearRate), col(...cy.data.viscosity), "carreau-yasuda", "arrhenius", cell(473.15), null as never, null as never, "K");
    const celsius = sheet.masterFit(col(...cy.data.temperature.map((t) => t - 273.15)), col(...cy.data.shearRate), col(...cy.data.viscosity), "carreau-yasuda", "arrhenius", cell(200));
    expectClose(num(line(celsius, "eta0")[1]), num(line(kelvin, "eta0")[1]), { rel: 1e-9 });
    expect(line(celsius, "Tref")[1]).toBeCloseTo(200, 9);
  });
  test("RHEO.MODEL reads the spill (law rows and the aT block skipped): η at Tref from the fitted Carreau–Yasuda", () => {
    const out = sheet.masterFit(col(...cy.data.temperature), col(...cy.data.shearRate), col(...cy.data.viscosity), "carreau-yasuda", "arrhenius", cell(473.15), null as never, null as never, "K");
    const eta = valuesOf(sheet.modelViscosity("carreau-yasuda", out, col(1, 100)));
    const p = Object.fromEntries(["eta0", "etaInf", "lambda", "n", "a"].map((n) => [n, num(line(out, n)[1])]));
    expect(eta).toEqual(evaluateModel("carreau-yasuda", p, [1, 100]));
  });
  test("Cross-WLF: moulding names; RHEO.MODEL evaluates the spill at a temperature (D2 → Tstar, A2tilde → A2)", () => {
    const out = sheet.masterFit(col(...cw.data.temperature), col(...cw.data.shearRate), col(...cw.data.viscosity), "cross-wlf", null as never, null as never, cell("A2tilde=51.6"), null as never, "K");
    expect(out.slice(0, 7).map((r) => r[0])).toEqual(["n", "tauStar", "D1", "D2", "D3", "A1", "A2tilde"]);
    for (const [name, v] of Object.entries(cw.parameters)) expectClose(num(line(out, name)[1]), v, { rel: 1e-5 }, name);
    const eta = valuesOf(sheet.modelViscosity("cross-wlf", out, col(10), cell(473.15), null as never, "K"));
    const p = { D1: cw.parameters.D1 as number, A1: cw.parameters.A1 as number, A2: 51.6, Tstar: cw.parameters.D2 as number, tauStar: cw.parameters.tauStar as number, n: cw.parameters.n as number };
    expectClose(eta[0] as number, evaluateModel("cross-wlf", p, [10], 473.15)[0] as number, { rel: 1e-4 });
  });
  const errors: [string, () => unknown[][], string, RegExp][] = [
    ["no model", () => sheet.masterFit(col(200, 220), col(1, 2), col(3, 2), null as never), "#N/A", /^model: is required; accepted: power-law, cross, carreau, carreau-yasuda, cross-wlf$/],
    ["a model without a shifted form", () => sheet.masterFit(col(200, 220), col(1, 2), col(3, 2), "bingham", "arrhenius", cell(210)), "#VALUE!", /^model: /],
    ["no reference temperature", () => sheet.masterFit(col(200, 220), col(1, 2), col(3, 2), "cross", "arrhenius"), "#N/A", /^referenceTemperature: is required with the arrhenius law/],
    ["a law for cross-wlf", () => sheet.masterFit(col(200, 220), col(1, 2), col(3, 2), "cross-wlf", "wlf"), "#VALUE!", /^law: belongs to the shifted models/],
    ["one temperature", () => sheet.masterFit(col(200, 200, 200, 200, 200), col(1, 2, 3, 4, 5), col(5, 4, 3, 2, 1), "power-law", "arrhenius", cell(200)), "#N/A", /^temperature: /],
    ["text in the data", () => sheet.masterFit(col(200, 220), col(1, "x"), col(3, 2), "cross", "arrhenius", cell(210)), "#VALUE!", /^shearRate: row 2 is text "x"$/],
  ];
  for (const [name, call, code, message] of errors) {
    test(`error: ${name} → ${code}`, () => {
      expect(errorOf(call())).toEqual({ code, message: expect.stringMatching(message) });
    });
  }
});
