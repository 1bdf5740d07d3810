import {
  apparentShearRate,
  apparentWallShearStress,
  correctedWallShearStress,
  flowRateForApparentShearRate,
  viscosityFromStressAndRate,
  wallShearStressFromEndCorrection,
} from "../src/core/capillary";
import { flowRateFromMassRate, flowRateFromPiston, pistonSpeedForFlowRate } from "../src/core/flow";
import { apparentRateFromWallRate, wallRateFromApparentRate } from "../src/core/forwardFlow";
import { RheoError } from "../src/core/errors";
import { expectClose } from "./helpers/expectClose";

// Water at 20 °C: 1.0016 mPa·s (IAPWS 2008 formulation for the viscosity of ordinary water).
const WATER_20C = 1.0016e-3;

describe("Hagen–Poiseuille (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed. 2002, eq. 2.3-21, from memory)", () => {
  // ΔP = 8μLQ/(πR⁴) for a Newtonian liquid in a tube.
  const D = 0.5e-3;
  const L = 100e-3;
  const Q = 1e-6 / 60; // 1 mL/min
  const R = D / 2;
  const dp = (8 * WATER_20C * L * Q) / (Math.PI * R ** 4);

  test("apparent wall stress / apparent rate recovers the water viscosity", () => {
    const eta = apparentWallShearStress(dp, D, L) / apparentShearRate(Q, D);
    expectClose(eta, WATER_20C, { rel: 1e-12 });
  });
  test("γ̇_a = 4Q/(πR³): the Newtonian wall rate", () => {
    expectClose(apparentShearRate(Q, D), (4 * Q) / (Math.PI * R ** 3), { rel: 1e-14 });
    expectClose(flowRateForApparentShearRate(apparentShearRate(Q, D), D), Q, { rel: 1e-14 });
  });
  test("the flow integral of a Newtonian liquid gives γ̇_a = γ̇_w", () => {
    expectClose(apparentRateFromWallRate(() => WATER_20C, 250), 250, { rel: 1e-9 });
  });
});

describe("flow integral for a power-law liquid (closed form γ̇_w/γ̇_a = (3n+1)/(4n): Macosko 1994, ch. 6, from memory)", () => {
  for (const n of [0.2, 0.35, 0.5, 0.8]) {
    test(`n = ${n}`, () => {
      const eta = (g: number) => 1e4 * Math.pow(g, n - 1);
      expectClose(apparentRateFromWallRate(eta, 100) / 100, (4 * n) / (3 * n + 1), { rel: 1e-8 });
      expectClose(wallRateFromApparentRate(eta, 100), (100 * (3 * n + 1)) / (4 * n), { rel: 1e-9 });
    });
  }
});

describe("flow rate", () => {
  test("piston: Q = v·πD²/4 (1 mm/min in a 15 mm bore, by hand: 2.9452e-9 m³/s)", () => {
    expectClose(flowRateFromPiston(1e-3 / 60, 15e-3), 2.9452431e-9, { rel: 1e-7 });
    expectClose(pistonSpeedForFlowRate(2.9452431e-9, 15e-3), 1e-3 / 60, { rel: 1e-7 });
  });
  test("mass rate: Q = ṁ/ρ (6 g/min at 0.75 g/cm³ = 8 cm³/min, by hand)", () => {
    expectClose(flowRateFromMassRate(1e-4, 750), 8e-6 / 60, { rel: 1e-14 });
  });
  test("errors name the argument", () => {
    expect(() => flowRateFromPiston(-1, 0.015)).toThrow("pistonSpeed: must not be negative, got -1");
    expect(() => flowRateFromPiston(1, 0)).toThrow("barrelDiameter: must be greater than zero, got 0");
    expect(() => flowRateFromMassRate(1, NaN)).toThrow("density: must be a finite number, got NaN");
  });
});

describe("end-corrected wall stress (Bagley 1957)", () => {
  test("τ_w = (ΔP − ΔP_ent)·D/(4L) equals ΔP/(2(L/R + e)) when ΔP_ent = 2τ_w·e", () => {
    const tau = 5e4;
    const e = 3;
    const D = 1e-3;
    const L = 20e-3;
    const dp = 2 * tau * ((2 * L) / D + e);
    expectClose(correctedWallShearStress(dp, 2 * tau * e, D, L), tau, { rel: 1e-14 });
    expectClose(wallShearStressFromEndCorrection(dp, e, D, L), tau, { rel: 1e-14 });
  });
  test("viscosity = stress / rate", () => expectClose(viscosityFromStressAndRate(1e5, 200), 500, { rel: 1e-15 }));
  test("domain errors", () => {
    expect(() => apparentWallShearStress(-1, 1e-3, 1e-2)).toThrow("pressure: must not be negative, got -1");
    expect(() => apparentShearRate(1e-8, 0)).toThrow(RheoError);
    expect(() => viscosityFromStressAndRate(1, 0)).toThrow("shearRate: must be greater than zero, got 0");
    expect(() => wallShearStressFromEndCorrection(1e6, -50, 1e-3, 10e-3)).toThrow(/endCorrection: must be greater than zero/);
    expect(() => correctedWallShearStress(1e6, 2e6, 1e-3, 10e-3)).toThrow(
      "entrancePressure: (2000000 Pa) is not below the measured pressure (1000000 Pa): no pressure is left for the die land",
    );
    expect(() => correctedWallShearStress(1e6, NaN, 1e-3, 10e-3)).toThrow("entrancePressure: must be a finite number, got NaN");
  });
});
