/**
 * Invented demo scenario: "CP-12", a made-up highly filled ceramic paste tested by the made-up
 * Ostrelwick Ceramics development lab at 30 °C with a 15 mm barrel and three die bores (0.5, 1 and
 * 2 mm), each at L/D = 8, 16 and 24 (so every bore gets its own Bagley correction, with a check of
 * straightness). The paste slips at the die wall.
 *
 * The test is planned for a Mooney analysis: every bore runs the same ladder of apparent shear
 * rates, so its piston speed scales with D³ (γ̇_a = 32Q/(πD³), Q = v·πD_b²/4, so
 * v = γ̇_a·D³/(8·D_b²)); the bores then cover overlapping wall-stress ranges.
 *
 * The data are generated, not measured: a power-law viscosity η = K·γ̇^(n−1) (K = 9000 Pa·s^n,
 * n = 0.3) in the bulk, a wall slip velocity v_s = β·τ_w^m (m = 2.5, β set so that v_s = 2 mm/s at
 * τ_w = 30 kPa), and the Mooney (1931) relation for the apparent rate at wall stress τ_w:
 *
 *   γ̇_a = γ̇_a,noslip(τ_w) + 8·v_s/D,
 *
 * where γ̇_a,noslip comes from the exact capillary flow integral (src/core/forwardFlow.ts). The
 * measured pressure is ΔP = 2τ_w(L/R + e) with an entrance correction e = 4 + log10(γ̇_a) and
 * 0.5 % Gaussian noise (seed 12), written to 0.01 bar. The pressures run from about 8 to 87 bar:
 * inside the range of a 0–200 bar transducer (an invented choice). Smaller bores give higher
 * apparent rates at the same stress: the signature of slip.
 */
import { writeFileSync } from "node:fs";
import { apparentRateFromWallRate } from "../../src/core/forwardFlow";
import { gaussian, seededRandom } from "../../src/core/random";

export const PASTE_SLIP = {
  K: 9000,
  n: 0.3,
  slipExponent: 2.5,
  slipReferenceStress: 30e3,
  slipReferenceVelocity: 2e-3,
  temperatureC: 30,
  barrelDiameter: 15e-3,
  dieDiameters: [0.5e-3, 1e-3, 2e-3],
  lengthOverDiameter: [8, 16, 24],
  /** piston speeds of the 1 mm bore, mm/min; bore D runs at these × (D / 1 mm)³ (the same apparent rates) */
  referenceDiameter: 1e-3,
  pistonSpeedsMmMin: [0.5, 1, 2, 4, 8, 16, 32],
  pressureNoise: 0.005,
  /** decimals of the pressure in bar as written */
  pressureDigits: 2,
  seed: 12,
};

/** The scenario's settings (PASTE_SLIP, or a variant of it for studies of the noise). */
export type PasteSlipScenario = typeof PASTE_SLIP;

/** Bulk viscosity η(γ̇) = K·γ̇^(n−1), Pa·s. */
export function pasteViscosity(rate: number): number {
  return PASTE_SLIP.K * Math.pow(rate, PASTE_SLIP.n - 1);
}

/** Slip velocity v_s = β·τ^m, m/s, with β fixed by the reference point. */
export function pasteSlipVelocity(stress: number): number {
  const p = PASTE_SLIP;
  return p.slipReferenceVelocity * Math.pow(stress / p.slipReferenceStress, p.slipExponent);
}

/** Apparent rate with slip at wall rate `wallRate` (1/s) in a die of bore `diameter` (m). */
export function pasteApparentRate(wallRate: number, diameter: number): number {
  const stress = pasteViscosity(wallRate) * wallRate;
  return apparentRateFromWallRate(pasteViscosity, wallRate) + (8 * pasteSlipVelocity(stress)) / diameter;
}

/** The wall stress at which the slipping paste gives apparent rate `rateApp` in bore `diameter` (bisection in ln γ̇_w). */
export function pasteWallStress(rateApp: number, diameter: number): number {
  let lo = Math.log(rateApp * 1e-6);
  let hi = Math.log(rateApp * 10);
  for (let i = 0; i < 70; i++) {
    const mid = (lo + hi) / 2;
    if (pasteApparentRate(Math.exp(mid), diameter) < rateApp) lo = mid;
    else hi = mid;
  }
  const wall = Math.exp((lo + hi) / 2);
  return pasteViscosity(wall) * wall;
}

/** Piston speed (mm/min) of bore `diameter` (m) at the `k`-th step of the ladder: v_ref·(D/D_ref)³, the same apparent rate in every bore. */
export function pastePistonSpeed(k: number, diameter: number, scenario: PasteSlipScenario = PASTE_SLIP): number {
  const ratio = Math.round((diameter / scenario.referenceDiameter) * 1e6) / 1e6;
  return (scenario.pistonSpeedsMmMin[k] as number) * ratio ** 3;
}

/**
 * CSV rows of the scenario (header first). `overrides` changes settings of PASTE_SLIP (e.g. the
 * seed, the noise or the test plan, for studies of the method's accuracy); the generating laws stay fixed.
 */
export function pasteSlipRows(overrides: Partial<Pick<PasteSlipScenario, "seed" | "pressureNoise" | "pressureDigits" | "pistonSpeedsMmMin" | "lengthOverDiameter">> = {}): string[][] {
  const p: PasteSlipScenario = { ...PASTE_SLIP, ...overrides };
  const random = seededRandom(p.seed);
  const rows: string[][] = [["temperature [C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", "pressure [bar]"]];
  for (const D of p.dieDiameters) {
    const speeds = p.pistonSpeedsMmMin.map((_, k) => pastePistonSpeed(k, D, p));
    // the wall stress depends on the bore and the rate, not on the die length
    const stresses = speeds.map((v) => {
      const q = ((v * 1e-3) / 60) * (Math.PI * p.barrelDiameter ** 2) / 4;
      const rateApp = (32 * q) / (Math.PI * D ** 3);
      return { rateApp, tau: pasteWallStress(rateApp, D) };
    });
    for (const ld of p.lengthOverDiameter) {
      const L = ld * D;
      speeds.forEach((v, k) => {
        const { rateApp, tau } = stresses[k] as { rateApp: number; tau: number };
        const e = 4 + Math.log10(rateApp);
        const pressure = 2 * tau * ((2 * L) / D + e) * (1 + p.pressureNoise * gaussian(random));
        rows.push([String(p.temperatureC), String(+(D * 1e3).toFixed(3)), String(+(L * 1e3).toFixed(3)), String(+(p.barrelDiameter * 1e3).toFixed(3)), String(+v.toPrecision(12)), (pressure / 1e5).toFixed(p.pressureDigits)]);
      });
    }
  }
  return rows;
}

if (require.main === module || process.argv[1]?.endsWith("pasteSlip.cjs")) {
  const out = process.argv[2] ?? "workbooks/demo-paste-slip.csv";
  const header = "# Invented demo data (not a real material or lab): see scripts/demo/pasteSlip.ts\n";
  writeFileSync(out, header + pasteSlipRows().map((r) => r.join(",")).join("\n") + "\n");
  console.log(`wrote ${out}`);
}
