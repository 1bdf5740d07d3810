/**
 * The equations and references of the reduction steps a run used, for every method record: the
 * task pane's method sheet and the command line's workbook and HTML report. One list, so that the
 * record says the same thing on every surface. The formulas follow the geometry that was reduced
 * (round dies, slits, or both) and the options that were on.
 */
import { getModel } from "../core/models";
import type { ReductionResult } from "../core/reduce";
import { DEFAULT_UNCERTAINTY_OPTIONS } from "../core/uncertainty";
import type { VerticalShift } from "../core/temperature";
import { DEFAULT_VERDICT_OPTIONS } from "../core/fit/verdict";
import { DEFAULT_DETERMINATION_LIMITS } from "../core/fit/determination";

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
  /** how the WLF C2 was found and whether the vertical shift was applied (the shift fit's fields) */
  shiftDetail?: { C2Source?: "fitted" | "held" | "universal"; verticalShift?: VerticalShift };
  /** the fit across temperatures: its model and law (null for Cross-WLF's own law), if any */
  master?: { model: string; law: "arrhenius" | "wlf" | null } | null;
  /** the rotational curve joined: oscillatory (Cox–Merz) or steady shear, if any */
  joined?: { kind: "oscillatory" | "steady" } | null;
}

/** The equations of the steps a run used, in order. */
export function equationsUsed(run: EquationInputs): EquationLine[] {
  const lines: EquationLine[] = [];
  const groups = run.result.groups;
  const round = groups.length === 0 || groups.some((g) => g.geometry !== "slit");
  const slit = groups.some((g) => g.geometry === "slit");
  if (run.flowSource === "flow_rate") lines.push(["Flow rate", "Q read from the flow_rate column", "-"]);
  else if (run.flowSource === "piston_speed") lines.push(["Flow rate", "Q = v_p·π·D_b²/4 (piston speed v_p, barrel bore D_b)", "volume displaced by the piston"]);
  else if (run.flowSource === "mass_rate") lines.push(["Flow rate", "Q = ṁ/ρ (mass rate, melt density)", "definition of density"]);
  if (round) {
    lines.push(["Apparent wall shear rate", "γ̇_a = 32Q/(π·D³)", "Hagen–Poiseuille; Macosko 1994, ch. 6 (from memory)"]);
    lines.push(["Apparent wall shear stress", "τ_app = ΔP·D/(4L)", "force balance on the melt in the die; Macosko 1994, ch. 6 (from memory)"]);
  }
  if (slit) {
    lines.push(["Apparent wall shear rate (slit)", "γ̇_a = 6Q/(W·H²)", "plane Poiseuille flow; Macosko 1994, ch. 6 (from memory); ISO 11443"]);
    lines.push(["Apparent wall shear stress (slit)", "τ_app = ΔP·H/(2L)", "force balance between parallel plates; Macosko 1994, ch. 6 (from memory)"]);
  }
  const x = [round ? "x = L/R" : "", slit ? "x = L/H for the slit" : ""].filter(Boolean).join(", ");
  if (run.endCorrection === "bagley") {
    lines.push(["Bagley end correction", `ΔP = ΔP_ent + 2τ_w·x fitted over die lengths at each γ̇_a (${x}); τ_w = slope/2, e = intercept/slope`, "Bagley, J. Appl. Phys. 28 (1957) 624"]);
    lines.push(["Std. error of τ_w", "s(τ_w) = s(slope)/2 from the least-squares line (three or more dies)", "ordinary least squares"]);
  } else if (run.endCorrection === "orifice") {
    lines.push([
      "Orifice end correction",
      `τ_w = (ΔP_long − ΔP_orifice)/(2(x_long − x_orifice)) at the same γ̇_a (${x}; the orifice's own land subtracted; orifice: L/D below 1, pressure interpolated log–log); ΔP_ent = ΔP_orifice − 2τ_w·x_orifice`,
      "Bagley 1957 (a line through two dies); Macosko 1994, ch. 6; Dealy & Wang 2013 (from memory)",
    ]);
  } else {
    lines.push(["No end correction", "τ_w = τ_app of the longest die (entrance loss included)", "-"]);
  }
  if (groups.some((g) => g.entrancePressures)) {
    lines.push(["Entrance pressure, two ways", "Bagley intercept ΔP_ent beside the orifice die's reading less its land, ΔP_o − 2τ_w·x_o, at the same γ̇_a; difference = Bagley/orifice − 1", "Dealy & Wang 2013 (from memory)"]);
  }
  if (round) lines.push(["Rabinowitsch correction", "γ̇_w = γ̇_a·(3n' + 1)/(4n'), n' = d ln τ_w / d ln γ̇_a", "Rabinowitsch, Z. Phys. Chem. A145 (1929) 1"]);
  if (slit) lines.push(["Rabinowitsch correction (slit)", "γ̇_w = γ̇_a·(2n' + 1)/(3n')", "Macosko 1994, ch. 6 (from memory)"]);
  lines.push(["Slope n'", `${run.rabinowitschMethod} method (see settings)`, "Macosko 1994, ch. 6 (from memory)"]);
  if (groups.some((g) => g.slitShapeFactor !== undefined)) {
    lines.push(["Slit edge correction", "γ̇_w divided by F = 1 − (192/π⁵)(H/W)·Σ_odd i tanh(iπW/(2H))/i⁵, the channel's Newtonian shape factor", "White, Viscous Fluid Flow, ch. 3; Shah & London 1978 (from memory)"]);
  }
  lines.push(["Viscosity", "η = τ_w/γ̇_w; apparent η_a = τ_w/γ̇_a", "definition"]);
  if (groups.some((g) => g.uncertaintyBudget)) {
    lines.push([
      "Uncertainty (± columns)",
      `each input moved by its standard uncertainty u = a/√3 (rectangular) through the end correction and the smoother's n′: transducer zero and gain (one error shared by all readings; the zero cancels in the Bagley slope), reading scatter (plateau deviations, else the Bagley standard error), each die's bore and length, piston speed, melt temperature through the shift law; u_c = root sum of squares; shown U = k·u_c, k = 2`,
      "JCGM 100:2008 (GUM), 4.3.7 and 5.1; checked against JCGM 101:2008 (Monte Carlo)",
    ]);
    lines.push(["Transducer range check", `readings below ${DEFAULT_UNCERTAINTY_OPTIONS.minFractionOfFullScale * 100} % of full scale or above full scale are flagged`, "common practice, no source"]);
  }
  if (groups.some((g) => g.representativeRate)) {
    lines.push([
      "Schümmer cross-check",
      "γ̇* = (π/4)·γ̇_a, η* = τ_w/γ̇_a; compared with the Rabinowitsch η interpolated log–log at γ̇*, less the method's own bias ((3n'+1)/(4n'))^n'·(4/π)^(n'−1)",
      "Schümmer & Worthoff, Chem. Eng. Sci. 33 (1978) 759 (from memory)",
    ]);
  }
  const ext = groups.flatMap((g) => g.extensional ?? []);
  if (ext.length > 0) {
    const basis = ext[0]?.shearRateBasis === "wall" ? "γ̇ the true wall rate, η = τ_w/γ̇_w" : "γ̇ the apparent rate 4Q/(πR³), η = τ_w/γ̇_a, as Cogswell derived it";
    lines.push(["Extensional viscosity", `σ_E = (3/8)(n + 1)ΔP_ent; ε̇ = 4ηγ̇²/(3(n + 1)ΔP_ent); η_E = σ_E/ε̇; Trouton ratio η_E/η; ${basis}`, "Cogswell, Polym. Eng. Sci. 12 (1972) 64"]);
  }
  if (groups.some((g) => g.heating)) {
    lines.push([
      "Viscous heating",
      "ΔT_ad = ΔP/(ρ·c_p); V = Q/A; Nahme–Griffith Na = n'·b·η·V²/k (b the shift-law coefficient, Arrhenius b = Ea/(R·T²)); Brinkman Br = η·V²/(k·ΔT_ref); Graetz Gz = ρc_p·V·R²/(k·L)",
      "Winter, Adv. Heat Transfer 13 (1977) 205; Bird, Armstrong & Hassager 1987, ch. 4 (from memory)",
    ]);
  }
  if (groups.some((g) => g.pressureDependence)) {
    lines.push(["Pressure dependence", "ΔP = ΔP_ent − ln(1 − β_γ·2τ_0·x)/β_γ fitted per rate over three or more dies; β_γ = n'·β, β the constant-stress coefficient", "Duvdevani & Klein, SPE J. 23 (1967) 41; Laun, Rheol. Acta 43 (2004) 509"]);
  }
  if (run.result.slip) {
    lines.push(["Wall slip", "γ̇_a = γ̇_a,noslip(τ_w) + 4v_s/R at equal τ_w across die bores; slope 4v_s, intercept the slip-corrected rate; a negative slope leaves the stress uncorrected", "Mooney, J. Rheol. 2 (1931) 210"]);
  }
  if (run.shiftLaw) {
    const ref = "T_ref the reference temperature";
    if (run.shiftLaw === "arrhenius") {
      lines.push(["Temperature shift", `a_T = exp[(Ea/R)(1/T − 1/T_ref)], ${ref}; one joint fit of Ea and a polynomial master curve in ln(a_T·γ̇)`, "Dealy & Wang, Melt Rheology (2013), ch. 4"]);
    } else {
      const c2 = run.shiftDetail?.C2Source === "universal" ? "C2 held at 51.6 K + T_ref − T_g (the universal constants converted to T_ref), C1 fitted" : run.shiftDetail?.C2Source === "held" ? "C2 held, C1 fitted" : "one joint fit of C1, C2";
      lines.push(["Temperature shift", `log10 a_T = −C1(T − T_ref)/(C2 + T − T_ref), ${ref}; ${c2} and a polynomial master curve`, "Williams, Landel & Ferry, J. Am. Chem. Soc. 77 (1955) 3701"]);
    }
    if (run.shiftDetail?.verticalShift) {
      lines.push(["Vertical shift", "b_T = ρ(T)·T/(ρ_ref·T_ref), ρ(T) = ρ_ref·exp(−α(T − T_ref)); η(γ̇, T) = a_T·b_T·η_ref(a_T·γ̇)", "Ferry, Viscoelastic Properties of Polymers (1980), ch. 11 (from memory)"]);
    }
    lines.push(["Master curve", run.shiftDetail?.verticalShift ? "reduced rate a_T·γ̇, reduced viscosity η/(a_T·b_T)" : "reduced rate a_T·γ̇, reduced viscosity η/a_T", "Dealy & Wang, Melt Rheology (2013), ch. 4"]);
  }
  const fitted = new Set(run.fittedModels);
  for (const id of fitted) {
    const m = getModel(id);
    lines.push([`Model ${id}`, m.formula, m.reference]);
  }
  if (fitted.size > 0) {
    lines.push(["Model fit", "least squares on ln η (Levenberg–Marquardt); 95 % intervals from Student t, in ln p for positive parameters", "Seber & Wild, Nonlinear Regression (1989)"]);
    lines.push(["Model ranking", "AIC; ΔAIC_i = AIC_i − min AIC; Akaike weight w_i = exp(−ΔAIC_i/2)/Σ exp(−ΔAIC_j/2)", "Burnham & Anderson 2002, §2.9"]);
    lines.push([
      "Recommended model",
      `adequate (ΔAIC ≤ ${DEFAULT_VERDICT_OPTIONS.maxDeltaAic}) and well determined (finite covariance, every free parameter's relative standard error ≤ ${DEFAULT_DETERMINATION_LIMITS.maxRelativeStandardError * 100} %, none at a bound, η0 and λ inside the measured rates), lowest AIC; else the simplest adequate model with its undetermined parameters named`,
      "Burnham & Anderson 2002, §2.6 (ΔAIC > 10: essentially no support; from memory); limits common practice, no source",
    ]);
  }
  if (run.master) {
    const law = run.master.law === "arrhenius" ? "a_T = exp[(Ea/R)(1/T − 1/T_ref)]" : run.master.law === "wlf" ? "log10 a_T = −c1(T − T_ref)/(c2 + T − T_ref)" : "Cross-WLF's own law";
    lines.push([
      "Fit across temperatures",
      run.master.model === "cross-wlf"
        ? "η = η0(T)/(1 + (η0γ̇/τ*)^(1−n)), log10 η0 = log10 D1 − A1(T − D2)/(Ã2 + T − D2) (D3 held 0); one least-squares fit on ln η over every temperature"
        : `η(γ̇, T) = a_T·η_ref(a_T·γ̇) with ${getModel(run.master.model).formula} at T_ref and ${law}; one least-squares fit on ln η over every temperature`,
      run.master.model === "cross-wlf" ? "Hieber & Shen, J. Non-Newton. Fluid Mech. 7 (1980) 1 (from memory)" : "Dealy & Wang, Melt Rheology (2013), ch. 4",
    ]);
  }
  if (run.joined) {
    lines.push([
      "Rotational data joined",
      `${run.joined.kind === "oscillatory" ? "Cox–Merz rule: η(γ̇) = |η*|(ω) at γ̇ = ω; " : ""}overlap ratio = geometric mean of η_rot/η_cap at every point of either curve inside the other's range (log–log interpolation); the joined curve fitted as one`,
      run.joined.kind === "oscillatory" ? "Cox & Merz, J. Polym. Sci. 28 (1958) 619" : "-",
    ]);
  }
  return lines;
}
