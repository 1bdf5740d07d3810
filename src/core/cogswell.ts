/**
 * Extensional viscosity from the entrance pressure loss (Cogswell, Polym. Eng. Sci. 12 (1972) 64;
 * Macosko 1994, ch. 6, from memory; Dealy & Wang 2013, from memory). Converging flow into a round die is treated
 * as a sum of shear and extension; with n the local power-law index, η the shear viscosity and
 * γ̇ the shear rate at the entrance pressure ΔP_ent:
 *
 *   σ_E = (3/8)(n + 1)·ΔP_ent                 (tensile stress, Pa)
 *   ε̇  = 4ηγ̇² / (3(n + 1)·ΔP_ent)            (extension rate, 1/s)
 *   η_E = σ_E/ε̇ = 9(n + 1)²ΔP_ent² / (32ηγ̇²)   (extensional viscosity, Pa·s)
 *
 * equivalently ΔP_ent = 4√2·γ̇·√(η·η_E)/(3(n + 1)). The Trouton ratio η_E/η is 3 for a Newtonian
 * liquid (Trouton, Proc. R. Soc. A 77 (1906) 426). Binding (1988) refines the analysis.
 *
 * Which shear rate: Cogswell's derivation works with the apparent (Newtonian) wall rate
 * γ̇_a = 4Q/(πR³) and the apparent viscosity η_a = τ_w/γ̇_a, and that is the default here
 * (option shearRate "apparent"); "wall" uses the Rabinowitsch-corrected γ̇_w with η = τ_w/γ̇_w.
 * ηγ̇ = τ_w either way, so σ_E and the Trouton ratio 9(n + 1)²ΔP_ent²/(32τ_w²) do not depend on
 * the choice; ε̇ scales with γ̇ and η_E with 1/γ̇ (by (3n + 1)/(4n), 1.4 at n = 0.4).
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";

/** Cogswell's quantities at one rate. */
export interface CogswellPoint {
  /** σ_E, Pa */
  tensileStress: number;
  /** ε̇, 1/s */
  extensionRate: number;
  /** η_E, Pa·s */
  extensionalViscosity: number;
  /** η_E/η */
  troutonRatio: number;
}

/** Options of {@link cogswellTable}. */
export interface CogswellOptions {
  /** warn where the Trouton ratio is below this (3 is the Newtonian value; common practice, no source) */
  minTroutonRatio: number;
  /** the shear rate (and matching viscosity) of the formulas: "apparent" γ̇_a with τ_w/γ̇_a, as Cogswell (1972); or "wall" γ̇_w with τ_w/γ̇_w */
  shearRate: "apparent" | "wall";
}

/** Defaults of {@link CogswellOptions}. */
export const DEFAULT_COGSWELL_OPTIONS: Readonly<CogswellOptions> = Object.freeze({ minTroutonRatio: 3 * 0.9, shearRate: "apparent" as const });

/**
 * Cogswell's extensional stress, rate and viscosity at one rate (module comment).
 * @param entrancePressure ΔP_ent, Pa (> 0)
 * @param shearRate shear rate γ̇, 1/s (> 0): the apparent wall rate in Cogswell's derivation, or the true wall rate
 * @param viscosity shear viscosity η paired with that rate (τ_w/γ̇), Pa·s (> 0)
 * @param flowIndex local power-law index n (> 0; n' of the flow curve)
 * @throws RheoError("domain") for non-positive input.
 * @example cogswell(Math.sqrt(8 / 3) * 1e4, 10, 1000, 1).troutonRatio // 3
 */
export function cogswell(entrancePressure: number, shearRate: number, viscosity: number, flowIndex: number): CogswellPoint {
  requirePositive(entrancePressure, "entrancePressure");
  requirePositive(shearRate, "shearRate");
  requirePositive(viscosity, "viscosity");
  requirePositive(flowIndex, "flowIndex");
  const tensileStress = (3 / 8) * (flowIndex + 1) * entrancePressure;
  const extensionRate = (4 * viscosity * shearRate * shearRate) / (3 * (flowIndex + 1) * entrancePressure);
  const extensionalViscosity = tensileStress / extensionRate;
  return { tensileStress, extensionRate, extensionalViscosity, troutonRatio: extensionalViscosity / viscosity };
}

/**
 * Entrance pressure Cogswell's analysis predicts for a liquid of shear viscosity η and
 * extensional viscosity η_E (the inverse of {@link cogswell}):
 * ΔP_ent = 4√2·γ̇·√(η·η_E)/(3(n + 1)).
 * @returns ΔP_ent, Pa
 */
export function cogswellEntrancePressure(shearRate: number, viscosity: number, extensionalViscosity: number, flowIndex: number): number {
  requirePositive(shearRate, "shearRate");
  requirePositive(viscosity, "viscosity");
  requirePositive(extensionalViscosity, "extensionalViscosity");
  requirePositive(flowIndex, "flowIndex");
  return (4 * Math.SQRT2 * shearRate * Math.sqrt(viscosity * extensionalViscosity)) / (3 * (flowIndex + 1));
}

/** One row of {@link cogswellTable}: the inputs carried along with the results. */
export interface CogswellRow extends CogswellPoint {
  shearRateApparent: number;
  shearRateWall: number;
  entrancePressure: number;
  /** which rate the formulas used */
  shearRateBasis: "apparent" | "wall";
  /** the rate used, 1/s (γ̇_a or γ̇_w) */
  shearRate: number;
  /** the shear viscosity used (τ_w/γ̇ of that rate), Pa·s: the denominator of the Trouton ratio */
  viscosity: number;
}

/**
 * Cogswell's analysis over a flow curve, with the shear rate of option `shearRate` (module
 * comment). Rows without an entrance pressure > 0, a true wall rate or a positive n′ are left
 * out with a warning.
 *
 * Warning codes: COGSWELL_POINT_SKIPPED (no positive entrance pressure, wall rate or n' there),
 * COGSWELL_LOW_TROUTON (η_E/η below minTroutonRatio: below the Newtonian 3, unusual for melts;
 * check the entrance pressure).
 * @throws RheoError("value") for unequal lengths.
 */
export function cogswellTable(
  points: { shearRateApparent: number; shearRateWall: number | null; viscosity: number | null; viscosityApparent: number; nPrime: number; entrancePressure: number | null }[],
  options: Partial<CogswellOptions> = {},
): { rows: CogswellRow[]; warnings: Warning[] } {
  const opt: CogswellOptions = { ...DEFAULT_COGSWELL_OPTIONS, ...options };
  if (!Array.isArray(points)) throw new RheoError("value", "points", "must be a list of flow-curve points");
  if (opt.shearRate !== "apparent" && opt.shearRate !== "wall") {
    throw new RheoError("value", "shearRate", `must be "apparent" or "wall", got "${String(opt.shearRate)}"`);
  }
  const rows: CogswellRow[] = [];
  const skipped: number[] = [];
  for (const p of points) {
    const ok = p.entrancePressure !== null && p.entrancePressure > 0 && p.shearRateWall !== null && p.shearRateWall > 0 && p.viscosity !== null && p.viscosity > 0 && p.nPrime > 0;
    if (!ok) {
      skipped.push(p.shearRateApparent);
      continue;
    }
    const apparent = opt.shearRate === "apparent";
    const rate = apparent ? p.shearRateApparent : (p.shearRateWall as number);
    const eta = apparent ? p.viscosityApparent : (p.viscosity as number);
    const c = cogswell(p.entrancePressure as number, rate, eta, p.nPrime);
    rows.push({ shearRateApparent: p.shearRateApparent, shearRateWall: p.shearRateWall as number, entrancePressure: p.entrancePressure as number, shearRateBasis: opt.shearRate, shearRate: rate, viscosity: eta, ...c });
  }
  const warnings: Warning[] = [];
  if (skipped.length > 0) {
    warnings.push(warning("COGSWELL_POINT_SKIPPED", `No extensional viscosity at ${skipped.map(fmt).join(", ")} 1/s: the entrance pressure, true wall rate or n' there is not positive.`));
  }
  const low = rows.filter((r) => r.troutonRatio < opt.minTroutonRatio);
  if (low.length > 0) {
    warnings.push(
      warning("COGSWELL_LOW_TROUTON", `The Trouton ratio η_E/η is below ${Number(opt.minTroutonRatio.toPrecision(3))} at ${low.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s, less than a Newtonian liquid's 3: check the entrance pressure (Bagley intercept or orifice die).`),
    );
  }
  return { rows, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
