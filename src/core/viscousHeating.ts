/**
 * Viscous heating in the die (Winter, Adv. Heat Transfer 13 (1977) 205; Bird, Armstrong &
 * Hassager 1987, vol. 1, ch. 4; Macosko 1994, ch. 6; Dealy & Wang 2013; all from memory).
 *
 * - Adiabatic temperature rise: all the pressure work heats the melt passing the die,
 *   ΔT_ad = ΔP/(ρ·c_p). It bounds the mean rise at the exit from above (the wall conducts heat
 *   away) and is reached when heat has no time to leave (large Graetz number).
 * - Mean velocity V = Q/A: γ̇_a·R/4 in a round die (γ̇_a = 4V/R), γ̇_a·H/6 in a slit (γ̇_a = 6V/H).
 * - Nahme–Griffith number Na = b_γ·η·V²/k: the viscosity change caused by the temperature scale of
 *   dissipation, ηV²/k (the axis rise of developed Newtonian pipe flow with the wall held at the
 *   melt temperature; Bird, Stewart & Lightfoot 2002, ch. 10, from memory). b_γ = −(∂ ln η/∂T) at the held rate
 *   is n′ times the shift-law (constant-stress) coefficient b: b_γ = n′·b (a_T multiplies the rate,
 *   τ ∝ a_T^n′ at a held rate). To first order the apparent viscosity of developed flow then reads
 *   low by Na/2 (derived in docs/methods.md; solve_bvp check in test/fixtures/scipy-heating.json:
 *   5.3 % at Na = 0.11). η is the true viscosity at the wall, k the melt's conductivity.
 * - Brinkman number Br = η·V²/(k·ΔT_ref): the dissipation's temperature scale against a reference
 *   difference ΔT_ref, here the temperature deviation the test tolerates (option).
 * - Graetz number Gz = ρ·c_p·V·R²/(k·L) (R → H/2 for a slit): the time to conduct heat across the
 *   die over the residence time. The thermal entry length of laminar pipe flow is about
 *   0.05·Pe·D (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, ch. 8, from memory), i.e. the
 *   temperature profile is developed and heat conducted away when Gz ≤ 5; with Gz ≫ 5 the heat
 *   stays in the melt (adiabatic limit, ΔT_ad governs).
 * - With a shift law, b follows from it: Arrhenius b = E_a/(R_gas·T²); WLF
 *   b = ln 10·C1·C2/(C2 + T − T_ref)².
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";
import { GAS_CONSTANT, ShiftLaw } from "./temperature/shiftFactors";

/** Material data of the heating estimate, SI. */
export interface HeatingProperties {
  /** ρ, kg/m³ */
  density: number;
  /** c_p, J/(kg·K) */
  heatCapacity: number;
  /** k, W/(m·K) */
  conductivity: number;
  /**
   * b = −d ln a_T/dT, the shift-law (constant-stress) temperature coefficient, 1/K, as
   * E_a/(R·T²) gives it (from the temperature fit when omitted in `reduce`); the Nahme–Griffith
   * number uses n′·b
   */
  temperatureCoefficient?: number;
}

/** Warning thresholds and settings of {@link heatingTable}. */
export interface HeatingOptions {
  /** warn when the adiabatic rise exceeds this, K (common practice, no source) */
  maxAdiabaticRise: number;
  /** warn when Na = b_γηV²/k exceeds this: Na/2 is the viscosity error of developed flow, so 0.1 ↔ 5 % (threshold common practice, no source) */
  maxNahme: number;
  /** ΔT_ref of the Brinkman number: the melt-temperature deviation the test tolerates, K (common practice, no source) */
  brinkmanTemperatureDifference: number;
  /** Gz at or below this: heat conducted away, profile developed (thermal entry length 0.05·Pe·D; Incropera & DeWitt, ch. 8, from memory) */
  conductedGraetz: number;
  /** Gz above this: heat kept in the melt, the adiabatic limit (a tenth of the entry length; common practice, no source) */
  adiabaticGraetz: number;
}

/** Defaults of {@link HeatingOptions}. */
export const DEFAULT_HEATING_OPTIONS: Readonly<HeatingOptions> = Object.freeze({
  maxAdiabaticRise: 5,
  maxNahme: 0.1,
  brinkmanTemperatureDifference: 1,
  conductedGraetz: 5,
  adiabaticGraetz: 50,
});

/**
 * Adiabatic temperature rise ΔT_ad = ΔP/(ρ·c_p).
 * @param pressure ΔP, Pa (≥ 0)
 * @param density ρ, kg/m³ (> 0)
 * @param heatCapacity c_p, J/(kg·K) (> 0)
 * @returns ΔT_ad, K
 * @example adiabaticTemperatureRise(20e6, 750, 2500) // 10.67 K
 */
export function adiabaticTemperatureRise(pressure: number, density: number, heatCapacity: number): number {
  if (!(pressure >= 0) || !Number.isFinite(pressure)) throw new RheoError("domain", "pressure", `must be zero or more, got ${pressure}`);
  requirePositive(density, "density");
  requirePositive(heatCapacity, "heatCapacity");
  return pressure / (density * heatCapacity);
}

/**
 * The wall-rate heating number b·η·γ̇_w²·R²/k (the worksheet's RHEO.NAHME). It is not the
 * Nahme–Griffith number of {@link nahmeGriffithNumber}: with γ̇_w·R = 4V·(3n′+1)/(4n′) it is
 * 16·((3n′+1)/(4n′))² times b·η·V²/k, and it takes b as given (no n′). Kept for the worksheet.
 * @param temperatureCoefficient b = −d ln η/dT, 1/K (> 0)
 * @param viscosity η, Pa·s; shearRateWall γ̇_w, 1/s; radius R (m; half the gap for a slit)
 * @param conductivity k, W/(m·K)
 * @example nahmeNumber(0.03, 1000, 100, 0.5e-3, 0.2) // 0.375
 */
export function nahmeNumber(temperatureCoefficient: number, viscosity: number, shearRateWall: number, radius: number, conductivity: number): number {
  requirePositive(temperatureCoefficient, "temperatureCoefficient");
  requirePositive(viscosity, "viscosity");
  requirePositive(shearRateWall, "shearRateWall");
  requirePositive(radius, "radius");
  requirePositive(conductivity, "conductivity");
  return (temperatureCoefficient * viscosity * shearRateWall * shearRateWall * radius * radius) / conductivity;
}

/**
 * Mean velocity in the die: V = γ̇_a·R/4 (round, R the radius) or γ̇_a·H/6 (slit, H the gap).
 * @param shearRateApparent γ̇_a, 1/s (≥ 0)
 * @param size R for a round die or H for a slit, m (> 0)
 * @returns V, m/s
 * @example meanVelocity(400, 0.5e-3, "round") // 0.05 m/s
 */
export function meanVelocity(shearRateApparent: number, size: number, geometry: "round" | "slit" = "round"): number {
  if (!(shearRateApparent >= 0) || !Number.isFinite(shearRateApparent)) throw new RheoError("domain", "shearRateApparent", `must be zero or more, got ${shearRateApparent}`);
  requirePositive(size, geometry === "slit" ? "slitHeight" : "radius");
  return geometry === "slit" ? (shearRateApparent * size) / 6 : (shearRateApparent * size) / 4;
}

/**
 * Nahme–Griffith number Na = b_γ·η·V²/k with b_γ = n′·b (module comment).
 * @param temperatureCoefficient b, the shift-law (constant-stress) coefficient, 1/K (> 0)
 * @param nPrime n′ = d ln τ_w/d ln γ̇_a (> 0; 1 for a Newtonian liquid)
 * @param viscosity η at the wall, Pa·s; velocity V, m/s; conductivity k, W/(m·K)
 * @example nahmeGriffithNumber(0.03, 1, 1000, 0.05, 0.2) // 0.375
 */
export function nahmeGriffithNumber(temperatureCoefficient: number, nPrime: number, viscosity: number, velocity: number, conductivity: number): number {
  requirePositive(temperatureCoefficient, "temperatureCoefficient");
  requirePositive(nPrime, "nPrime");
  requirePositive(viscosity, "viscosity");
  requirePositive(velocity, "velocity");
  requirePositive(conductivity, "conductivity");
  return (nPrime * temperatureCoefficient * viscosity * velocity * velocity) / conductivity;
}

/**
 * Brinkman number Br = η·V²/(k·ΔT_ref).
 * @param viscosity η, Pa·s; velocity V, m/s; conductivity k, W/(m·K); temperatureDifference ΔT_ref, K
 * @example brinkmanNumber(1000, 0.05, 0.2, 1) // 12.5
 */
export function brinkmanNumber(viscosity: number, velocity: number, conductivity: number, temperatureDifference: number): number {
  requirePositive(viscosity, "viscosity");
  requirePositive(velocity, "velocity");
  requirePositive(conductivity, "conductivity");
  requirePositive(temperatureDifference, "temperatureDifference");
  return (viscosity * velocity * velocity) / (conductivity * temperatureDifference);
}

/**
 * Graetz number Gz = ρ·c_p·V·R²/(k·L) (R the radius, or H/2 for a slit).
 * @param density ρ, kg/m³; heatCapacity c_p, J/(kg·K); velocity V, m/s; halfSize R (m);
 *   conductivity k, W/(m·K); dieLength L, m
 * @example graetzNumber(750, 2500, 0.05, 0.5e-3, 0.2, 20e-3) // 5.859
 */
export function graetzNumber(density: number, heatCapacity: number, velocity: number, halfSize: number, conductivity: number, dieLength: number): number {
  requirePositive(density, "density");
  requirePositive(heatCapacity, "heatCapacity");
  requirePositive(velocity, "velocity");
  requirePositive(halfSize, "radius");
  requirePositive(conductivity, "conductivity");
  requirePositive(dieLength, "dieLength");
  return (density * heatCapacity * velocity * halfSize * halfSize) / (conductivity * dieLength);
}

/** How the heat generated in the die leaves it, from the Graetz number (module comment). */
export type HeatRegime = "conducted" | "developing" | "adiabatic";

/**
 * b = −d ln η/dT at temperature T from a shift law (module comment).
 * @returns b, 1/K
 * @example temperatureCoefficientFromShift({law: "arrhenius", referenceTemperature: 473.15, activationEnergy: 50e3}, 473.15) // 0.02686
 */
export function temperatureCoefficientFromShift(shift: ShiftLaw, temperature: number): number {
  requirePositive(temperature, "temperature");
  if (shift.law === "arrhenius") return shift.activationEnergy / (GAS_CONSTANT * temperature * temperature);
  if (shift.law === "wlf") {
    const d = shift.C2 + temperature - shift.referenceTemperature;
    if (!(d > 0)) throw new RheoError("domain", "temperature", `must satisfy C2 + T − Tref > 0 for the WLF law, got ${d} K`);
    return (Math.LN10 * shift.C1 * shift.C2) / (d * d);
  }
  throw new RheoError("value", "shift.law", `unknown shift law "${String((shift as { law: unknown }).law)}"; accepted: arrhenius, wlf`);
}

/** One row of {@link heatingTable}. */
export interface HeatingRow {
  shearRateApparent: number;
  /** the pressure the rise is computed from (the longest die's, measured or interpolated), Pa */
  pressure: number;
  /** ΔT_ad, K */
  adiabaticTemperatureRise: number;
  /**
   * b·η·γ̇_w²·R²/k, or null where the true wall rate is unknown.
   * @deprecated a wall-rate form that reads about 16·((3n′+1)/(4n′))²/n′ times the
   *   Nahme–Griffith number; use nahmeGriffithNumber
   */
  nahmeNumber: number | null;
  /** V = Q/A, m/s */
  meanVelocity: number;
  /** b_γ = n′·b, 1/K, or null where n′ ≤ 0 */
  temperatureCoefficientConstantRate: number | null;
  /** Na = b_γ·η·V²/k, or null where η or n′ is unknown */
  nahmeGriffithNumber: number | null;
  /** Br = η·V²/(k·ΔT_ref), or null where η is unknown */
  brinkmanNumber: number | null;
  /** Gz = ρc_p·V·R²/(k·L) of the die the pressure belongs to */
  graetzNumber: number;
  /** "conducted" (Gz ≤ conductedGraetz), "adiabatic" (Gz > adiabaticGraetz) or "developing" */
  heatRegime: HeatRegime;
}

function checkProperties(p: HeatingProperties): Required<HeatingProperties> {
  requirePositive(p.density, "density");
  requirePositive(p.heatCapacity, "heatCapacity");
  requirePositive(p.conductivity, "conductivity");
  if (p.temperatureCoefficient === undefined) {
    throw new RheoError("missing", "temperatureCoefficient", "give b = −d ln η/dT (1/K), or measure at two or more temperatures so it can be fitted");
  }
  requirePositive(p.temperatureCoefficient, "temperatureCoefficient");
  return p as Required<HeatingProperties>;
}

/**
 * Heating estimate at each flow-curve point (module comment).
 *
 * Warning codes: HEATING_ADIABATIC_RISE (ΔT_ad above maxAdiabaticRise somewhere),
 * HEATING_NAHME (Na above maxNahme somewhere: heating lowers the measured viscosity by up to
 * about Na/2; the message gives the Graetz regime).
 *
 * @param points per point: γ̇_a (1/s), die pressure ΔP (Pa), n′, γ̇_w (1/s) and η (Pa·s) or null
 * @param die the geometry: "round" with R the radius, or "slit" with R = H/2; L the length (m) of
 *   the die whose pressure is given
 * @throws RheoError("missing") without b; ("domain") for non-positive properties.
 */
export function heatingTable(
  points: { shearRateApparent: number; pressure: number; nPrime: number; shearRateWall: number | null; viscosity: number | null }[],
  die: { geometry: "round" | "slit"; radius: number; dieLength: number },
  properties: HeatingProperties,
  options: Partial<HeatingOptions> = {},
): { rows: HeatingRow[]; warnings: Warning[] } {
  const opt: HeatingOptions = { ...DEFAULT_HEATING_OPTIONS, ...options };
  const p = checkProperties(properties);
  requirePositive(die.radius, "radius");
  requirePositive(die.dieLength, "dieLength");
  requirePositive(opt.brinkmanTemperatureDifference, "brinkmanTemperatureDifference");
  if (!(opt.conductedGraetz > 0 && opt.adiabaticGraetz > opt.conductedGraetz)) {
    throw new RheoError("domain", "adiabaticGraetz", `must exceed conductedGraetz (${opt.conductedGraetz}), got ${opt.adiabaticGraetz}`);
  }
  const rows: HeatingRow[] = points.map((pt) => {
    const v = meanVelocity(pt.shearRateApparent, die.geometry === "slit" ? 2 * die.radius : die.radius, die.geometry);
    const eta = pt.viscosity !== null && pt.viscosity > 0 ? pt.viscosity : null;
    const wallKnown = pt.shearRateWall !== null && pt.shearRateWall > 0 && eta !== null;
    const gz = v > 0 ? graetzNumber(p.density, p.heatCapacity, v, die.radius, p.conductivity, die.dieLength) : 0;
    return {
      shearRateApparent: pt.shearRateApparent,
      pressure: pt.pressure,
      adiabaticTemperatureRise: adiabaticTemperatureRise(pt.pressure, p.density, p.heatCapacity),
      nahmeNumber: wallKnown ? nahmeNumber(p.temperatureCoefficient, eta, pt.shearRateWall as number, die.radius, p.conductivity) : null,
      meanVelocity: v,
      temperatureCoefficientConstantRate: pt.nPrime > 0 ? pt.nPrime * p.temperatureCoefficient : null,
      nahmeGriffithNumber: eta !== null && pt.nPrime > 0 && v > 0 ? nahmeGriffithNumber(p.temperatureCoefficient, pt.nPrime, eta, v, p.conductivity) : null,
      brinkmanNumber: eta !== null && v > 0 ? brinkmanNumber(eta, v, p.conductivity, opt.brinkmanTemperatureDifference) : null,
      graetzNumber: gz,
      heatRegime: gz <= opt.conductedGraetz ? "conducted" : gz > opt.adiabaticGraetz ? "adiabatic" : "developing",
    };
  });
  const warnings: Warning[] = [];
  const hot = rows.filter((r) => r.adiabaticTemperatureRise > opt.maxAdiabaticRise);
  if (hot.length > 0) {
    const worst = Math.max(...hot.map((r) => r.adiabaticTemperatureRise));
    warnings.push(
      warning("HEATING_ADIABATIC_RISE", `The melt may heat by up to ${fmt(worst)} K in the die (adiabatic bound, above ${opt.maxAdiabaticRise} K at ${hot.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s): viscosities at those rates may read low.`),
    );
  }
  const nahme = rows.filter((r) => r.nahmeGriffithNumber !== null && r.nahmeGriffithNumber > opt.maxNahme);
  if (nahme.length > 0) {
    const worst = nahme.reduce((a, b) => ((b.nahmeGriffithNumber as number) > (a.nahmeGriffithNumber as number) ? b : a));
    const regimes = [...new Set(nahme.map((r) => r.heatRegime))];
    const where =
      regimes.length === 1 && regimes[0] === "adiabatic"
        ? "the Graetz number says the heat stays in the melt there, so the adiabatic rise, not Na, bounds the error"
        : regimes.length === 1 && regimes[0] === "conducted"
          ? "the Graetz number says the heat is conducted to the wall there, so Na governs"
          : `Graetz number ${fmt(worst.graetzNumber)} at the worst point: heat partly conducted away`;
    warnings.push(
      warning(
        "HEATING_NAHME",
        `The Nahme–Griffith number exceeds ${opt.maxNahme} at ${nahme.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s (up to ${fmt(worst.nahmeGriffithNumber as number)}): viscous heating may lower the viscosity there by up to about ${fmt(((worst.nahmeGriffithNumber as number) / 2) * 100)} % (Na/2); ${where}. A smaller die or lower rates reduce it.`,
      ),
    );
  }
  return { rows, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(3)).toString();
}
