/**
 * The equations and references of the reduction steps a run used, for every method record: the
 * task pane's method sheet and the command line's workbook and HTML report. One list, so that the
 * record says the same thing on every surface.
 */
import { getModel } from "../core/models";
import type { ReductionResult } from "../core/reduce";
import { DEFAULT_UNCERTAINTY_OPTIONS } from "../core/uncertainty";

/** One equation of the record: step, formula in plain text, reference. */
export type EquationLine = [step: string, formula: string, reference: string];

/** What decides which equations a run used. */
export interface EquationInputs {
  result: ReductionResult;
  /** the end correction applied */
  endCorrection: "bagley" | "none" | "orifice";
  /** the Rabinowitsch slope method (transition, local, global, difference) */
  rabinowitschMethod: string;
  /** the column the flow rate came from (null: not known) */
  flowSource: "flow_rate" | "piston_speed" | "mass_rate" | null;
  /** ids of the models fitted (any group) */
  fittedModels: readonly string[];
  /** the temperature-shift law fitted, or null */
  shiftLaw: "arrhenius" | "wlf" | null;
}

/** The equations of the steps a run used, in order. */
export function equationsUsed(run: EquationInputs): EquationLine[] {
  const lines: EquationLine[] = [];
  if (run.flowSource === "flow_rate") lines.push(["Flow rate", "Q read from the flow_rate column", "-"]);
  else if (run.flowSource === "piston_speed") lines.push(["Flow rate", "Q = v_p·π·D_b²/4 (piston speed v_p, barrel bore D_b)", "volume displaced by the piston"]);
  else if (run.flowSource === "mass_rate") lines.push(["Flow rate", "Q = ṁ/ρ (mass rate, melt density)", "definition of density"]);
  lines.push(["Apparent wall shear rate", "γ̇_a = 32Q/(π·D³)", "Hagen–Poiseuille; Macosko 1994, §6.2"]);
  lines.push(["Apparent wall shear stress", "τ_app = ΔP·D/(4L)", "force balance on the melt in the die; Macosko 1994, §6.2"]);
  if (run.endCorrection === "bagley") {
    lines.push(["Bagley end correction", "ΔP = 2τ_w·(L/R + e) fitted over die lengths at each γ̇_a; τ_w = slope/2, e = intercept/slope", "Bagley, J. Appl. Phys. 28 (1957) 624"]);
    lines.push(["Std. error of τ_w", "s(τ_w) = s(slope)/2 from the least-squares line (three or more dies)", "ordinary least squares"]);
  } else if (run.endCorrection === "orifice") {
    lines.push(["Orifice end correction", "τ_w = (ΔP_long − ΔP_orifice)·D/(4L) at the same γ̇_a (orifice die: L/D below 1, pressure interpolated log–log)", "Macosko 1994, §6.2.2; Dealy & Wang 2013, §6.3"]);
  } else {
    lines.push(["No end correction", "τ_w = τ_app of the longest die (entrance loss included)", "-"]);
  }
  if (run.result.groups.some((g) => g.entrancePressures)) {
    lines.push(["Entrance pressure, two ways", "Bagley intercept ΔP_ent beside the orifice die's pressure at the same γ̇_a; difference = Bagley/orifice − 1", "Dealy & Wang 2013, §6.3"]);
  }
  lines.push(["Rabinowitsch correction", "γ̇_w = γ̇_a·(3n' + 1)/(4n'), n' = d ln τ_w / d ln γ̇_a", "Rabinowitsch, Z. Phys. Chem. A145 (1929) 1"]);
  lines.push(["Slope n'", `${run.rabinowitschMethod} method (see settings)`, "Macosko 1994, eq. 6.2.15"]);
  lines.push(["Viscosity", "η = τ_w/γ̇_w; apparent η_a = τ_w/γ̇_a", "definition"]);
  const groups = run.result.groups;
  if (groups.some((g) => g.uncertainty)) {
    lines.push([
      "Uncertainty (± columns)",
      `u_P = a·FS/√3 (rectangular); Bagley u(τ_w) = ½√(u_P²/Sxx + SE_slope²); u(n') from neighbouring points; u(γ̇_w) = γ̇_a·|df/dn'|·u(n'); u_r(η)² = u_r(τ_w)² + u_r(γ̇_w)²; shown U = k·u, k = ${DEFAULT_UNCERTAINTY_OPTIONS.coverageFactor}`,
      "JCGM 100:2008 (GUM), §4.3.7 and §5.1",
    ]);
    lines.push(["Transducer range check", `readings below ${DEFAULT_UNCERTAINTY_OPTIONS.minFractionOfFullScale * 100} % of full scale or above full scale are flagged`, "common practice, no source"]);
  }
  if (groups.some((g) => g.representativeRate)) {
    lines.push(["Schümmer cross-check", "γ̇* = (π/4)·γ̇_a, η* = τ_w/γ̇_a; compared with the Rabinowitsch η interpolated log–log at γ̇*", "Schümmer & Worthoff, Chem. Eng. Sci. 33 (1978) 759"]);
  }
  if (groups.some((g) => g.extensional)) {
    lines.push(["Extensional viscosity", "σ_E = (3/8)(n + 1)ΔP_ent; ε̇ = 4ηγ̇²/(3(n + 1)ΔP_ent); η_E = σ_E/ε̇; Trouton ratio η_E/η", "Cogswell, Polym. Eng. Sci. 12 (1972) 64"]);
  }
  if (groups.some((g) => g.heating)) {
    lines.push(["Viscous heating", "ΔT_ad = ΔP/(ρ·c_p); Nahme number Na = b·η·γ̇_w²·R²/k; b fitted: Arrhenius b = Ea/(R·T²)", "Winter, Adv. Heat Transfer 13 (1977) 205; Macosko 1994, §6.2.5"]);
  }
  if (groups.some((g) => g.pressureDependence)) {
    lines.push(["Pressure dependence", "Barus η = η_0·exp(β·p): ΔP = ΔP_ent − ln(1 − β·2τ_0·x)/β fitted per rate over three or more dies", "Duvdevani & Klein, SPE J. 23 (1967) 41; Laun, Rheol. Acta 43 (2004) 509"]);
  }
  if (run.result.slip) {
    lines.push(["Wall slip", "γ̇_a = γ̇_a,noslip(τ_w) + 4v_s/R at equal τ_w across die bores; slope 4v_s, intercept the slip-corrected rate", "Mooney, J. Rheol. 2 (1931) 210"]);
  }
  if (run.shiftLaw) {
    const ref = "T_ref the reference temperature";
    lines.push(
      run.shiftLaw === "arrhenius"
        ? ["Temperature shift", `a_T = exp[(Ea/R)(1/T − 1/T_ref)], ${ref}; one joint fit of Ea and a polynomial master curve in ln(a_T·γ̇)`, "Dealy & Wang, Melt Rheology (2013), ch. 4"]
        : ["Temperature shift", `log10 a_T = −C1(T − T_ref)/(C2 + T − T_ref), ${ref}; one joint fit of C1, C2 and a polynomial master curve`, "Williams, Landel & Ferry, J. Am. Chem. Soc. 77 (1955) 3701"],
    );
    lines.push(["Master curve", "reduced rate a_T·γ̇, reduced viscosity η/a_T", "Dealy & Wang, Melt Rheology (2013), ch. 4"]);
  }
  const fitted = new Set(run.fittedModels);
  for (const id of fitted) {
    const m = getModel(id);
    lines.push([`Model ${id}`, m.formula, m.reference]);
  }
  if (fitted.size > 0) {
    lines.push(["Model fit", "least squares on ln η (Levenberg–Marquardt); 95 % intervals from Student t", "Seber & Wild, Nonlinear Regression (1989)"]);
    lines.push(["Model ranking", "AIC; ΔAIC_i = AIC_i − min AIC; Akaike weight w_i = exp(−ΔAIC_i/2)/Σ exp(−ΔAIC_j/2)", "Burnham & Anderson 2002, §2.9"]);
  }
  return lines;
}

