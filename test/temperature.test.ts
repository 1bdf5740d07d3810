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
  verticalShiftFactor,
  wlfConstantsAtReference,
  wlfShiftFactor,
  type TemperatureCurve,
} from "../src/core/temperature";
import { gaussian, seededRandom } from "../src/core/random";
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
  test("four temperatures: C2 fitted (C2Source fitted), no warning", () => {
    const fit = fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 423.15, 8.86, 101.6), [403.15, 423.15, 443.15, 463.15]), 423.15, { glassTransitionTemperature: 373.15 });
    expect(fit.C2Source).toBe("fitted");
    expect(fit.warnings).toEqual([]);
    expect(fit.universalAtReference).toEqual(wlfConstantsAtReference(423.15, 373.15));
  });
  test("two temperatures with T_g: C2 = 51.6 K + T_ref − T_g (universal constants converted), C1 fitted, WLF_C2_UNIVERSAL", () => {
    // a liquid obeying the universal law with T_g = 373.15 K, seen from T_ref = 423.15 K
    const Tg = 373.15;
    const truth = wlfConstantsAtReference(423.15, Tg);
    const fit = fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, Tg, 17.44, 51.6), [423.15, 443.15]), 423.15, { glassTransitionTemperature: Tg });
    expect(fit.C2Source).toBe("universal");
    expectClose(fit.C2, 101.6, { rel: 1e-15 });
    expect(fit.C2StandardError).toBeNaN();
    expectClose(fit.C1, truth.C1, { rel: 1e-6 });
    expect(fit.warnings.map((w) => w.code)).toEqual(["WLF_C2_UNIVERSAL"]);
    expect(fit.warnings[0]!.message).toMatch(/2 temperatures cannot determine C2.*C2 = 51\.6 \+ T_ref − T_g = 101\.6 K/);
  });
  test("two temperatures without T_g: an error naming glassTransitionTemperature (C2 at 51.6 K belongs to T_ref = T_g)", () => {
    expect(() => fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 423.15, 8, 51.6), [423.15, 443.15]), 423.15)).toThrow(
      /^glassTransitionTemperature: WLF with 2 temperatures cannot determine C2: give the glass transition temperature T_g/,
    );
    const held = fitWlfShift(curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 423.15, 8, 60), [423.15, 443.15]), 423.15, { C2: 60 });
    expect(held.C2Source).toBe("held");
    expectClose(held.C1, 8, { rel: 1e-6 });
  });
  test("C2 the data cannot determine: held at the converted universal value with T_g, else WLF_C2_POORLY_DETERMINED", () => {
    // three close temperatures, C2 = 400 K (almost Arrhenius-straight) and 3 % noise on η
    const random = seededRandom(7);
    const noisy = curvesFrom(quadraticMaster, (T) => wlfShiftFactor(T, 473.15, 6, 400), [463.15, 473.15, 483.15]).map((c) => ({ ...c, viscosity: c.viscosity.map((v) => v * Math.exp(0.03 * gaussian(random))) }));
    const free = fitWlfShift(noisy, 473.15);
    expect(free.warnings.map((w) => w.code)).toEqual(["WLF_C2_POORLY_DETERMINED"]);
    const held = fitWlfShift(noisy, 473.15, { glassTransitionTemperature: 373.15 });
    expect(held.C2Source).toBe("universal");
    expectClose(held.C2, 151.6, { rel: 1e-12 });
  });
  test("holding both constants is refused", () => {
    expect(() => fitWlfShift(curvesFrom(quadraticMaster, () => 1, [423.15, 443.15]), 423.15, { C1: 1, C2: 50 })).toThrow("options: holds both C1 and C2; nothing is left to fit");
  });
});

/**
 * Change of reference of the WLF equation (Ferry 1980, ch. 11, from memory): with the universal
 * C1 = 17.44, C2 = 51.6 K at T_g, the same law about T_ref has C2 = 51.6 + T_ref − T_g and
 * C1 = 17.44·51.6/C2 — an identity checked here on a_T itself.
 */
describe("wlfConstantsAtReference(T_ref, T_g)", () => {
  test("T_g = 100 °C, T_ref = 200 °C: C2 = 151.6 K, C1 = 5.93604; same a_T at every T", () => {
    const c = wlfConstantsAtReference(473.15, 373.15);
    expectClose(c.C2, 151.6, { rel: 1e-14 });
    expectClose(c.C1, (17.44 * 51.6) / 151.6, { rel: 1e-14 });
    for (const T of [393.15, 453.15, 473.15, 533.15]) {
// @check temperature/shiftFactors | universal WLF constants moved from T_g to T_ref give the same a_T at 4 temperatures | Williams, Landel & Ferry, J. Am. Chem. Soc. 77 (1955) 3701; Ferry, Viscoelastic Properties of Polymers (1980), ch. 11 (from memory) | rel 1e-12 | 4
      expectClose(wlfShiftFactor(T, 473.15, c.C1, c.C2), wlfShiftFactor(T, 373.15, 17.44, 51.6) / wlfShiftFactor(473.15, 373.15, 17.44, 51.6), { rel: 1e-12 });
    }
    expect(() => wlfConstantsAtReference(300, 373.15)).toThrow(/^glassTransitionTemperature: must be below T_ref \+ 51.6 K/);
  });
});

/**
 * Vertical shift b_T = ρ(T)T/(ρ_ref T_ref) (Ferry 1980, ch. 11; from memory): curves built as
 * η = a_T·b_T·η_ref(a_T·γ̇) are recovered exactly only when the fit divides b_T out.
 */
describe("vertical shift factor", () => {
  const alpha = 7e-4;
  const Ea = 45e3;
  const temps = [453.15, 473.15, 493.15, 513.15];
  const curves = temps.map((T) => {
    const a = arrheniusShiftFactor(T, 473.15, Ea);
    const b = verticalShiftFactor(T, 473.15, alpha);
    const shearRate = rates(1, 3000, 15);
    return { temperature: T, shearRate, viscosity: shearRate.map((g) => a * b * quadraticMaster(a * g)) };
  });
  test("b_T = exp(−α(T − T_ref))·T/T_ref", () => {
    expectClose(verticalShiftFactor(493.15, 473.15, alpha), Math.exp(-0.014) * (493.15 / 473.15), { rel: 1e-15 });
    expect(verticalShiftFactor(473.15, 473.15, alpha)).toBe(1);
    expect(() => verticalShiftFactor(473.15, 473.15, -1)).toThrow(/thermalExpansion: must be zero or more/);
  });
  test("the fit with the vertical shift recovers Ea; the master curve collapses onto η_ref", () => {
    const fit = fitArrheniusShift(curves, 473.15, { verticalShift: { thermalExpansion: alpha } });
// @check temperature/fitShift, temperature/masterCurve | curves built with the vertical factor ρ(T)T/(ρ_ref T_ref): Ea back only when the fit divides it out | Ferry, Viscoelastic Properties of Polymers (1980), ch. 11 (from memory) | rel 1e-7 | 1
    expectClose(fit.activationEnergy, Ea, { rel: 1e-7 });
    fit.factors.forEach((f) => expectClose(f.bT, verticalShiftFactor(f.temperature, 473.15, alpha), { rel: 1e-14 }));
    const master = masterCurve(curves, fit);
    master.shearRate.forEach((g, i) => expectClose(master.viscosity[i] as number, quadraticMaster(g), { rel: 1e-6 }));
    const [eta] = evaluateAtTemperature("power-law", { K: 1e4, n: 0.4 }, fit, [10], 513.15);
    const a = shiftFactor(fit, 513.15);
    expectClose(eta as number, a * verticalShiftFactor(513.15, 473.15, alpha) * 1e4 * (10 * a) ** -0.6, { rel: 1e-6 });
    // without it the fitted Ea absorbs b_T
    expect(Math.abs(fitArrheniusShift(curves, 473.15).activationEnergy - Ea)).toBeGreaterThan(500);
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
