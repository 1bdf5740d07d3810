import {
  adiabaticTemperatureRise,
  brinkmanNumber,
  graetzNumber,
  meanVelocity,
  nahmeGriffithNumber,
  nahmeNumber,
  temperatureCoefficientFromShift,
  heatingTable,
  DEFAULT_HEATING_OPTIONS,
} from "../src/core/viscousHeating";
import heating from "./fixtures/scipy-heating.json";
import { reduce, Measurement } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { GAS_CONSTANT } from "../src/core/temperature/shiftFactors";
import { expectClose } from "./helpers/expectClose";

describe("heating formulas by hand", () => {
  // ΔT_ad = ΔP/(ρc_p) (Winter 1977): 20 MPa/(750 kg/m³ · 2500 J/(kg·K)) = 10.667 K
  test("adiabaticTemperatureRise(20 MPa, 750, 2500) = 10.6667 K", () => expectClose(adiabaticTemperatureRise(20e6, 750, 2500), 20e6 / 1.875e6, { rel: 1e-15 }));
  // Na = bηγ̇²R²/k: 0.03·1000·100²·(0.5e-3)²/0.2 = 0.375
  test("nahmeNumber(0.03, 1000, 100, 0.5 mm, 0.2) = 0.375", () => expectClose(nahmeNumber(0.03, 1000, 100, 0.5e-3, 0.2), 0.375, { rel: 1e-14 }));
  // Arrhenius: b = Ea/(R T²) = 50e3/(8.314462618·473.15²) = 0.026862 1/K; WLF: b = ln10·C1·C2/(C2+T−Tr)²
  test("b from an Arrhenius or WLF shift law", () => {
    expectClose(temperatureCoefficientFromShift({ law: "arrhenius", referenceTemperature: 473.15, activationEnergy: 50e3 }, 473.15), 0.02686198674259332, { rel: 1e-12 });
    expectClose(temperatureCoefficientFromShift({ law: "wlf", referenceTemperature: 373.15, C1: 17.44, C2: 51.6 }, 383.15), 0.5460726765489843, { rel: 1e-12 });
  });
  test("bad input names the argument", () => {
    expect(() => adiabaticTemperatureRise(1e6, 0, 2000)).toThrow(/density: must be greater than zero/);
    expect(() => nahmeNumber(0.03, 1000, 100, 0.5e-3, -1)).toThrow(/conductivity/);
    expect(() => heatingTable([], { geometry: "round", radius: 1e-3, dieLength: 0.02 }, { density: 750, heatCapacity: 2500, conductivity: 0.2 })).toThrow(/temperatureCoefficient: give b/);
    expect(() => nahmeGriffithNumber(0.03, 0, 1000, 0.05, 0.2)).toThrow(/nPrime: must be greater than zero/);
  });
  // Q = V·πR² and γ̇_a = 4Q/(πR³) give V = γ̇_a·R/4; a slit's Q = V·WH and γ̇_a = 6Q/(WH²) give V = γ̇_a·H/6
  test("meanVelocity: γ̇_a·R/4 round, γ̇_a·H/6 slit", () => {
// @check viscousHeating | mean velocity from the apparent rate, round and slit | Hagen–Poiseuille and plane Poiseuille flow (Bird, Stewart & Lightfoot 2002, ch. 2, from memory) | rel 1e-15 | 2
    expectClose(meanVelocity(400, 0.5e-3), 0.05, { rel: 1e-15 });
    expectClose(meanVelocity(600, 1e-3, "slit"), 0.1, { rel: 1e-15 });
  });
  // Na = n′·b·η·V²/k (Bird, Armstrong & Hassager 1987, vol. 1, ch. 4, from memory; b_γ = n′·b):
  // 1·0.03·1000·0.05²/0.2 = 0.375; Br = ηV²/(kΔT) = 1000·0.0025/0.2 = 12.5;
  // Gz = ρc_pVR²/(kL) = 750·2500·0.05·0.25e-6/(0.2·0.02) = 5.859375
  test("Nahme–Griffith, Brinkman and Graetz numbers by hand", () => {
// @check viscousHeating | Nahme–Griffith, Brinkman and Graetz numbers by hand | Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids vol. 1 (1987), ch. 4 (from memory); Winter, Adv. Heat Transfer 13 (1977) 205 (from memory) | rel 1e-14 | 4
    expectClose(nahmeGriffithNumber(0.03, 1, 1000, 0.05, 0.2), 0.375, { rel: 1e-14 });
    expectClose(nahmeGriffithNumber(0.03, 0.4, 1000, 0.05, 0.2), 0.15, { rel: 1e-14 });
    expectClose(brinkmanNumber(1000, 0.05, 0.2, 1), 12.5, { rel: 1e-14 });
    expectClose(graetzNumber(750, 2500, 0.05, 0.5e-3, 0.2, 0.02), 5.859375, { rel: 1e-14 });
  });
});

/**
 * Developed Newtonian pipe flow heated by its own dissipation, wall at the melt temperature, solved
 * with scipy's solve_bvp (scripts/scipy_heating_reference.py → test/fixtures/scipy-heating.json).
 * The apparent viscosity reads low by about Na/2 and the axis rises by about ηV²/k, the two
 * first-order results the Nahme–Griffith threshold rests on (derivation in docs/methods.md).
 */
describe("Na/2: the viscosity error of developed flow (against solve_bvp)", () => {
  const { wallViscosity: eta, temperatureCoefficient: b, conductivity: k } = heating;
  test.each(heating.cases.map((c) => [c.meanVelocity, c] as const))("V = %f m/s", (_v, c) => {
    const na = nahmeGriffithNumber(b, 1, eta, c.meanVelocity, k);
    const drop = 1 - c.apparentViscosity / eta;
    // first order in Na: the error of Na/2 grows as Na² (3 % of it at Na = 0.05, 5.3 % at 0.11, 11 % at 0.25)
// @check viscousHeating | viscosity error ≈ Na/2 and axis rise ≈ ηV²/k of developed heated pipe flow, 5 cases | scipy solve_bvp (scripts/scipy_heating_reference.py); Bird, Stewart & Lightfoot 2002, ch. 10 (from memory) | rel 0.5·Na | 10
    expectClose(drop, na / 2, { rel: 0.5 * na });
    expectClose(c.axisTemperatureRise, (eta * c.meanVelocity ** 2) / k, { rel: 0.25 * na });
  });
  test("maxNahme 0.1 ↔ a 5 % low viscosity (threshold common practice)", () => {
    expect(DEFAULT_HEATING_OPTIONS.maxNahme).toBe(0.1);
    const near = heating.cases.find((c) => Math.abs(nahmeGriffithNumber(b, 1, eta, c.meanVelocity, k) - 0.1) < 0.02)!;
    expectClose(1 - near.apparentViscosity / eta, 0.05, { abs: 0.005 });
  });
});

describe("heatingTable warnings", () => {
  const props = { density: 750, heatCapacity: 2500, conductivity: 0.2, temperatureCoefficient: 0.03 };
  const die = { geometry: "round" as const, radius: 0.5e-3, dieLength: 20e-3 };
  test("defaults: ΔT_ad 5 K (common practice), Na 0.1, ΔT_ref 1 K, Gz 5 (Incropera & DeWitt: entry length 0.05·Pe·D) and 50", () => {
    expect(DEFAULT_HEATING_OPTIONS).toEqual({ maxAdiabaticRise: 5, maxNahme: 0.1, brinkmanTemperatureDifference: 1, conductedGraetz: 5, adiabaticGraetz: 50 });
  });
  test("HEATING_ADIABATIC_RISE above 5 K; HEATING_NAHME above Na 0.1 with the Graetz regime", () => {
    const quiet = heatingTable([{ shearRateApparent: 10, pressure: 5e6, nPrime: 0.4, shearRateWall: 12, viscosity: 1000 }], die, props);
    expect(quiet.warnings).toEqual([]);
    expect(quiet.rows[0]!.heatRegime).toBe("conducted");
    const hot = heatingTable([{ shearRateApparent: 4000, pressure: 30e6, nPrime: 0.4, shearRateWall: 5500, viscosity: 100 }], die, props);
    expect(hot.warnings.map((w) => w.code)).toEqual(["HEATING_ADIABATIC_RISE", "HEATING_NAHME"]);
    const row = hot.rows[0]!;
    expectClose(row.meanVelocity, 0.5, { rel: 1e-15 });
    expectClose(row.nahmeGriffithNumber as number, (0.4 * 0.03 * 100 * 0.25) / 0.2, { rel: 1e-14 });
    expectClose(row.graetzNumber, (750 * 2500 * 0.5 * 0.25e-6) / (0.2 * 0.02), { rel: 1e-14 });
    expect(row.heatRegime).toBe("adiabatic");
    expect(hot.warnings[1]!.message).toMatch(/heat stays in the melt/);
    // the wall-rate form b·η·γ̇_w²R²/k stays for compatibility: 16·(γ̇_w/γ̇_a)²/n′ times Na
    expectClose(row.nahmeNumber as number, ((16 * (5500 / 4000) ** 2) / 0.4) * (row.nahmeGriffithNumber as number), { rel: 1e-12 });
  });
});

describe("reduce(…, { heating })", () => {
  // Newtonian, Arrhenius in temperature: μ(T) = μ_ref·exp[(Ea/R)(1/T − 1/T_ref)]; exact, no entrance loss
  const Ea = 40e3;
  const mu = (T: number) => 500 * Math.exp((Ea / GAS_CONSTANT) * (1 / T - 1 / 473.15));
  const data = (T: number): Measurement[] =>
    [10e-3, 20e-3].flatMap((L) => [10, 30, 100, 300].map((rate) => ({ dieDiameter: 1e-3, dieLength: L, flowRate: flowRateForApparentShearRate(rate, 1e-3), pressure: 4 * mu(T) * rate * (L / 1e-3), temperature: T })));
  const props = { density: 750, heatCapacity: 2500, conductivity: 0.2 };
  test("b given: ΔT_ad = ΔP/(ρc_p) of the longest die at each rate", () => {
    const g = reduce(data(473.15), { heating: { ...props, temperatureCoefficient: 0.02 } }).groups[0]!;
    expect(g.heating!.temperatureCoefficientSource).toBe("given");
    g.heating!.rows.forEach((h) => expectClose(h.adiabaticTemperatureRise, (4 * 500 * h.shearRateApparent * 20) / (750 * 2500), { rel: 1e-9 }));
  });
  test("b omitted: fitted from two temperatures as Ea/(RT²) (Arrhenius fit, temperature/fitShift.ts)", () => {
    const r = reduce([...data(463.15), ...data(483.15)], { heating: props });
    r.groups.forEach((g) => {
      expect(g.heating!.temperatureCoefficientSource).toBe("fitted");
      expectClose(g.heating!.temperatureCoefficient, Ea / (GAS_CONSTANT * (g.temperature as number) ** 2), { rel: 1e-4 });
    });
  });
  test("b omitted with one temperature is an error naming heating.temperatureCoefficient", () => {
    expect(() => reduce(data(473.15), { heating: props })).toThrow(/heating.temperatureCoefficient: give b/);
  });
});
