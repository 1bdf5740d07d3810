/**
 * Invented demo scenario: "Velmora", a made-up savoury spread (a yield-stress food paste) tested
 * by the made-up Brindlecote Foods pilot lab at 20 °C on three dies of 2 mm bore
 * (L = 20, 40, 60 mm), a 20 mm barrel and a ladder of piston speeds.
 *
 * The data are generated, not measured: a Herschel–Bulkley liquid τ = τ_y + K·γ̇^n (τ_y = 60 Pa,
 * K = 15 Pa·s^n, n = 0.5; Herschel & Bulkley 1926), the exact capillary flow integral for the
 * apparent rate (src/core/forwardFlow.ts; the unyielded plug contributes no shear), an entrance
 * correction e = 1.5 + 0.5·log10(γ̇_a) and 0.8 % Gaussian noise on every pressure (seed 26).
 */
import { writeFileSync } from "node:fs";
import { wallRateFromApparentRate } from "../../src/core/forwardFlow";
import { gaussian, seededRandom } from "../../src/core/random";

export const CREAM_YIELD = {
  tauY: 60,
  K: 15,
  n: 0.5,
  temperatureC: 20,
  barrelDiameter: 20e-3,
  dieDiameter: 2e-3,
  dieLengths: [20e-3, 40e-3, 60e-3],
  pistonSpeedsMmMin: [0.5, 1, 2, 5, 10, 20, 50, 100, 200],
  pressureNoise: 0.008,
  seed: 26,
};

/** Herschel–Bulkley viscosity η(γ̇) = τ_y/γ̇ + K·γ̇^(n−1), Pa·s. */
export function creamViscosity(rate: number): number {
  const p = CREAM_YIELD;
  return p.tauY / rate + p.K * Math.pow(rate, p.n - 1);
}

/** CSV rows of the scenario (header first). Pressures in kPa (they are small). */
export function creamYieldRows(): string[][] {
  const p = CREAM_YIELD;
  const random = seededRandom(p.seed);
  const rows: string[][] = [["temperature [C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", "pressure [kPa]"]];
  for (const L of p.dieLengths) {
    for (const v of p.pistonSpeedsMmMin) {
      const q = ((v * 1e-3) / 60) * (Math.PI * p.barrelDiameter ** 2) / 4;
      const rateApp = (32 * q) / (Math.PI * p.dieDiameter ** 3);
      const wall = wallRateFromApparentRate(creamViscosity, rateApp);
      const tau = creamViscosity(wall) * wall;
      const e = 1.5 + 0.5 * Math.log10(rateApp);
      const pressure = 2 * tau * ((2 * L) / p.dieDiameter + e) * (1 + p.pressureNoise * gaussian(random));
      rows.push([String(p.temperatureC), "2", String(+(L * 1e3).toFixed(3)), "20", String(v), (pressure / 1e3).toFixed(3)]);
    }
  }
  return rows;
}

if (require.main === module || process.argv[1]?.endsWith("creamYield.cjs")) {
  const out = process.argv[2] ?? "workbooks/demo-cream-yield.csv";
  const header = "# Invented demo data (not a real material or lab): see scripts/demo/creamYield.ts\n";
  writeFileSync(out, header + creamYieldRows().map((r) => r.join(",")).join("\n") + "\n");
  console.log(`wrote ${out}`);
}
