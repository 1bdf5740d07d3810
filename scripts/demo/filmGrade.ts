/**
 * Invented demo scenario: "QF-207", a made-up low-density film grade tested by the made-up
 * Quillfen Films QC lab at 190, 210 and 230 °C, three dies of 1 mm bore (L = 10, 20, 30 mm),
 * a 15 mm barrel and a ladder of nine piston speeds.
 *
 * The data are generated, not measured: a Carreau–Yasuda viscosity (η0 = 6000 Pa·s at 210 °C,
 * λ = 0.6 s, a = 0.8, n = 0.38) shifted with an Arrhenius activation energy of 55 kJ/mol, the
 * exact capillary flow integral for the wall stress, an entrance loss of 2τ_w·e with
 * e = 2 + 1.5·log10(γ̇_a), and 0.5 % Gaussian noise on every pressure (seed 207).
 *
 * With `{ orifice: true }` the rows of an orifice die (L = 0.25 mm, same bore) follow the long dies,
 * from the same pressure law at L/R = 0.5: ΔP = 2τ_w(0.5 + e). The long-die rows are unchanged
 * (the noise stream reaches the orifice rows last), so the CSV the demo reads stays the same.
 */
import { writeFileSync } from "node:fs";
import { wallRateFromApparentRate } from "../../src/core/forwardFlow";
import { gaussian, seededRandom } from "../../src/core/random";

export const FILM_GRADE = {
  eta0: 6000,
  lambda: 0.6,
  a: 0.8,
  n: 0.38,
  activationEnergy: 55e3,
  referenceTemperature: 483.15,
  barrelDiameter: 15e-3,
  dieDiameter: 1e-3,
  dieLengths: [10e-3, 20e-3, 30e-3],
  orificeLength: 0.25e-3,
  temperaturesC: [190, 210, 230],
  pistonSpeedsMmMin: [0.6, 1.2, 2.5, 5, 10, 20, 40, 80, 120],
  pressureNoise: 0.005,
  seed: 207,
};

const R = 8.314462618;

function viscosityAt(temperatureK: number) {
  const p = FILM_GRADE;
  const aT = Math.exp((p.activationEnergy / R) * (1 / temperatureK - 1 / p.referenceTemperature));
  return (rate: number) => aT * p.eta0 * Math.pow(1 + Math.pow(p.lambda * aT * rate, p.a), (p.n - 1) / p.a);
}

/** Viscosity function η(γ̇) of the invented grade at `temperatureK` (for recovery tests). */
export const filmGradeViscosity = viscosityAt;

/**
 * The noise-free pressure of the grade (viscosity function `eta` at one temperature) on a die of
 * length L (m) at piston speed v (mm/min), Pa: 2τ_w(L/R + e), e = 2 + 1.5·log10(γ̇_a).
 */
function steadyPressure(eta: (rate: number) => number, L: number, v: number): number {
  const p = FILM_GRADE;
  const q = ((v * 1e-3) / 60) * (Math.PI * p.barrelDiameter ** 2) / 4;
  const rateApp = (32 * q) / (Math.PI * p.dieDiameter ** 3);
  const wall = wallRateFromApparentRate(eta, rateApp);
  const tau = eta(wall) * wall;
  const e = 2 + 1.5 * Math.log10(rateApp);
  return 2 * tau * ((2 * L) / p.dieDiameter + e);
}

/** The noise-free pressure at `temperatureC` on a die of length L (m) at v (mm/min), Pa. */
export function filmGradePressure(temperatureC: number, L: number, v: number): number {
  return steadyPressure(viscosityAt(temperatureC + 273.15), L, v);
}

/**
 * CSV rows of the scenario (header first): the long dies at every temperature, then with
 * `orifice` the orifice die at every temperature.
 */
export function filmGradeRows(options: { orifice?: boolean } = {}): string[][] {
  const p = FILM_GRADE;
  const random = seededRandom(p.seed);
  const rows: string[][] = [["temperature [C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", "pressure [bar]"]];
  const lengthSets = options.orifice ? [p.dieLengths, [p.orificeLength]] : [p.dieLengths];
  for (const lengths of lengthSets) for (const tC of p.temperaturesC) {
    const eta = viscosityAt(tC + 273.15);
    for (const L of lengths) {
      for (const v of p.pistonSpeedsMmMin) {
        const pressure = steadyPressure(eta, L, v) * (1 + p.pressureNoise * gaussian(random));
        rows.push([String(tC), "1", String(L * 1e3), "15", String(v), (pressure / 1e5).toFixed(2)]);
      }
    }
  }
  return rows;
}

if (require.main === module || process.argv[1]?.endsWith("filmGrade.cjs")) {
  const out = process.argv[2] ?? "workbooks/demo-film-grade.csv";
  const header = "# Invented demo data (not a real material or lab): see scripts/demo/filmGrade.ts\n";
  writeFileSync(out, header + filmGradeRows().map((r) => r.join(",")).join("\n") + "\n");
  console.log(`wrote ${out}`);
}
