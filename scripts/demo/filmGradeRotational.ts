/**
 * The rotational curve behind the film-grade demo (invented: no real material or instrument):
 * complex viscosity against angular frequency at 210 °C from the demo's own generating law under
 * the Cox–Merz rule (|η*|(ω) = η(γ̇ = ω), Cox & Merz, J. Polym. Sci. 28 (1958) 619), 0.01–30 rad/s,
 * 16 frequencies, with 1 % Gaussian noise (seed 211). Joined to the capillary curve with
 * `rheoledger reduce workbooks/demo-film-grade.csv --rotational workbooks/demo-film-grade-rotational.csv`
 * it pins down the zero-shear viscosity that the capillary data alone cannot reach.
 */
import { gaussian, seededRandom } from "../../src/core/random";
import { filmGradeViscosity } from "./filmGrade";

export const FILM_GRADE_ROTATIONAL = Object.freeze({ temperatureC: 210, lowest: 0.01, highest: 30, count: 16, noise: 0.01, seed: 211 });

/** The rotational CSV text (one header row of `quantity [unit]` cells, a comment line first). */
export function filmGradeRotationalCsv(p = FILM_GRADE_ROTATIONAL): string {
  const eta = filmGradeViscosity(p.temperatureC + 273.15);
  const random = seededRandom(p.seed);
  const rows = Array.from({ length: p.count }, (_, i) => {
    const omega = p.lowest * Math.pow(p.highest / p.lowest, i / (p.count - 1));
    const value = eta(omega) * (1 + p.noise * gaussian(random));
    return `${Number(omega.toPrecision(4))},${Number(value.toPrecision(5))},${p.temperatureC}`;
  });
  return ["# Invented demo data (not a real material or lab): see scripts/demo/filmGradeRotational.ts", "angular_frequency [rad/s],complex_viscosity [Pa.s],temperature [C]", ...rows].join("\n") + "\n";
}
