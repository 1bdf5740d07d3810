import { adiabaticTemperatureRise, nahmeNumber, temperatureCoefficientFromShift, heatingTable, DEFAULT_HEATING_OPTIONS } from "../src/core/viscousHeating";
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
    expect(() => heatingTable([], 1e-3, { density: 750, heatCapacity: 2500, conductivity: 0.2 })).toThrow(/temperatureCoefficient: give b/);
  });
});

describe("heatingTable warnings (thresholds: common practice)", () => {
  const props = { density: 750, heatCapacity: 2500, conductivity: 0.2, temperatureCoefficient: 0.03 };
  test("HEATING_ADIABATIC_RISE above 5 K, HEATING_NAHME above 1", () => {
    expect(DEFAULT_HEATING_OPTIONS).toEqual({ maxAdiabaticRise: 5, maxNahme: 1 });
    const quiet = heatingTable([{ shearRateApparent: 10, pressure: 5e6, shearRateWall: 12, viscosity: 1000 }], 0.5e-3, props);
    expect(quiet.warnings).toEqual([]);
    const hot = heatingTable([{ shearRateApparent: 1000, pressure: 30e6, shearRateWall: 1200, viscosity: 1000 }], 0.5e-3, props);
    expect(hot.warnings.map((w) => w.code)).toEqual(["HEATING_ADIABATIC_RISE", "HEATING_NAHME"]);
    expectClose(hot.rows[0]!.nahmeNumber as number, (0.03 * 1000 * 1200 ** 2 * 0.25e-6) / 0.2, { rel: 1e-14 });
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
