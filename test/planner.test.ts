import {
  DEFAULT_PLANNER_OPTIONS,
  barrelCapacity,
  logSpaced,
  planTest,
  type PlanInput,
} from "../src/core/planner";
import { dieFlowPoint, type PlanDie } from "../src/core/diePressure";
import { suggestTransducer, rangeFlag } from "../src/core/transducerChoice";
import {
  DEFAULT_ASSUMED_FLOW_INDEX,
  meltFlowApparentPoint,
  modelViscosity,
  powerLawFromApparentPoint,
  powerLawFromMeltFlow,
  powerLawViscosity,
  shiftPriorViscosity,
} from "../src/core/priorViscosity";
import { PLAN_CAUTION_PRESSURE } from "../src/core/planner";
import { readPlanOptions } from "../src/io/planOptions";
import { arrheniusShiftFactor } from "../src/core/temperature/shiftFactors";
import { apparentSlitShearRate, wallRateFromApparentSlitRate } from "../src/core/slitFlow";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

const capillary: PlanDie = { name: "D1L20", kind: "capillary", diameter: 1e-3, length: 20e-3 };
const R = 0.5e-3;
const L = 20e-3;

/** A plan input with every field valid; tests override what they examine. */
function input(over: Partial<PlanInput> = {}): PlanInput {
  return {
    barrelDiameter: 0.015,
    usableLength: 0.2,
    dies: [capillary],
    transducers: [
      { name: "T100", fullScale: 100e5, accuracy: 0.0025 },
      { name: "T500", fullScale: 500e5 },
      { name: "T2000", fullScale: 2000e5 },
    ],
    shearRateMin: 10,
    shearRateMax: 1000,
    points: 3,
    viscosity: () => 100,
    density: 750,
    dwellTime: 60,
    ...over,
  };
}

describe("dieFlowPoint: predicted pressure against closed forms", () => {
  // Hagen–Poiseuille (e.g. Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. (2002), eq. 2.3-21, from memory):
  // ΔP = 8μLQ/(πR⁴). Water at 20 °C: μ = 1.0016 mPa·s (IAPWS 2008).
  test("water in a 1 mm × 20 mm die at 1000 1/s: Hagen–Poiseuille with e = 0", () => {
    const mu = 1.0016e-3;
    const p = dieFlowPoint(modelViscosity("newtonian", { mu }), capillary, 1000, "apparent", 0);
    const hagenPoiseuille = (8 * mu * L * p.flowRate) / (Math.PI * R ** 4);
    // @check diePressure, priorViscosity | water (IAPWS 1.0016 mPa·s) in a 1 mm × 20 mm die at 1000 1/s: Hagen–Poiseuille ΔP = 8μLQ/(πR⁴) | Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. (2002), eq. 2.3-21 (from memory); IAPWS 2008 viscosity of water | rel 1e-6 | 2
    expectClose(p.pressure, hagenPoiseuille, { rel: 1e-6 });
    // by hand: ΔP = 2μγ̇·L/R = 2 · 1.0016e-3 · 1000 · 40 = 80.128 Pa
    expectClose(p.pressure, 80.128, { rel: 1e-6 });
    expectClose(p.shearRateWall, 1000, { rel: 1e-6 }); // Newtonian: true rate = apparent rate
  });

  test("glycerol-like liquid (invented 1.4 Pa·s) with an entrance allowance e = 2: ΔP = 8μLQ/(πR⁴)·(1 + eR/L)", () => {
    const mu = 1.4;
    const p = dieFlowPoint(() => mu, capillary, 50, "apparent", 2);
    const hp = (8 * mu * L * p.flowRate) / (Math.PI * R ** 4);
    expectClose(p.landPressure, hp, { rel: 1e-6 });
    expectClose(p.entrancePressure, hp * ((2 * R) / L), { rel: 1e-6 });
    expectClose(p.pressure, hp * (1 + (2 * R) / L), { rel: 1e-6 });
  });

  // Power law in a round die (Rabinowitsch 1929; Macosko 1994, ch. 6, from memory): γ̇_w = γ̇_a(3n+1)/(4n),
  // τ_w = K·γ̇_w^n, ΔP = 2τ_w(L/R + e) (Bagley 1957).
  test.each([
    [1e4, 0.4, 100, 3],
    [2e3, 0.7, 5, 0],
    [5e4, 0.25, 2000, 5],
  ])("power law K=%p n=%p at γ̇a=%p, e=%p: closed form", (K, n, rate, e) => {
    const p = dieFlowPoint(powerLawViscosity(K, n), capillary, rate, "apparent", e);
    const wall = (rate * (3 * n + 1)) / (4 * n);
    const tau = K * Math.pow(wall, n);
    expectClose(p.shearRateWall, wall, { rel: 1e-6 });
    expectClose(p.wallShearStress, tau, { rel: 1e-6 });
    expectClose(p.pressure, 2 * tau * (L / R + e), { rel: 1e-6 });
  });

  test("wall-rate basis: the apparent rate is γ̇_w·4n/(3n+1) for a power law", () => {
    const p = dieFlowPoint(powerLawViscosity(1e4, 0.4), capillary, 220, "wall", 0);
    expectClose(p.shearRateApparent, (220 * 4 * 0.4) / 2.2, { rel: 1e-8 });
    expectClose(p.shearRateWall, 220, { rel: 0 });
  });

  // Slit, power law (Macosko 1994, ch. 6, from memory; ISO 11443): γ̇_a = 6Q/(WH²), γ̇_w = γ̇_a(2n+1)/(3n), ΔP = 2τ_w·L/H.
  test("slit 10 mm × 1 mm × 30 mm, power law: closed form", () => {
    const slit: PlanDie = { name: "slit", kind: "slit", width: 10e-3, height: 1e-3, length: 30e-3 };
    const n = 0.35;
    const K = 2e4;
    const p = dieFlowPoint(powerLawViscosity(K, n), slit, 300, "apparent", 0);
    const wall = (300 * (2 * n + 1)) / (3 * n);
    expectClose(p.shearRateWall, wall, { rel: 1e-6 });
    expectClose(p.pressure, 2 * K * Math.pow(wall, n) * 30, { rel: 1e-6 });
    expectClose(apparentSlitShearRate(p.flowRate, 10e-3, 1e-3), 300, { rel: 1e-12 });
    // Newtonian slit (plane Poiseuille): ΔP = 12μLQ/(WH³) (Bird, Stewart & Lightfoot 2002, ch. 2, flow through a narrow slit, from memory)
    const q = dieFlowPoint(() => 3, slit, 300, "apparent", 0);
    expectClose(q.pressure, (12 * 3 * 30e-3 * q.flowRate) / (10e-3 * 1e-9), { rel: 1e-6 });
    expectClose(wallRateFromApparentSlitRate(() => 3, 300), 300, { rel: 1e-6 });
  });

  test("orifice die: entrance-only estimate 2τ_w·e at the long-die wall stress", () => {
    const orifice: PlanDie = { name: "O", kind: "orifice", diameter: 1e-3 };
    const p = dieFlowPoint(powerLawViscosity(1e4, 0.5), orifice, 100, "apparent", 4);
    const tau = 1e4 * Math.pow(100 * (2.5 / 2), 0.5);
    expectClose(p.pressure, 2 * tau * 4, { rel: 1e-6 });
    expect(p.landPressure).toBe(0);
  });

  test("a yield-stress prior beyond the inversion bracket is refused, not silently clipped", () => {
    const bingham = modelViscosity("bingham", { tauY: 1e5, muP: 1 });
    expect(() => dieFlowPoint(bingham, capillary, 1, "apparent", 0)).toThrow(/outside 0.5–10/);
  });
});

describe("prior viscosity adapters", () => {
  test("powerLawFromApparentPoint: Newtonian n = 1 returns the point's viscosity", () => {
    expect(powerLawFromApparentPoint(100, 300, 1)).toEqual({ K: 300, n: 1 });
  });
  test("powerLawFromApparentPoint: the power law reproduces the apparent point in the forward model", () => {
    const { K, n } = powerLawFromApparentPoint(50, 2000, 0.4);
    const p = dieFlowPoint(powerLawViscosity(K, n), capillary, 50, "apparent", 0);
    expectClose(p.wallShearStress / 50, 2000, { rel: 1e-6 });
  });
  // Hand calculation (invented MFR 2 g/10min, 2.16 kg, ρ = 740 kg/m³) in the ISO 1133 geometry
  // (die 2.095 × 8.000 mm, barrel 9.550 mm; from memory): Q = 3.3333e-6/740 = 4.5045e-9 m³/s,
  // γ̇a = 32Q/(πD³) = 4.9899 1/s, ΔP = 2.16·9.80665/(π·0.00955²/4) = 295 718 Pa,
  // τ = ΔP·D/(4L) = 19 360.3 Pa, ηa = 3879.87 Pa·s; n = 0.4: γ̇w = 6.86116 1/s, K = 8960.92 Pa·s^n.
  test("MFR point by hand", () => {
    const p = meltFlowApparentPoint({ massRate: 2e-3 / 600, load: 2.16, density: 740 });
    expectClose(p.shearRateApparent, 4.98994, { rel: 1e-5 });
    expectClose(p.wallStress, 19360.3, { rel: 1e-5 });
    expectClose(p.viscosityApparent, 3879.87, { rel: 1e-5 });
    const pl = powerLawFromMeltFlow({ massRate: 2e-3 / 600, load: 2.16, density: 740 });
    expect(pl.n).toBe(DEFAULT_ASSUMED_FLOW_INDEX);
    expectClose(pl.K, 8960.92, { rel: 1e-5 });
  });
  test("MFR without a density, or with both MFR and MVR, names the argument", () => {
    expect(() => meltFlowApparentPoint({ massRate: 1e-6, load: 2.16 })).toThrow(/^density:/);
    expect(() => meltFlowApparentPoint({ massRate: 1e-6, volumeRate: 1e-9, load: 2.16, density: 700 })).toThrow(/not both/);
  });
  test("modelViscosity checks parameters once, naming them", () => {
    expect(() => modelViscosity("power-law", { K: 1e4 })).toThrow(/missing: n/);
    expect(() => modelViscosity("carreau-x", {})).toThrow(/unknown model/);
  });
});

describe("planTest: ladder, capacity and duration", () => {
  test("logSpaced(10, 1000, 3) = 10, 100, 1000", () => {
    const r = logSpaced(10, 1000, 3);
    [10, 100, 1000].forEach((v, i) => expectClose(r[i] as number, v, { rel: 1e-12 }));
  });

  // Capacity by hand: barrel 15 mm × 200 mm usable: V = π·0.015²/4·0.2 = 3.5343e-5 m³ = 35.34 cm³,
  // at 750 kg/m³: 26.507 g. Die 1 mm, rates 10, 100, 1000 1/s: Q = γ̇·π·(1e-3)³/32 =
  // 9.8175e-10, 9.8175e-9, 9.8175e-8 m³/s; 60 s each: 0.058905 + 0.58905 + 5.8905 = 6.5384 cm³
  // = 4.9038 g = 18.50 % of the barrel; 3 × 60 s = 180 s plus 600 s per load.
  // Piston speed at 10 1/s: v = 4Q/(πD_b²) = γ̇D³/(8D_b²) = 5.5556e-6 m/s = 0.33333 mm/min.
  test("capacity, material and duration by hand", () => {
    const plan = planTest(input(), { timePerLoad: 600 });
    expectClose(plan.barrelVolume, 3.53429e-5, { rel: 1e-5 });
    expectClose(plan.barrelMass, 0.0265072, { rel: 1e-5 });
    const die = plan.dies[0]!;
    expectClose(die.steps[0]!.volume, 5.89049e-8, { rel: 1e-5 });
    expectClose(die.steps[2]!.volume, 5.89049e-6, { rel: 1e-5 });
    expectClose(die.volume, 6.53844e-6, { rel: 1e-5 });
    expectClose(die.mass, 4.90383e-3, { rel: 1e-5 });
    expectClose(die.capacityUsed, 0.185, { rel: 1e-4 });
    expectClose(die.duration, 780, { rel: 1e-12 });
    expectClose(plan.totalDuration, 780, { rel: 1e-12 });
    expectClose(die.steps[0]!.pistonSpeed * 60e3, 0.333333, { rel: 1e-5 });
    expect(die.steps.every((s) => s.withinCapacity)).toBe(true);
    expect(plan.warnings.filter((w) => w.code === "PLAN_BARREL_CAPACITY_EXCEEDED")).toHaveLength(0);
  });

  test("usableVolume gives the same capacity as the length", () => {
    expectClose(barrelCapacity(0.015, undefined, 3.5342917e-5), barrelCapacity(0.015, 0.2), { rel: 1e-7 });
    expect(() => barrelCapacity(0.015)).toThrow(/usable barrel length or the usable volume/);
    expect(() => barrelCapacity(0.015, 0.2, 3e-5)).toThrow(/one of them/);
  });

  test("a dwell of 600 s runs the barrel empty in step 3: flagged with a warning", () => {
    // step 3 alone needs 9.8175e-8 · 600 = 5.89e-5 m³ > 3.53e-5 m³
    const plan = planTest(input({ dwellTime: 600 }));
    const steps = plan.dies[0]!.steps;
    expect(steps.map((s) => s.withinCapacity)).toEqual([true, true, false]);
    const w = plan.warnings.find((x) => x.code === "PLAN_BARREL_CAPACITY_EXCEEDED");
    expect(w?.message).toMatch(/die "D1L20".*step 3/);
  });

  // Steady-state criterion by hand: μ = 1e4 Pa·s, e = 0, γ̇ = 10 1/s: ΔP = 2μγ̇·L/R = 8e6 Pa;
  // t = ln(100)·β·V·ΔP/Q = 4.60517 · 1e-9 · 3.53429e-5 · 8e6 / 9.81748e-10 = 1326.29 s.
  test("steady-state criterion: first step settles in ln(1/ε)·β·V·ΔP/Q", () => {
    const plan = planTest(input({ viscosity: () => 1e4, compressibility: 1e-9 }), { endCorrection: 0 });
    const s = plan.dies[0]!.steps[0]!;
    expectClose(s.settleTime as number, 1326.29, { rel: 1e-5 });
    expectClose(s.stepTime, 1326.29, { rel: 1e-5 });
    // Newtonian: ΔP/Q is the same at every rate, so t_k = t_1·V_melt,k/V with the melt left:
    // V_2 = V − Q_1·t_1, V_3 = V_2 − Q_2·t_2 (Q_k from the capacity example above).
    const V = 3.534291735e-5;
    const t1 = 1326.289;
    const t2 = (t1 * (V - 9.817477e-10 * t1)) / V;
    const t3 = (t1 * (V - 9.817477e-10 * t1 - 9.817477e-9 * t2)) / V;
    expectClose(plan.dies[0]!.steps[1]!.stepTime, t2, { rel: 1e-5 });
    expectClose(plan.dies[0]!.steps[2]!.stepTime, t3, { rel: 1e-5 });
  });

  test("transducer suggestion: smallest full scale with every step in 5–90 % FS", () => {
    // power law K=1.5e4, n=0.4, e=3: about 37 to 232 bar over 10→1000 1/s: T500 (25–450 bar)
    const plan = planTest(input({ viscosity: powerLawViscosity(1.5e4, 0.4) }));
    const die = plan.dies[0]!;
    const top = Math.max(...die.steps.map((s) => s.pressure));
    const low = Math.min(...die.steps.map((s) => s.pressure));
    const expected = [100e5, 500e5, 2000e5].find((fs) => top <= 0.9 * fs && low >= 0.05 * fs);
    expect(expected).toBeDefined();
    expect(die.transducer.fullScale).toBe(expected);
    expect(die.transducerCoversAll).toBe(true);
    expect(die.steps.every((s) => s.flag === "ok")).toBe(true);
  });

  test("flags over, high and low against the named transducer, with warnings", () => {
    expect(rangeFlag(101, 100, 0.05, 0.9)).toBe("over");
    expect(rangeFlag(95, 100, 0.05, 0.9)).toBe("high");
    expect(rangeFlag(4, 100, 0.05, 0.9)).toBe("low");
    expect(rangeFlag(50, 100, 0.05, 0.9)).toBe("ok");
    const die: PlanDie = { ...capillary, transducer: "T100" };
    const plan = planTest(input({ dies: [die], viscosity: powerLawViscosity(1e5, 0.4) }));
    expect(plan.dies[0]!.suggested).toBe(false);
    expect(plan.warnings.map((w) => w.code)).toContain("PLAN_PRESSURE_OVER_FULL_SCALE");
    expect(plan.dies[0]!.steps.some((s) => s.flag === "over")).toBe(true);
  });

  test("suggestTransducer: none covers all → the one covering most steps without going over", () => {
    const ts = [{ name: "a", fullScale: 10 }, { name: "b", fullScale: 100 }, { name: "c", fullScale: 1000 }];
    expect(suggestTransducer([10, 50, 80], ts, 0.05, 0.9)).toEqual({ transducer: ts[1], coversAll: true });
    // 0.2 is low for every transducer but a; 95 is above 90 % of b → b covers 1 step, c covers 1 step
    const pick = suggestTransducer([0.2, 95, 500], ts, 0.05, 0.9);
    expect(pick.coversAll).toBe(false);
    expect(pick.transducer.name).toBe("c");
    expect(suggestTransducer([5000], ts, 0.05, 0.9).transducer.name).toBe("c");
  });

  test("pressure uncertainty = accuracy·FS/ΔP", () => {
    const plan = planTest(input({ dies: [{ ...capillary, transducer: "T100" }], viscosity: () => 1000 }), { endCorrection: 0 });
    const s = plan.dies[0]!.steps[1]!;
    expectClose(s.pressureUncertainty as number, (0.0025 * 100e5) / s.pressure, { rel: 1e-12 });
  });

  test("defaults are the documented constants", () => {
    const plan = planTest(input());
    expect(plan.options).toEqual({ ...DEFAULT_PLANNER_OPTIONS });
  });

  test.each([
    [{ shearRateMax: 5 }, /^shearRateMax:/],
    [{ points: 1 }, /^points:/],
    [{ points: 2.5 }, /^points:/],
    [{ density: 0 }, /^density:/],
    [{ dwellTime: -1 }, /^dwellTime:/],
    [{ dies: [] }, /^dies:/],
    [{ transducers: [] }, /^transducers:/],
    [{ dies: [{ name: "x", kind: "capillary", diameter: 1e-3 } as PlanDie] }, /dies "x": a capillary die needs a length/],
    [{ dies: [{ name: "s", kind: "slit", width: 1e-2, length: 1e-2 } as PlanDie] }, /a slit die needs height/],
    [{ dies: [capillary, capillary] }, /used twice/],
    [{ dies: [{ ...capillary, transducer: "T9" }] }, /unknown transducer "T9"/],
    [{ transducers: [{ name: "t", fullScale: 1e7, accuracy: 2 }] }, /accuracy/],
  ])("bad input %#: a RheoError naming the field", (over, message) => {
    expect(() => planTest(input(over as Partial<PlanInput>))).toThrow(RheoError);
    expect(() => planTest(input(over as Partial<PlanInput>))).toThrow(message);
  });

  test("unknown option and inverted fractions are refused", () => {
    expect(() => planTest(input(), { foo: 1 } as never)).toThrow(/unknown option "foo"/);
    expect(() => planTest(input(), { lowFraction: 0.95 })).toThrow(/^lowFraction:/);
  });
});

/**
 * A prior at its own temperature, moved to the test's by time–temperature superposition,
 * η_test(γ̇) = a·η_prior(a·γ̇) with a = a_T(T_test)/a_T(T_prior) (Dealy & Wang 2013, ch. 4). For a
 * power law K·γ̇^(n−1) this is K·a^n·γ̇^(n−1) (algebra); for a Newtonian prior, μ·a, so the
 * Hagen–Poiseuille pressure scales by a.
 */
describe("the prior's temperature and the plan's caution", () => {
  const Ea = 50e3;
  const law = { law: "arrhenius" as const, referenceTemperature: 463.15, activationEnergy: Ea };
  const a = arrheniusShiftFactor(483.15, 463.15, Ea);
  test("shiftPriorViscosity: 1000 Pa·s at 190 °C is 584.2 Pa·s at 210 °C (Ea 50 kJ/mol); a power law gets K·a^n", () => {
// @check priorViscosity | a prior moved by an Arrhenius shift, and a power law gaining a_T^n | Dealy & Wang, Melt Rheology (2013), ch. 4 (from memory) | rel 1e-13 | 3
    expectClose(shiftPriorViscosity(() => 1000, law, 463.15, 483.15)(10), 1000 * Math.exp((Ea / 8.314462618) * (1 / 483.15 - 1 / 463.15)), { rel: 1e-14 });
    expectClose(shiftPriorViscosity(() => 1000, law, 463.15, 483.15)(10), 584.2187, { rel: 1e-6 });
    expectClose(shiftPriorViscosity(powerLawViscosity(1e4, 0.4), law, 463.15, 483.15)(50), 1e4 * a ** 0.4 * 50 ** -0.6, { rel: 1e-13 });
  });
  test("planTest shifts a prior with a law: the Newtonian pressures scale by a_T", () => {
    const plain = planTest(input({ viscosity: () => 800 }));
    const shifted = planTest(input({ viscosity: () => 800, priorTemperature: 463.15, testTemperature: 483.15, priorShift: law }));
// @check planner, priorViscosity | shifted Newtonian prior: Hagen–Poiseuille pressures scale by a_T at 3 steps | Hagen–Poiseuille; Dealy & Wang, Melt Rheology (2013), ch. 4 (from memory) | rel 1e-6 | 3
    shifted.dies[0]!.steps.forEach((st, i) => expectClose(st.pressure, a * plain.dies[0]!.steps[i]!.pressure, { rel: 1e-6 }));
    expect(shifted.caution[0]).toBe(PLAN_CAUTION_PRESSURE);
    expect(shifted.caution[1]).toBe("The prior viscosity was shifted from 190 °C to the test's 210 °C (Arrhenius, Ea = 50 kJ/mol).");
    expect(shifted.warnings.map((w) => w.code)).not.toContain("PLAN_PRIOR_NOT_SHIFTED");
  });
  test("every plan's caution names the pressure dependence; a prior at another temperature without a law is warned about", () => {
    expect(PLAN_CAUTION_PRESSURE).toMatch(/ignore the rise of viscosity with pressure/);
    const plain = planTest(input());
    expect(plain.caution).toEqual([PLAN_CAUTION_PRESSURE, expect.stringMatching(/^The prior viscosity is used as given: if it was measured at another temperature/)]);
    const unshifted = planTest(input({ priorTemperature: 463.15, testTemperature: 483.15 }));
    expect(unshifted.warnings.map((w) => w.code)).toContain("PLAN_PRIOR_NOT_SHIFTED");
    expect(unshifted.caution[1]).toMatch(/belongs to 190 °C and is used unshifted at the test's 210 °C/);
    expect(() => planTest(input({ priorShift: law, priorTemperature: 463.15 }))).toThrow(/^testTemperature: shifting the prior needs/);
  });
  test("readPlanOptions: priorTemperature, testTemperature and priorActivationEnergy build the shift", () => {
    const raw = {
      barrelDiameter: "15 mm", usableLength: "200 mm", density: "0.75 g/cm3", dwellTime: "30 s",
      shearRateMin: "10 1/s", shearRateMax: "1000 1/s", points: 3,
      priorModel: "power-law", priorParameters: { K: 1e4, n: 0.4 },
      priorTemperature: "190 C", testTemperature: "210 C", priorActivationEnergy: "50 kJ/mol",
      dies: [{ name: "L20", type: "capillary", diameter: "1 mm", length: "20 mm" }],
      transducers: [{ name: "P500", fullScale: "500 bar" }],
    };
    const parsed = readPlanOptions(raw);
    expect(parsed.input.priorShift).toEqual(law);
    expectClose(parsed.input.testTemperature as number, 483.15, { rel: 1e-15 });
    const wlf = readPlanOptions({ ...raw, priorActivationEnergy: undefined, priorWlfC1: 4.5, priorWlfC2: "150 K" });
    expect(wlf.input.priorShift).toEqual({ law: "wlf", referenceTemperature: 463.15, C1: 4.5, C2: 150 });
    expect(() => readPlanOptions({ ...raw, priorWlfC1: 4.5 })).toThrow(/^priorActivationEnergy: give either an Arrhenius activation energy or the WLF constants/);
  });
});
