import {
  GAS_CONSTANT,
  WLF_UNIVERSAL_C1,
  WLF_UNIVERSAL_C2,
  arrheniusShiftFactor,
  evaluateAtTemperature,
  fitArrheniusShift,
  fitWlfShift,
  masterCurve,
  shiftFactor,
  wlfShiftFactor,
  type TemperatureCurve,
} from "../src/core/temperature";
import { evaluateModel } from "../src/core/models";
import { expectClose } from "./helpers/expectClose";

const rates = (lo: number, hi: number, count: number) => Array.from({ length: count }, (_, i) => lo * Math.pow(hi / lo, i / (count - 1)));

describe("shift factors", () => {
  test("R = 8.314462618 J/(mol·K) (CODATA 2018, exact in the 2019 SI)", () => expect(GAS_CONSTANT).toBe(8.314462618));
  test("WLF universal constants C1 = 17.44, C2 = 51.6 K (Williams, Landel & Ferry 1955)", () => {
    expect(WLF_UNIVERSAL_C1).toBe(17.44);
    expect(WLF_UNIVERSAL_C2).toBe(51.6);
  });
  test("WLF at T_g + 10 K: log10 a_T = −17.44·10/61.6 = −2.8312 (arithmetic on the 1955 constants)", () => {
    expectClose(Math.log10(wlfShiftFactor(383.15, 373.15, 17.44, 51.6)), -2.831168831, { rel: 1e-9 });
    expect(wlfShiftFactor(373.15, 373.15, 17.44, 51.6)).toBe(1);
  });
  test("Arrhenius: a_T = exp[(Ea/R)(1/T − 1/T_ref)], 1 at T_ref, > 1 below it", () => {
    // hand calculation: (50000/8.314462618)·(1/463.15 − 1/473.15) = 0.274415…, e^0.274415 = 1.315768…
    expectClose(arrheniusShiftFactor(463.15, 473.15, 50e3), Math.exp((50e3 / 8.314462618) * (1 / 463.15 - 1 / 473.15)), { rel: 1e-15 });
    expectClose(arrheniusShiftFactor(463.15, 473.15, 50e3), 1.31577, { rel: 1e-5 });
    expect(arrheniusShiftFactor(473.15, 473.15, 50e3)).toBe(1);
  });
  test("errors name the argument", () => {
    expect(() => wlfShiftFactor(300, 373.15, 17.44, 51.6)).toThrow(/^temperature: must satisfy C2 \+ T − Tref > 0 for the WLF law, got C2 \+ T − Tref = -21.5\d* K$/);
    expect(() => arrheniusShiftFactor(-5, 473.15, 1)).toThrow("temperature: must be greater than zero, got -5");
    expect(() => shiftFactor({ law: "vft" } as never, 400)).toThrow('shift.law: unknown shift law "vft"; accepted: arrhenius, wlf');
  });
});

// Invented curves obeying time–temperature superposition exactly: η(γ̇,T) = a_T·η_ref(a_T·γ̇).
function curvesFrom(etaRef: (rate: number) => number, aT: (T: number) => number, temps: number[]): TemperatureCurve[] {
  return temps.map((T) => {
    const a = aT(T);
    const shearRate = rates(1, 3000, 15);
    return { temperature: T, shearRate, viscosity: shearRate.map((g) => a * etaRef(a * g)) };
  });
}
const quadraticMaster = (g: number) => Math.exp(9 - 0.2 * Math.log(g) - 0.03 * Math.log(g) ** 2);

describe("fitArrheniusShift(curves, Tref)", () => {
  const Ea = 45e3;
  const temps = [453.15, 473.15, 493.15, 513.15];
  test("recovers Ea exactly when the master curve is a polynomial in ln γ̇", () => {
    const fit = fitArrheniusShift(curvesFrom(quadraticMaster, (T) => arrheniusShiftFactor(T, 473.15, Ea), temps), 473.15);
    expect(fit.law).toBe("arrhenius");
    expectClose(fit.activationEnergy, Ea, { rel: 1e-7 });
    expect(fit.factors.map((f) => f.temperature)).toEqual(temps);
    fit.factors.forEach((f) => expectClose(f.aT, arrheniusShiftFactor(f.temperature, 473.15, Ea), { rel: 1e-7 }));
    expect(fit.warnings).toEqual([]);
  });
  test("Carreau–Yasuda melt curves: Ea to 1 % with the default cubic master curve", () => {
    const cy = (g: number) => evaluateModel("carreau-yasuda", { eta0: 2e4, etaInf: 0, lambda: 0.5, n: 0.3, a: 0.7 }, [g])[0] as number;
    const fit = fitArrheniusShift(curvesFrom(cy, (T) => arrheniusShiftFactor(T, 473.15, Ea), temps), 473.15);
    expectClose(fit.activationEnergy, Ea, { rel: 1e-2 });
  });
  test("noisy data give a standard error that covers the truth", () => {
    let seed = 7;
    const noise = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 0.04;
    const curves = curvesFrom(quadraticMaster, (T) => arrheniusShiftFactor(T, 473.15, Ea), temps).map((c) => ({ ...c, viscosity: c.viscosity.map((v) => v * Math.exp(noise())) }));
    const fit = fitArrheniusShift(curves, 473.15);
    expect(fit.activationEnergyStandardError).toBeGreaterThan(0);
    expect(Math.abs(fit.activationEnergy - Ea)).toBeLessThan(4 * fit.activationEnergyStandardError);
  });
  test("a reference temperature outside the data is flagged", () => {
    const fit = fitArrheniusShift(curvesFrom(quadraticMaster, (T) => arrheniusShiftFactor(T, 433.15, Ea), temps), 433.15);
    expectClose(fit.activationEnergy, Ea, { rel: 1e-7 });
    expect(fit.warnings.map((w) => w.code)).toEqual(["REFERENCE_OUTSIDE_DATA"]);
  });
  test("errors: one curve, bad rows, bad degree", () => {
    const one = curvesFrom(quadraticMaster, () => 1, [473.15]);
    expect(() => fitArrheniusShift(one, 473.15)).toThrow("curves: needs at least 2 curves at different temperatures, got 1");
    const bad = curvesFrom(quadraticMaster, () => 1, [473.15, 493.15]).map((c, i) => (i === 1 ? { ...c, viscosity: c.viscosity.map((v, r) => (r === 3 ? 0 : v)) } : c));
    expect(() => fitArrheniusShift(bad, 473.15)).toThrow("curves[1].viscosity: row 4 must be greater than zero, got 0");
    expect(() => fitArrheniusShift(curvesFrom(quadraticMaster, () => 1, [473.15, 493.15]), 473.15, { polynomialDegree: 9 })).toThrow("options.polynomialDegree: must be an integer from 1 to 6, got 9");
    expect(() => fitArrheniusShift(curvesFrom(quadraticMaster, () => 1, [473.15, 473.15]), 473.15)).toThrow("curves: need at least 2 different temperatures, got 1");
  });
});

describe("fitWlfShift(curves, Tref)", () => {
  test("recovers C1 and C2 from four temperatures", () => {
    const temps = [403.15, 423.15, 443.15, 463.15];
    const fit = fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 423.15, 8.86, 101.6), temps), 423.15);
    expectClose(fit.C1, 8.86, { rel: 1e-6 });
    expectClose(fit.C2, 101.6, { rel: 1e-6 });
    // exact data: no scatter, so the standard errors vanish (finite, and far below the values)
    expect(Number.isFinite(fit.C1StandardError) && Number.isFinite(fit.C2StandardError)).toBe(true);
    expect(fit.C1StandardError).toBeLessThan(1e-6 * fit.C1);
    expect(fit.C2StandardError).toBeLessThan(1e-6 * fit.C2);
  });
  test("with two temperatures C2 is held at 51.6 K and only C1 is fitted", () => {
    const fit = fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 423.15, 8, 51.6), [423.15, 443.15]), 423.15);
    expect(fit.C2).toBe(51.6);
    expect(fit.C2StandardError).toBeNaN();
    expectClose(fit.C1, 8, { rel: 1e-6 });
  });
  test("holding both constants is refused", () => {
    expect(() => fitWlfShift(curvesFrom(quadraticMaster, () => 1, [423.15, 443.15]), 423.15, { C1: 1, C2: 50 })).toThrow("options: holds both C1 and C2; nothing is left to fit");
  });
});

describe("masterCurve(curves, shift) and evaluateAtTemperature", () => {
  const shift = { law: "arrhenius" as const, referenceTemperature: 473.15, activationEnergy: 45e3 };
  const curves = curvesFrom(quadraticMaster, (T) => shiftFactor(shift, T), [453.15, 473.15, 493.15]);
  test("reduced points fall on the reference curve, sorted by reduced rate", () => {
    const master = masterCurve(curves, shift);
    expect(master.shearRate.length).toBe(45);
    // @check temperature/masterCurve | time–temperature superposition η(γ̇, T) = a_T·η_ref(a_T·γ̇): 45 reduced points fall on the reference curve | Ferry, Viscoelastic Properties of Polymers, 3rd ed. (1980), ch. 11 (from memory); Dealy & Wang 2013 | rel 1e-12 | 45
    master.shearRate.forEach((g, i) => expectClose(master.viscosity[i] as number, quadraticMaster(g), { rel: 1e-12 }));
    expect([...master.shearRate].sort((a, b) => a - b)).toEqual(master.shearRate);
  });
  test("a model at the reference temperature evaluated at another: a_T·η_ref(a_T·γ̇)", () => {
    const p = { eta0: 2e4, etaInf: 0, lambda: 0.5, n: 0.3, a: 0.7 };
    const aT = shiftFactor(shift, 493.15);
    const [eta] = evaluateAtTemperature("carreau-yasuda", p, shift, [10], 493.15);
    expectClose(eta as number, aT * (evaluateModel("carreau-yasuda", p, [10 * aT])[0] as number), { rel: 1e-14 });
    expect(() => evaluateAtTemperature("cross-wlf", {}, shift, [1], 480)).toThrow(/^model: cross-wlf carries its own temperature dependence/);
  });
});
