/**
 * Pressure dependence of viscosity from curved Bagley lines.
 *
 * Model: time–pressure superposition with a shift factor a_p = exp(β·p), β the pressure
 * coefficient at constant stress (the shift-factor coefficient that the literature quotes, of
 * order 10–40 GPa⁻¹ for common melts; from memory): η(γ̇, p) = a_p·η_0(a_p·γ̇). In a round die at a
 * held flow rate the wall stress is then τ_w(γ̇_a, p) = τ_w0(a_p·γ̇_a) ≈ τ_0·exp(n′β·p), n′ the
 * local slope d ln τ_w/d ln γ̇_a, so the coefficient seen at constant rate is β_γ = n′·β
 * (Laun, Rheol. Acta 43 (2004) 509; Dealy & Wang 2013; from memory). The force balance
 * dp/dz = −(2/R)·τ_0·exp(β_γ·p), integrated from the exit (p = 0), gives the die's pressure
 * (Duvdevani & Klein, SPE J. 23 (1967) 41):
 *
 *   ΔP = ΔP_ent − ln(1 − β_γ·2τ_0·x)/β_γ,   x = L/R (L/H for a slit),
 *
 * the straight Bagley line ΔP_ent + 2τ_0·x when β_γ → 0, bending upwards for β_γ > 0. At each
 * apparent rate with three or more dies (ΔP_ent, τ_0, β_γ) are fitted by damped Gauss–Newton from
 * the quadratic fit's start (β_γ ≈ 2c/b² for ΔP ≈ a + b·x + c·x²), with standard errors
 * s²(JᵀJ)⁻¹, s² = SSR/(m − 3) (m dies; none with three dies, which the three parameters fit
 * exactly). The constant-stress β = β_γ/n′ uses n′ of the zero-pressure curve, the fitted τ_0
 * across rates when three or more rates were fitted (else the flow curve's n′). For a power law
 * β_γ = n·β is exact; on a Cross liquid it is within 0.4 % (test/fixtures/scipy-barus.json).
 * The entrance pressure itself is taken as independent of pressure.
 */
import { RheoError, Warning, warning } from "./errors";
import { fitPolynomial } from "./regression";
import { tQuantile } from "./fit/studentT";
import { rabinowitschCorrection } from "./rabinowitsch";

/** Options of {@link pressureDependence}. */
export interface PressureDependenceOptions {
  /** warn when β_γ·ΔP_max (ln of the rise of the wall stress at the held rate over the die) exceeds this (common practice, no source) */
  maxLogViscosityRise: number;
  maxIterations: number;
  /** two-sided confidence level of the significance test of the curvature (Student t on m − 3 degrees of freedom) */
  confidenceLevel: number;
}

/** Defaults of {@link PressureDependenceOptions}. */
export const DEFAULT_PRESSURE_DEPENDENCE_OPTIONS: Readonly<PressureDependenceOptions> = Object.freeze({ maxLogViscosityRise: 0.1, maxIterations: 100, confidenceLevel: 0.95 });

/** The curved Bagley line at one apparent rate. */
export interface PressureDependenceRow {
  shearRateApparent: number;
  /**
   * β_γ, the coefficient at the held flow rate, 1/Pa (what the curvature measures).
   * @deprecated kept for compatibility: the same value as pressureCoefficientConstantRate; compare
   *   pressureCoefficientConstantStress with literature values
   */
  pressureCoefficient: number;
  /** β_γ = n′·β, 1/Pa (the fitted curvature coefficient at the held flow rate) */
  pressureCoefficientConstantRate: number;
  /** standard error of β_γ, 1/Pa; null with three dies (no degrees of freedom) */
  pressureCoefficientConstantRateStandardError: number | null;
  /** β = β_γ/n′, the constant-stress (shift-factor) coefficient, 1/Pa; null without a positive n′ */
  pressureCoefficientConstantStress: number | null;
  /** standard error of β (that of β_γ over n′), 1/Pa; null when either is unknown */
  pressureCoefficientConstantStressStandardError: number | null;
  /** the n′ used to convert: of the zero-pressure curve (fitted τ_0 across rates) or the flow curve */
  nPrime: number | null;
  /** τ_0, the wall stress at zero pressure, Pa */
  wallShearStressAtZeroPressure: number;
  /** ΔP_ent of the curved fit, Pa */
  entrancePressure: number;
  /** coefficient c of the quadratic ΔP ≈ a + b·x + c·x², Pa */
  curvature: number;
  /** β_γ·ΔP_max: ln of the rise of the wall stress (viscosity at the held rate) from die exit to the highest pressure */
  logViscosityRise: number;
  diesUsed: number;
  /** dies − 3 */
  degreesOfFreedom: number;
  /** true when β_γ differs from 0 at the confidence level (Student t); null without degrees of freedom */
  significant: boolean | null;
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
 * @returns β_γ (1/Pa), τ_0 (Pa), ΔP_ent (Pa) with their standard errors (null with three dies),
 *   the quadratic curvature c, the degrees of freedom m − 3 and whether it converged
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
    const jac = x.map((xi) => jacobianRow(xi, p));
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
  const m = x.length;
  const dof = m - 3;
  let se: [number, number, number] | null = null;
  if (dof > 0) {
    const jac = x.map((xi) => jacobianRow(xi, p));
    const jtj = [0, 1, 2].map((i) => [0, 1, 2].map((j) => jac.reduce((s, row) => s + (row[i] as number) * (row[j] as number), 0)));
    const s2 = ssr(p) / dof;
    const diag = [0, 1, 2].map((k) => solve3(jtj, [0, 1, 2].map((i) => (i === k ? 1 : 0)))?.[k]);
    if (diag.every((d) => d !== undefined && d >= 0)) se = diag.map((d) => Math.sqrt(s2 * (d as number))) as [number, number, number];
  }
  return {
    pressureCoefficient: (p[2] as number) / scale,
    pressureCoefficientStandardError: se === null ? null : se[2] / scale,
    wallShearStressAtZeroPressure: ((p[1] as number) * scale) / 2,
    wallShearStressAtZeroPressureStandardError: se === null ? null : (se[1] * scale) / 2,
    entrancePressure: (p[0] as number) * scale,
    entrancePressureStandardError: se === null ? null : se[0] * scale,
    curvature: c2 * scale,
    degreesOfFreedom: dof,
    converged: converged || ssr(p) <= 1e-20,
  };
}

/** ∂ΔP/∂(ΔP_ent, slope, β) of the Barus curve at x (analytic; the β → 0 limit by series). */
function jacobianRow(x: number, p: number[]): number[] {
  const b = p[1] as number;
  const beta = p[2] as number;
  const u = beta * b * x;
  if (Math.abs(u) < 1e-6) return [1, x * (1 + u), (b * b * x * x) / 2 + (2 * u * b * b * x * x) / 3];
  const dSlope = x / (1 - u);
  const dBeta = (b * x) / (beta * (1 - u)) + Math.log1p(-u) / (beta * beta);
  return [1, dSlope, dBeta];
}

/** Result of {@link pressureDependence}. */
export interface PressureDependenceResult {
  rows: PressureDependenceRow[];
  /**
   * median β_γ over the rates, 1/Pa, or null.
   * @deprecated kept for compatibility; use pressureCoefficientConstantStress
   */
  pressureCoefficient: number | null;
  /** median of the constant-stress β over the rates where it is known, 1/Pa, or null */
  pressureCoefficientConstantStress: number | null;
  warnings: Warning[];
}

/**
 * Pressure-dependence analysis of Bagley lines: one Barus fit per rate with ≥ 3 dies, converted
 * to the constant-stress coefficient with n′ (module comment).
 *
 * Warning codes: PRESSURE_DEPENDENCE (β_γ·ΔP_max above maxLogViscosityRise and β_γ > 0 not
 * refuted by its standard error: the viscosity grows noticeably with pressure, and the straight
 * Bagley line is biased; only positive β are quoted), PRESSURE_CURVATURE_DOWNWARD (the lines bend
 * down beyond the scatter: viscous heating or slip rather than pressure), PRESSURE_EXACT_FIT
 * (three dies fit the three parameters exactly: no standard error, the curvature cannot be told
 * from scatter), PRESSURE_FEW_DIES (fewer than three dies: curvature cannot be seen),
 * PRESSURE_FIT_NOT_CONVERGED.
 *
 * @param lines per rate: the apparent rate, the (x, ΔP) points of its Bagley line and, optionally,
 *   the flow curve's n′ there (used when fewer than three rates can be fitted)
 */
export function pressureDependence(
  lines: { shearRateApparent: number; points: { lengthOverRadius: number; pressure: number }[]; nPrime?: number | null }[],
  options: Partial<PressureDependenceOptions> = {},
): PressureDependenceResult {
  const opt: PressureDependenceOptions = { ...DEFAULT_PRESSURE_DEPENDENCE_OPTIONS, ...options };
  if (!(opt.confidenceLevel > 0 && opt.confidenceLevel < 1)) {
    throw new RheoError("domain", "confidenceLevel", `must be between 0 and 1, got ${opt.confidenceLevel}`);
  }
  const warnings: Warning[] = [];
  const notConverged: number[] = [];
  const fitted: { line: (typeof lines)[number]; fit: ReturnType<typeof fitBarusBagley> }[] = [];
  for (const line of lines) {
    const distinct = new Set(line.points.map((p) => p.lengthOverRadius.toPrecision(9))).size;
    if (distinct < 3) continue;
    const fit = fitBarusBagley(line.points.map((p) => p.lengthOverRadius), line.points.map((p) => p.pressure), opt.maxIterations);
    if (!fit.converged) notConverged.push(line.shearRateApparent);
    fitted.push({ line, fit });
  }
  if (fitted.length === 0) {
    warnings.push(warning("PRESSURE_FEW_DIES", "Pressure dependence needs three or more die lengths at one rate; none was found, so it was not estimated."));
    return { rows: [], pressureCoefficient: null, pressureCoefficientConstantStress: null, warnings };
  }
  const zeroPressureSlopes = zeroPressureNPrime(fitted.map((f) => f.line.shearRateApparent), fitted.map((f) => f.fit.wallShearStressAtZeroPressure));
  const rows: PressureDependenceRow[] = fitted.map(({ line, fit }, i) => {
    const nPrime = zeroPressureSlopes?.[i] ?? (line.nPrime !== undefined && line.nPrime !== null && line.nPrime > 0 ? line.nPrime : null);
    const betaRate = fit.pressureCoefficient;
    const seRate = fit.pressureCoefficientStandardError;
    const significant = seRate === null ? null : Math.abs(betaRate) > tQuantile(0.5 + opt.confidenceLevel / 2, fit.degreesOfFreedom) * seRate;
    return {
      shearRateApparent: line.shearRateApparent,
      pressureCoefficient: betaRate,
      pressureCoefficientConstantRate: betaRate,
      pressureCoefficientConstantRateStandardError: seRate,
      pressureCoefficientConstantStress: nPrime === null ? null : betaRate / nPrime,
      pressureCoefficientConstantStressStandardError: nPrime === null || seRate === null ? null : seRate / nPrime,
      nPrime,
      wallShearStressAtZeroPressure: fit.wallShearStressAtZeroPressure,
      entrancePressure: fit.entrancePressure,
      curvature: fit.curvature,
      logViscosityRise: betaRate * Math.max(...line.points.map((p) => p.pressure)),
      diesUsed: line.points.length,
      degreesOfFreedom: fit.degreesOfFreedom,
      significant,
      converged: fit.converged,
    };
  });
  const exact = rows.filter((r) => r.degreesOfFreedom === 0);
  if (exact.length > 0) {
    warnings.push(
      warning("PRESSURE_EXACT_FIT", `Three dies fit the three parameters of the curved Bagley line exactly at ${exact.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: the pressure coefficient there has no standard error and its curvature cannot be told from scatter; a fourth die length would test it.`),
    );
  }
  const up = rows.filter((r) => r.logViscosityRise > opt.maxLogViscosityRise && r.significant !== false);
  const down = rows.filter((r) => r.logViscosityRise < -opt.maxLogViscosityRise && r.significant !== false);
  if (up.length > 0) {
    const betas = up.map((r) => r.pressureCoefficientConstantStress).filter((b): b is number => b !== null);
    const quoted = betas.length === 0 ? "" : ` (constant-stress β ${betas.length === 1 ? "≈ " + fmt((betas[0] as number) * 1e9) : `${fmt(Math.min(...betas) * 1e9)}–${fmt(Math.max(...betas) * 1e9)}`} GPa⁻¹)`;
    warnings.push(
      warning("PRESSURE_DEPENDENCE", `The Bagley lines bend upwards at ${up.map((r) => fmt(r.shearRateApparent)).join(", ")} 1/s: the viscosity rises with pressure${quoted}, so the straight-line end correction and wall stress are biased there.`),
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
  return {
    rows,
    pressureCoefficient: median(rows.map((r) => r.pressureCoefficientConstantRate)),
    pressureCoefficientConstantStress: median(rows.map((r) => r.pressureCoefficientConstantStress).filter((b): b is number => b !== null)),
    warnings,
  };
}

/** n′ of the zero-pressure curve (τ_0 against γ̇_a) at each rate, when three or more rates with positive τ_0 were fitted. */
function zeroPressureNPrime(rates: number[], stresses: number[]): (number | null)[] | null {
  if (rates.length < 3 || stresses.some((t) => !(t > 0)) || new Set(rates).size !== rates.length) return null;
  const r = rabinowitschCorrection(rates, stresses);
  return r.nPrime.map((n) => (n > 0 ? n : null));
}

function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

function fmt(x: number): string {
  return Number(x.toPrecision(3)).toString();
}
