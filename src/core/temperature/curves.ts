/** Viscosity curves measured at several temperatures, and their strict validation. */
import { RheoError, requirePositive } from "../errors";

/** One isothermal viscosity curve: T (K), γ̇ (1/s), η (Pa·s). */
export interface TemperatureCurve {
  temperature: number;
  shearRate: readonly number[];
  viscosity: readonly number[];
}

/**
 * @throws RheoError naming `curves[i].field` (and the row) for missing arrays, unequal lengths,
 *   non-finite or non-positive values; `missing` when fewer than `minimum` curves are given.
 */
export function validateCurves(curves: readonly TemperatureCurve[], minimum: number): void {
  if (!Array.isArray(curves) || curves.length < minimum) {
    throw new RheoError("missing", "curves", `needs at least ${minimum} curves at different temperatures, got ${Array.isArray(curves) ? curves.length : 0}`);
  }
  curves.forEach((c, i) => {
    const name = `curves[${i}]`;
    requirePositive(c.temperature, `${name}.temperature`);
    if (!Array.isArray(c.shearRate) || !Array.isArray(c.viscosity)) {
      throw new RheoError("value", name, "must have shearRate and viscosity arrays");
    }
    if (c.shearRate.length === 0) throw new RheoError("missing", `${name}.shearRate`, "has no points");
    if (c.viscosity.length !== c.shearRate.length) {
      throw new RheoError("value", `${name}.viscosity`, `has ${c.viscosity.length} values but shearRate has ${c.shearRate.length}`);
    }
    c.shearRate.forEach((v: number, r: number) => requirePositive(v, `${name}.shearRate`, r + 1));
    c.viscosity.forEach((v: number, r: number) => requirePositive(v, `${name}.viscosity`, r + 1));
  });
  const temps = new Set(curves.map((c) => c.temperature));
  if (temps.size < minimum) throw new RheoError("missing", "curves", `need at least ${minimum} different temperatures, got ${temps.size}`);
}
