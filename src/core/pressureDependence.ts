/**
 * Pressure dependence of viscosity from curved Bagley lines.
 *
 * With the Barus law η = η_0·exp(β_p·p) and the flow rate held, the local wall stress grows as
 * exp(β_p·p), so along the die dp/dz = −(2/R)·τ_0·exp(β_p·p). Integrating from the exit (p = 0)
 * gives the die's pressure drop (Duvdevani & Klein, SPE J. 23 (1967) 41; Laun, Rheol. Acta 43
 * (2004) 509; Dealy & Wang 2013, from memory):
 *
 *   ΔP = ΔP_ent − ln(1 − β_p·2τ_0·x)/β_p,   x = L/R (L/H for a slit),
 *
 * which is the straight Bagley line ΔP_ent + 2τ_0·x when β_p → 0 and bends upwards for β_p > 0.
 * At each apparent rate with three or more dies, (ΔP_ent, τ_0, β_p) are fitted by damped
 * Gauss–Newton from the quadratic fit's start (β_p ≈ 2c/b² for ΔP ≈ a + b·x + c·x²).
 * β_p of common melts is of order 10–40 GPa⁻¹ (from memory). The entrance pressure itself is
 * taken as independent of pressure.
 */
import { RheoError, Warning, warning } from "./errors";
import { fitPolynomial } from "./regression";

/** Options of {@link pressureDependence}. */
export interface PressureDependenceOptions {
  /** warn when β_p·ΔP_max (the log of the viscosity rise over the die) exceeds this (common practice, no source) */
  maxLogViscosityRise: number;
  maxIterations: number;
}

/** Defaults of {@link PressureDependenceOptions}. */
export const DEFAULT_PRESSURE_DEPENDENCE_OPTIONS: Readonly<PressureDependenceOptions> = Object.freeze({ maxLogViscosityRise: 0.1, maxIterations: 100 });

/** The curved Bagley line at one apparent rate. */
export interface PressureDependenceRow {
  shearRateApparent: number;
  /** β_p, 1/Pa */
  pressureCoefficient: number;
  /** τ_0, the wall stress at zero pressure, Pa */
  wallShearStressAtZeroPressure: number;
  /** ΔP_ent of the curved fit, Pa */
  entrancePressure: number;
  /** coefficient c of the quadratic ΔP ≈ a + b·x + c·x², Pa */
  curvature: number;
  /** β_p·ΔP_max: ln of the viscosity rise from die exit to the highest pressure */
  logViscosityRise: number;
  diesUsed: number;
  converged: boolean;
}

/** Die pressure of the Barus model, numerically safe as β → 0. */
export function barusPressure(x: number, entrancePressure: number, slope: number, beta: number): number {
  const u = beta * slope * x;
  if (!(u < 1)) return NaN;
  if (Math.abs(u) < 1e-8) return entrancePressure + slope * x * (1 + u / 2);
  return entrancePressure - Math.log1p(-u) / beta;
}

function solve3(a: number[][], b: number[]): number[] | undefined {
  const m = a.map((row, i) => [...row, b[i] as number]);
  for (let c = 0; c < 3; c++) {
    let p = c;
    for (let r = c + 1; r < 3; r++) if (Math.abs((m[r] as number[])[c] as number) > Math.abs((m[p] as number[])[c] as number)) p = r;
    [m[c], m[p]] = [m[p] as number[], m[c] as number[]];
    const pivot = (m[c] as number[])[c] as number;
    if (Math.abs(pivot) < 1e-300) return undefined;
    for (let r = 0; r < 3; r++) {
      if (r === c) continue;
      const f = ((m[r] as number[])[c] as number) / pivot;
      for (let k = c; k < 4; k++) (m[r] as number[])[k] = ((m[r] as number[])[k] as number) - f * ((m[c] as number[])[k] as number);
    }
  }
  return [0, 1, 2].map((i) => ((m[i] as number[])[3] as number) / ((m[i] as number[])[i] as number));
}

/**
 * Fits the Barus-law Bagley curve to one rate's (x, ΔP) points (module comment).
 * @param x L/R (or L/H) per die, at least 3 distinct
 * @param pressure ΔP per die, Pa
 * @returns β_p (1/Pa), τ_0 (Pa), ΔP_ent (Pa), the quadratic curvature c and whether it converged
 * @throws RheoError("missing") with fewer than 3 distinct dies.
 */
export function fitBarusBagley(x: number[], pressure: number[], maxIterations = DEFAULT_PRESSURE_DEPENDENCE_OPTIONS.maxIterations) {
  if (x.length !== pressure.length) throw new RheoError("value", "pressure", `has ${pressure.length} values but x has ${x.length}`);
  if (new Set(x.map((v) => v.toPrecision(9))).size < 3) {
    throw new RheoError("missing", "dieLength", "the curvature of a Bagley line needs at least three die lengths");
  }
  const scale = Math.max(...pressure);
  const y = pressure.map((p) => p / scale);
  const xm = x.reduce((s, v) => s + v, 0) / x.length;
  const q = fitPolynomial(x, y, 2, xm);
  const c2 = q[2] as number;
  const b1 = (q[1] as number) - 2 * c2 * xm;
  const a0 = (q[0] as number) - (q[1] as number) * xm + c2 * xm * xm;
  let p = [a0, b1, b1 !== 0 ? (2 * c2) / (b1 * b1) : 0];
  const ssr = (v: number[]) => x.reduce((s, xi, i) => s + (barusPressure(xi, v[0] as number, v[1] as number, v[2] as number) - (y[i] as number)) ** 2, 0);
  if (!Number.isFinite(ssr(p))) p = [a0, b1, 0];
  let lambda = 1e-3;
  let converged = false;
  for (let it = 0; it < maxIterations; it++) {
    const f0 = ssr(p);
    const jac = x.map((xi) =>
      [0, 1, 2].map((k) => {
        const h = 1e-6 * Math.max(Math.abs(p[k] as number), 1e-3);
        const up = [...p];
        const dn = [...p];
        up[k] = (up[k] as number) + h;
        dn[k] = (dn[k] as number) - h;
        return (barusPressure(xi, up[0] as number, up[1] as number, up[2] as number) - barusPressure(xi, dn[0] as number, dn[1] as number, dn[2] as number)) / (2 * h);
      }),
    );
    const r = x.map((xi, i) => (y[i] as number) - barusPressure(xi, p[0] as number, p[1] as number, p[2] as number));
    const jtj = [0, 1, 2].map((i) => [0, 1, 2].map((j) => jac.reduce((s, row) => s + (row[i] as number) * (row[j] as number), 0)));
    const jtr = [0, 1, 2].map((i) => jac.reduce((s, row, n) => s + (row[i] as number) * (r[n] as number), 0));
    let improved = false;
    for (let tries = 0; tries < 30; tries++) {
      const damped = jtj.map((row, i) => row.map((v, j) => (i === j ? v * (1 + lambda) + 1e-30 : v)));
      const step = solve3(damped, jtr);
      if (!step) break;
      const next = p.map((v, i) => v + (step[i] as number));
      const f1 = ssr(next);
      if (Number.isFinite(f1) && f1 <= f0) {
        const small = step.every((s, i) => Math.abs(s) <= 1e-10 * Math.max(Math.abs(p[i] as number), 1e-6));
        p = next;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = true;
        if (small || f0 - f1 <= 1e-14 * Math.max(f0, 1e-30)) converged = true;
        break;
      }
      lambda *= 10;
    }
    if (!improved) {
      converged = ssr(p) <= 1e-20 || converged;
      break;
    }
    if (converged) break;
  }
  return {
    pressureCoefficient: (p[2] as number) / scale,
    wallShearStressAtZeroPressure: ((p[1] as number) * scale) / 2,
    entrancePressure: (p[0] as number) * scale,
    curvature: c2 * scale,
    converged: converged || ssr(p) <= 1e-20,
  };
}

/**
 * Pressure-dependence analysis of Bagley lines: one Barus fit per rate with ≥ 3 dies.
 *
 * Warning codes: PRESSURE_DEPENDENCE (β_p·ΔP_max above maxLogViscosityRise: the viscosity grows
 * noticeably with pressure, and the straight Bagley line is biased), PRESSURE_CURVATURE_DOWNWARD
 * (the lines bend down: viscous heating or slip rather than pressure), PRESSURE_FEW_DIES (fewer
 * than three dies: curvature cannot be seen), PRESSURE_FIT_NOT_CONVERGED.
 *
 * @param lines per rate: the apparent rate and the (x, ΔP) points of its Bagley line
 */
export function pressureDependence(
  lines: { shearRateApparent: number; points: { lengthOverRadius: number; pressure: number }[] }[],
  options: Partial<PressureDependenceOptions> = {},
): { rows: PressureDependenceRow[]; pressureCoefficient: number | null; warnings: Warning[] } {
  const opt: PressureDependenceOptions = { ...DEFAULT_PRESSURE_DEPENDENCE_OPTIONS, ...options };
  const rows: PressureDependenceRow[] = [];
  const warnings: Warning[] = [];
  const notConverged: number[] = [];
  for (const line of lines) {
    const distinct = new Set(line.points.map((p) => p.lengthOverRadius.toPrecision(9))).size;
    if (distinct < 3) continue;
    const fit = fitBarusBagley(line.points.map((p) => p.lengthOverRadius), line.points.map((p) => p.pressure), opt.maxIterations);
    if (!fit.converged) notConverged.push(line.shearRateApparent);
    const maxP = Math.max(...line.points.map((p) => p.pressure));
    rows.push({
      shearRateApparent: line.shearRateApparent,
      ...fit,
      logViscosityRise: fit.pressureCoefficient * maxP,
      diesUsed: line.points.length,
    });
  }
  if (rows.length === 0) {
    warnings.push(warning("PRESSURE_FEW_DIES", "Pressure dependence needs three or more die lengths at one rate; none was found, so it was not estimated."));
    return { rows, pressureCoefficient: null, warnings };
  }
  const sorted = rows.map((r) => r.pressureCoefficient).sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  const median = sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
  const up = rows.filter((r) => r.logViscosityRise > opt.maxLogViscosityRise);
  const down = rows.filter((r) => r.logViscosityRise < -opt.maxLogViscosityRise);
  if (up.length > 0) {
    warnings.push(
      warning("PRESSURE_DEPENDENCE", `The Bagley lines bend upwards at ${up.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: the viscosity rises with pressure (β_p ≈ ${fmt(median * 1e9)} GPa⁻¹), so the straight-line end correction and wall stress are biased there.`),
    );
  }
  if (down.length > 0) {
    warnings.push(
      warning("PRESSURE_CURVATURE_DOWNWARD", `The Bagley lines bend downwards at ${down.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: pressure cannot do that; suspect viscous heating in the long dies or wall slip.`),
    );
  }
  if (notConverged.length > 0) {
    warnings.push(warning("PRESSURE_FIT_NOT_CONVERGED", `The curved Bagley fit did not converge at ${notConverged.map(fmt).join(", ")} 1/s; its pressure coefficient there is approximate.`));
  }
  return { rows, pressureCoefficient: median, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(3)).toString();
}
