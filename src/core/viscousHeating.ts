/**
 * Viscous heating in the die (Winter, Adv. Heat Transfer 13 (1977) 205; Macosko 1994, ch. 6, from memory;
 * Dealy & Wang 2013, from memory).
 *
 * - Adiabatic temperature rise: all the pressure work heats the melt passing the die,
 *   ΔT_ad = ΔP/(ρ·c_p). It bounds the mean rise from above (the wall conducts heat away).
 * - Nahme–Griffith number: Na = b·η·γ̇_w²·R²/k with b = −d ln η/dT (1/K) and R the die radius
 *   (half the gap for a slit). Na ≳ 1 means the heat generated changes the viscosity across the
 *   die noticeably (common practice).
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
  /** b = −d ln η/dT, 1/K (from the temperature fit when omitted in `reduce`) */
  temperatureCoefficient?: number;
}

/** Warning thresholds of {@link heatingTable}. */
export interface HeatingOptions {
  /** warn when the adiabatic rise exceeds this, K (common practice, no source) */
  maxAdiabaticRise: number;
  /** warn when Na exceeds this (common practice) */
  maxNahme: number;
}

/** Defaults of {@link HeatingOptions}. */
export const DEFAULT_HEATING_OPTIONS: Readonly<HeatingOptions> = Object.freeze({ maxAdiabaticRise: 5, maxNahme: 1 });

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
 * Nahme–Griffith number Na = b·η·γ̇_w²·R²/k.
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
  /** Na, or null where the true wall rate is unknown */
  nahmeNumber: number | null;
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
 * Heating estimate at each flow-curve point.
 *
 * Warning codes: HEATING_ADIABATIC_RISE (ΔT_ad above maxAdiabaticRise somewhere),
 * HEATING_NAHME (Na above maxNahme somewhere: heating distorts the viscosity).
 *
 * @param points per point: γ̇_a (1/s), die pressure ΔP (Pa), γ̇_w (1/s) and η (Pa·s) or null
 * @param radius R, m (half the gap for a slit)
 * @throws RheoError("missing") without b; ("domain") for non-positive properties.
 */
export function heatingTable(
  points: { shearRateApparent: number; pressure: number; shearRateWall: number | null; viscosity: number | null }[],
  radius: number,
  properties: HeatingProperties,
  options: Partial<HeatingOptions> = {},
): { rows: HeatingRow[]; warnings: Warning[] } {
  const opt: HeatingOptions = { ...DEFAULT_HEATING_OPTIONS, ...options };
  const p = checkProperties(properties);
  requirePositive(radius, "radius");
  const rows = points.map((pt) => ({
    shearRateApparent: pt.shearRateApparent,
    pressure: pt.pressure,
    adiabaticTemperatureRise: adiabaticTemperatureRise(pt.pressure, p.density, p.heatCapacity),
    nahmeNumber:
      pt.shearRateWall !== null && pt.viscosity !== null && pt.shearRateWall > 0 && pt.viscosity > 0
        ? nahmeNumber(p.temperatureCoefficient, pt.viscosity, pt.shearRateWall, radius, p.conductivity)
        : null,
  }));
  const warnings: Warning[] = [];
  const hot = rows.filter((r) => r.adiabaticTemperatureRise > opt.maxAdiabaticRise);
  if (hot.length > 0) {
    const worst = Math.max(...hot.map((r) => r.adiabaticTemperatureRise));
    warnings.push(
      warning("HEATING_ADIABATIC_RISE", `The melt may heat by up to ${fmt(worst)} K in the die (adiabatic bound, above ${opt.maxAdiabaticRise} K at ${hot.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s): viscosities at those rates may read low.`),
    );
  }
  const nahme = rows.filter((r) => r.nahmeNumber !== null && r.nahmeNumber > opt.maxNahme);
  if (nahme.length > 0) {
    warnings.push(
      warning("HEATING_NAHME", `The Nahme–Griffith number exceeds ${opt.maxNahme} at ${nahme.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: heat generated at the wall changes the viscosity across the die; use a smaller die or lower rates there.`),
    );
  }
  return { rows, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(3)).toString();
}
