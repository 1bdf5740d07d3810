/**
 * The reduce runs the workbook tests share: every option on, formula-like user text, and an ideal
 * Newtonian liquid (a singular fit for any model with a plateau).
 */

/** Every reduce option on the film-grade demo (the invented data of scripts/demo/filmGrade.ts). */
export const EVERY_OPTION = ["--shift", "arrhenius", "--tref", "210 C", "--representative", "--extensional", "--transducer", "700 bar, 0.25 %", "--heating", "density=0.76 g/cm3, cp=2.3 kJ/(kg.K), k=0.25 W/(m.K)", "--pressure", "--compare", "power-law,cross,carreau", "--model", "cross", "--mfr", "16 cm3/10min, 2.16 kg"];

/** Text a user might type that a spreadsheet would take for a formula. */
export const FORMULA_LIKE = { material: '=HYPERLINK("http://example.invalid","x")', conditioning: "+1+1", preheatTime: "-L20", dieEntryAngle: "@P50", remarks: "\tTAB=1", extrudateObservations: "\rCR=1" };

/** CSV of an ideal Newtonian liquid in three dies (Hagen–Poiseuille, e = 1): every model but the simplest is singular. */
export function newtonianCsv(viscosity: number): string {
  const D = 1e-3;
  const lines = ["die_diameter [mm],die_length [mm],flow_rate [mm3/s],pressure [bar],temperature [C]"];
  for (const L of [10e-3, 20e-3, 30e-3]) {
    for (const q of [1, 2, 5, 10, 20, 50, 100]) {
      const Q = q * 1e-9;
      const rate = (32 * Q) / (Math.PI * D ** 3);
      // ΔP = 2τ_w(L/R + e), τ_w = ηγ̇ (Hagen–Poiseuille for a Newtonian liquid; Bagley with e = 1)
      const pressure = 2 * viscosity * rate * (L / (D / 2) + 1);
      lines.push(`1,${L * 1e3},${q},${pressure / 1e5},200`);
    }
  }
  return lines.join("\n") + "\n";
}

