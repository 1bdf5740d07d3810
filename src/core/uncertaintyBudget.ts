/**
 * Uncertainty budget of each flow-curve point (JCGM 100:2008 "GUM", §5.1 and §5.2). Each input's
 * standard uncertainty u is carried to the readings it affects, the reduction (end correction)
 * is re-run on the moved readings, and the stresses' changes go through the smoother's
 * sensitivity matrix ∂n′_i/∂ln τ_j to n′, γ̇_w and η (numerical sensitivity coefficients, GUM
 * §5.1.3; steps of one standard uncertainty, 1e-4 in ln τ for the smoother; the readings are
 * moved linearly, Δ = c·u, and the stresses' relative changes taken to first order).
 * Contributions of independent inputs add in quadrature; U = k·u_c, k = 2 (about 95 %). The
 * results are the uncertainties of τ_w, γ̇_w, η and n′ at each point's reported apparent rate,
 * i.e. of the flow curve there.
 *
 * Inputs (a bound ±a with no stated confidence is read as rectangular, u = a/√3; GUM §4.3.7):
 * - transducer zero offset: one offset added to every reading of the run (correlated). It cancels
 *   in the Bagley slope and in the orifice difference, not in a single die's stress.
 * - transducer gain: one relative error shared by every reading (correlated). Every step of the
 *   reduction is homogeneous in pressure and the smoother sees ln τ shifted by a constant, so
 *   exactly u_r(τ_w) = u_r(η) = u_g, with n′ and γ̇_w unchanged.
 * - scatter, independent per reading: the plateau standard deviation of each reading when given
 *   (Measurement.pressureStd), each reading moved in turn, so a reading shared by two rates
 *   (interpolation) counts with its correlation. Without plateau deviations: the Bagley line's own
 *   standard error at each rate (type A, three or more dies), independent between rates. Either
 *   way the smoother's n′ carries the scatter into γ̇_w and η (not differences of neighbours).
 * - die bore, die length (each die's own tolerance, independent between dies): the die's readings
 *   are what its true geometry gave at the nominal flow rate. A bore D + δ shears the melt at
 *   γ̇_a·(1 − 3δ/D) (slit gap H: (1 − 2δ/H); slit width W: (1 − δ/W)) and its land pressure,
 *   ∝ L/D, falls by δ/D: Δln ΔP = −(3s + φ)·δ/D, with s = d ln ΔP/d ln γ̇_a along the die's own
 *   readings and φ = 2τ_w·x/ΔP the share of the land in the reading (the rest is the entrance
 *   loss). A length L + δ: Δln ΔP = φ·δ/L. For a Newtonian liquid in one die (s = φ = 1) η moves
 *   by 4δ/D: η ∝ D⁴ at a given pressure and flow rate (Hagen–Poiseuille).
 * - piston speed (flow rate; one relative error for every step) and melt temperature (the shift
 *   law multiplies the rate by a_T = exp(−b·ΔT), b the shift-law coefficient, E_a/(RT²) for
 *   Arrhenius): each reading is its die's pressure at the scaled rate, Δln ΔP = s·u_v or
 *   s·b·u_T, so at the held rate τ_w moves by about n′ times the relative rate change.
 * Checked against a Monte Carlo propagation of distributions (JCGM 101:2008, GUM Supplement 1)
 * that simulates the instrument with every input drawn from its distribution, on two data sets,
 * in test/uncertaintyBudget.test.ts.
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";
import { rabinowitschCorrection, type RabinowitschOptions } from "./rabinowitsch";
import { pressureStandardUncertainty, type Transducer } from "./uncertainty";
import type { PointRow } from "./reduceTypes";

/** The tolerances of the budget (half-widths of rectangular distributions unless said). */
export interface UncertaintyBudgetOptions {
  /** transducer zero offset ±, Pa; default: the transducer's accuracy·full scale */
  zeroOffset?: number;
  /** transducer gain error ±, fraction of the reading; default: the transducer's accuracy */
  gainError?: number;
  /** die bore ± (the slit's gap and width), m (common practice, no source) */
  dieBoreTolerance: number;
  /** die length ±, m (common practice, no source) */
  dieLengthTolerance: number;
  /** melt temperature ± about its set value, K (common practice, no source) */
  meltTemperatureTolerance: number;
  /** piston speed (flow rate) ±, fraction (covers speed and barrel bore; common practice, no source) */
  pistonSpeedTolerance: number;
  /** b = −d ln a_T/dT for the temperature term, 1/K; default: the heating option's b, or b fitted across the file's temperatures */
  temperatureCoefficient?: number;
  /** coverage factor k of the expanded uncertainty */
  coverageFactor: number;
}

/** Defaults of {@link UncertaintyBudgetOptions}. */
export const DEFAULT_UNCERTAINTY_BUDGET_OPTIONS: Readonly<UncertaintyBudgetOptions> = Object.freeze({
  dieBoreTolerance: 5e-6,
  dieLengthTolerance: 25e-6,
  meltTemperatureTolerance: 1,
  pistonSpeedTolerance: 0.005,
  coverageFactor: 2,
});

/** The inputs of the budget, in the order they are reported. */
export const UNCERTAINTY_SOURCES = ["zero", "gain", "scatter", "dieBore", "dieLength", "pistonSpeed", "temperature"] as const;
export type UncertaintySource = (typeof UNCERTAINTY_SOURCES)[number];

/** Standard uncertainties of one point's results from one input, SI (null where the value is). */
export interface UncertaintyContribution {
  source: UncertaintySource;
  /** u(τ_w), Pa */
  wallShearStress: number;
  /** u(γ̇_w), 1/s */
  shearRateWall: number | null;
  /** u(η), Pa·s */
  viscosity: number | null;
  /** u(n′) */
  nPrime: number;
}

/** The budget of one flow-curve point. */
export interface UncertaintyBudgetRow {
  shearRateApparent: number;
  /** one entry per input that was propagated (a source without data is left out) */
  contributions: UncertaintyContribution[];
  /** combined standard uncertainties u_c (root sum of squares of the contributions) */
  combined: Omit<UncertaintyContribution, "source">;
  /** expanded uncertainties U = k·u_c */
  expanded: Omit<UncertaintyContribution, "source">;
  coverageFactor: number;
}

/** One point of the reduction's input, as the re-run needs it (SI; the fields of a PointRow). */
export type BudgetPoint = Pick<PointRow, "dieDiameter" | "slitWidth" | "slitHeight" | "dieLength" | "flowRate" | "pressure" | "pressureStd">;

/** A flow-curve point of a (re-)run. */
export interface BudgetCurvePoint {
  shearRateApparent: number;
  wallShearStress: number;
  nPrime: number;
  shearRateWall: number | null;
  viscosity: number | null;
}

/** What the budget needs of one reduced group. */
export interface BudgetInput {
  points: BudgetPoint[];
  /** the reported flow curve */
  flowCurve: BudgetCurvePoint[];
  /**
   * the reduction of (perturbed) points with the same pipeline and options, or null when it fails;
   * `stressOnly` allows a cheaper smoother when only the stresses are read
   */
  rerun: (points: BudgetPoint[], stressOnly?: boolean) => BudgetCurvePoint[] | null;
  geometry: "round" | "slit";
  rabinowitsch: Partial<RabinowitschOptions>;
  /** standard error of τ_w from the Bagley line at each flow-curve point (three or more dies), else null */
  bagleyStressStandardError: (number | null)[];
  /** b = −d ln a_T/dT at the group's temperature, 1/K, or null when unknown */
  temperatureCoefficient: number | null;
}

/** Relative changes (first order) of one point's τ_w, γ̇_w and η, and the change of n′, caused by one input moved by its u. */
type Delta = { lnTau: number; lnWall: number | null; lnEta: number | null; nPrime: number };

/** d ln f/dn′ of the Rabinowitsch factor f: −1/(n′(3n′+1)) round, −1/(n′(2n′+1)) slit. */
function factorSlope(nPrime: number, geometry: "round" | "slit"): number {
  return geometry === "slit" ? -1 / (nPrime * (2 * nPrime + 1)) : -1 / (nPrime * (3 * nPrime + 1));
}

/**
 * The budget of every flow-curve point of one group (module comment).
 * Warning codes: UNCERTAINTY_NO_SCATTER (no plateau deviations and no Bagley standard error: the
 * random part is missing), UNCERTAINTY_TEMPERATURE_OMITTED (no temperature coefficient b),
 * UNCERTAINTY_PARTIAL (a perturbed re-run failed or lost points: those contributions are missing).
 * @throws RheoError for a bad transducer or negative tolerances.
 */
export function uncertaintyBudget(input: BudgetInput, transducer: Transducer, options: Partial<UncertaintyBudgetOptions> = {}): { rows: UncertaintyBudgetRow[]; warnings: Warning[] } {
  const opt: UncertaintyBudgetOptions = { ...DEFAULT_UNCERTAINTY_BUDGET_OPTIONS, ...options };
  pressureStandardUncertainty(transducer);
  for (const key of ["dieBoreTolerance", "dieLengthTolerance", "meltTemperatureTolerance", "pistonSpeedTolerance", "zeroOffset", "gainError", "temperatureCoefficient"] as const) {
    const v = opt[key];
    if (v !== undefined && (!(v >= 0) || !Number.isFinite(v))) throw new RheoError("domain", key, `must be zero or more, got ${v}`);
  }
  requirePositive(opt.coverageFactor, "coverageFactor");
  const rootThree = Math.sqrt(3);
  const uZero = (opt.zeroOffset ?? transducer.accuracy * transducer.fullScale) / rootThree;
  const uGain = (opt.gainError ?? transducer.accuracy) / rootThree;
  const uBore = opt.dieBoreTolerance / rootThree;
  const uLength = opt.dieLengthTolerance / rootThree;
  const uSpeed = opt.pistonSpeedTolerance / rootThree;
  const uTemperature = opt.meltTemperatureTolerance / rootThree;

  const base = input.rerun(input.points);
  if (base === null) throw new RheoError("convergence", "uncertainty", "the reduction could not be repeated for the uncertainty budget");
  const n = base.length;
  if (input.flowCurve.length !== n) throw new RheoError("value", "flowCurve", `has ${input.flowCurve.length} points but the repeated reduction has ${n}`);
  const stressBase = input.rerun(input.points, true);
  if (stressBase === null || stressBase.length !== n) throw new RheoError("convergence", "uncertainty", "the reduction could not be repeated for the uncertainty budget");
  const warnings: Warning[] = [];
  let lost = 0;
  const variance = new Map<UncertaintySource, Delta[]>();
  const add = (source: UncertaintySource, deltas: Delta[]) => {
    const v = variance.get(source) ?? base.map(() => ({ lnTau: 0, lnWall: 0 as number | null, lnEta: 0 as number | null, nPrime: 0 }));
    deltas.forEach((d, i) => {
      const t = v[i] as Delta;
      t.lnTau += d.lnTau ** 2;
      t.nPrime += d.nPrime ** 2;
      t.lnWall = t.lnWall === null || d.lnWall === null ? null : t.lnWall + d.lnWall ** 2;
      t.lnEta = t.lnEta === null || d.lnEta === null ? null : t.lnEta + d.lnEta ** 2;
    });
    variance.set(source, v);
  };
  const smoother = smootherMatrix(input, base);
  /** A change of ln τ_w at each point, carried to n′, γ̇_w and η through the smoother. */
  const throughSmoother = (lnTauChange: number[]): Delta[] =>
    base.map((b, i) => {
      const dn = smoother[i]?.reduce((sum, sij, j) => sum + sij * (lnTauChange[j] as number), 0) ?? 0;
      const t = lnTauChange[i] as number;
      const w = b.nPrime > 0 && b.shearRateWall !== null ? factorSlope(b.nPrime, input.geometry) * dn : null;
      return { lnTau: t, lnWall: w, lnEta: w === null ? null : t - w, nPrime: dn };
    });
  /** The readings moved (pressures only, so every rate stays put): the stresses' change through the end correction, then the smoother. */
  const readingsMoved = (pressure: (p: BudgetPoint, k: number) => number): Delta[] | null => {
    const run = input.rerun(input.points.map((p, k) => ({ ...p, pressure: pressure(p, k) })), true);
    if (run === null || run.length !== n) {
      lost++;
      return null;
    }
    // first-order relative change (the end correction is linear in the readings)
    return throughSmoother(run.map((c, j) => c.wallShearStress / (stressBase[j] as BudgetCurvePoint).wallShearStress - 1));
  };
  const propagate = (source: UncertaintySource, pressure: (p: BudgetPoint, k: number) => number) => {
    const d = readingsMoved(pressure);
    if (d) add(source, d);
  };
  const shape = readingShape(input.points, base, input.geometry);
  if (uZero > 0) propagate("zero", (p) => p.pressure + uZero);
  // gain: every step is homogeneous in pressure, so exactly u_r(τ_w) = u_r(η) = u_g, n′ unchanged
  if (uGain > 0) add("gain", base.map((b) => ({ lnTau: uGain, lnWall: b.shearRateWall === null ? null : 0, lnEta: b.shearRateWall === null ? null : uGain, nPrime: 0 })));

  const withStd = input.points.some((p) => p.pressureStd !== undefined && p.pressureStd > 0);
  if (withStd) {
    add("scatter", base.map(() => ({ lnTau: 0, lnWall: 0, lnEta: 0, nPrime: 0 })));
    input.points.forEach((q, k) => {
      const sd = q.pressureStd ?? 0;
      if (sd > 0) propagate("scatter", (p, j) => (j === k ? p.pressure + sd : p.pressure));
    });
  } else if (input.bagleyStressStandardError.some((se) => se !== null && se > 0)) {
    add("scatter", base.map(() => ({ lnTau: 0, lnWall: 0, lnEta: 0, nPrime: 0 })));
    input.bagleyStressStandardError.forEach((se, j) => {
      if (se === null || !(se > 0)) return;
      add("scatter", throughSmoother(base.map((b, i) => (i === j ? se / b.wallShearStress : 0))));
    });
  } else {
    warnings.push(
      warning("UNCERTAINTY_NO_SCATTER", "The budget has no random part: no plateau standard deviation was given per reading, and no Bagley line has three or more dies to estimate the scatter; the ± values cover the systematic inputs only."),
    );
  }

  // A die's true bore or length differs from the value the reduction uses: its readings are what
  // the true geometry gave at the nominal flow rate (module comment).
  for (const dieLength of dieLengths(input.points)) {
    const ofDie = (p: BudgetPoint) => Math.abs(p.dieLength - dieLength) <= 1e-6 * dieLength;
    const size = (p: BudgetPoint) => (input.geometry === "slit" ? (p.slitHeight as number) : p.dieDiameter);
    if (uBore > 0) {
      // round: γ̇_a ∝ D⁻³, die pressure ∝ 1/D; slit gap: γ̇_a ∝ H⁻², die pressure ∝ 1/H
      const rateExponent = input.geometry === "slit" ? 2 : 3;
      propagate("dieBore", (p, k) => (ofDie(p) ? p.pressure * (1 - (rateExponent * (shape[k] as Shape).slope + (shape[k] as Shape).dieFraction) * (uBore / size(p))) : p.pressure));
      if (input.geometry === "slit") {
        // slit width: γ̇_a ∝ 1/W
        propagate("dieBore", (p, k) => (ofDie(p) ? p.pressure * (1 - (shape[k] as Shape).slope * (uBore / (p.slitWidth as number))) : p.pressure));
      }
    }
    if (uLength > 0) propagate("dieLength", (p, k) => (ofDie(p) ? p.pressure * (1 + (shape[k] as Shape).dieFraction * (uLength / p.dieLength)) : p.pressure));
  }
  // a common scale of the flow rate (speed), or of the rate by the temperature shift
  // (a_T = exp(−b·ΔT) multiplies the rate): each reading is its die's pressure at the scaled rate
  if (uSpeed > 0) propagate("pistonSpeed", (p, k) => p.pressure * (1 + (shape[k] as Shape).slope * uSpeed));
  if (uTemperature > 0) {
    const b = opt.temperatureCoefficient ?? input.temperatureCoefficient;
    if (b === null) {
      warnings.push(warning("UNCERTAINTY_TEMPERATURE_OMITTED", "The melt-temperature tolerance was not propagated: give the temperature coefficient b (or measure at two or more temperatures so it can be fitted)."));
    } else {
      propagate("temperature", (p, k) => p.pressure * (1 + (shape[k] as Shape).slope * b * uTemperature));
    }
  }
  if (lost > 0) {
    warnings.push(warning("UNCERTAINTY_PARTIAL", `${lost} perturbed repetition(s) of the reduction failed or lost points; those contributions are missing from the budget.`));
  }

  const k = opt.coverageFactor;
  const rows = input.flowCurve.map((f, i): UncertaintyBudgetRow => {
    const contributions: UncertaintyContribution[] = [];
    for (const source of UNCERTAINTY_SOURCES) {
      const v = variance.get(source)?.[i];
      if (!v) continue;
      contributions.push({
        source,
        wallShearStress: f.wallShearStress * Math.sqrt(v.lnTau),
        shearRateWall: f.shearRateWall === null || v.lnWall === null ? null : f.shearRateWall * Math.sqrt(v.lnWall),
        viscosity: f.viscosity === null || v.lnEta === null ? null : f.viscosity * Math.sqrt(v.lnEta),
        nPrime: Math.sqrt(v.nPrime),
      });
    }
    const rss = (get: (c: UncertaintyContribution) => number | null) => {
      let sum = 0;
      for (const c of contributions) {
        const x = get(c);
        if (x === null) return null;
        sum += x * x;
      }
      return Math.sqrt(sum);
    };
    const combined = {
      wallShearStress: rss((c) => c.wallShearStress) as number,
      shearRateWall: f.shearRateWall === null ? null : rss((c) => c.shearRateWall),
      viscosity: f.viscosity === null ? null : rss((c) => c.viscosity),
      nPrime: rss((c) => c.nPrime) as number,
    };
    const times = (x: number | null) => (x === null ? null : k * x);
    return {
      shearRateApparent: f.shearRateApparent,
      contributions,
      combined,
      expanded: { wallShearStress: k * combined.wallShearStress, shearRateWall: times(combined.shearRateWall), viscosity: times(combined.viscosity), nPrime: k * combined.nPrime },
      coverageFactor: k,
    };
  });
  return { rows, warnings };
}

/** How a reading responds to its die's geometry (see {@link readingShape}). */
interface Shape {
  /** d ln ΔP/d ln γ̇_a along the die's own readings */
  slope: number;
  /** the share of the reading due to flow in the land, 2τ_w·x/ΔP (the rest is the entrance loss), at most 1 */
  dieFraction: number;
}

/**
 * Per reading: the log-slope of its die's pressure against rate (neighbouring readings of the same
 * die; the flow curve's n′ for a die with one reading) and the share of the land, 2τ_w(γ̇_a)·x/ΔP
 * with τ_w of the reduced curve interpolated log–log in rate (ends held) and x = L/R (L/H slit).
 */
function readingShape(points: BudgetPoint[], curve: BudgetCurvePoint[], geometry: "round" | "slit"): Shape[] {
  const rateOf = (p: BudgetPoint) => (geometry === "slit" ? (6 * p.flowRate) / ((p.slitWidth as number) * (p.slitHeight as number) ** 2) : (32 * p.flowRate) / (Math.PI * p.dieDiameter ** 3));
  const sorted = [...curve].sort((a, b) => a.shearRateApparent - b.shearRateApparent);
  const at = (rate: number, get: (c: BudgetCurvePoint) => number) => {
    const lo = sorted[0] as BudgetCurvePoint;
    const hi = sorted[sorted.length - 1] as BudgetCurvePoint;
    if (rate <= lo.shearRateApparent) return get(lo);
    if (rate >= hi.shearRateApparent) return get(hi);
    const k = sorted.findIndex((c) => c.shearRateApparent >= rate);
    const a = sorted[k - 1] as BudgetCurvePoint;
    const b = sorted[k] as BudgetCurvePoint;
    const w = Math.log(rate / a.shearRateApparent) / Math.log(b.shearRateApparent / a.shearRateApparent);
    return Math.exp((1 - w) * Math.log(get(a)) + w * Math.log(get(b)));
  };
  return points.map((p) => {
    const die = points.filter((q) => Math.abs(q.dieLength - p.dieLength) <= 1e-6 * p.dieLength).sort((a, b) => rateOf(a) - rateOf(b));
    const k = die.indexOf(p);
    const a = die[Math.max(0, k - 1)] as BudgetPoint;
    const b = die[Math.min(die.length - 1, k + 1)] as BudgetPoint;
    const dx = Math.log(rateOf(b)) - Math.log(rateOf(a));
    const slope = dx > 0 ? (Math.log(b.pressure) - Math.log(a.pressure)) / dx : at(rateOf(p), (c) => Math.max(c.nPrime, 1e-6));
    const x = geometry === "slit" ? p.dieLength / (p.slitHeight as number) : (2 * p.dieLength) / p.dieDiameter;
    const dieFraction = Math.min(1, (2 * at(rateOf(p), (c) => c.wallShearStress) * x) / p.pressure);
    return { slope, dieFraction };
  });
}

/** Distinct die lengths of the points (within 1e-6 relative). */
function dieLengths(points: BudgetPoint[]): number[] {
  const out: number[] = [];
  for (const p of [...points].sort((a, b) => a.dieLength - b.dieLength)) {
    const last = out[out.length - 1];
    if (last === undefined || Math.abs(p.dieLength - last) > 1e-6 * last) out.push(p.dieLength);
  }
  return out;
}

/** ∂n′_i/∂ln τ_j of the smoother at the group's curve (one-sided, step 1e-4 in ln τ). */
function smootherMatrix(input: BudgetInput, base: BudgetCurvePoint[]): number[][] {
  const h = 1e-4;
  const rates = base.map((c) => c.shearRateApparent);
  const stress = base.map((c) => c.wallShearStress);
  const options = { ...input.rabinowitsch, geometry: input.geometry };
  const n0 = rabinowitschCorrection(rates, stress, options).nPrime;
  const columns = stress.map((_, j) => {
    const moved = rabinowitschCorrection(rates, stress.map((t, i) => (i === j ? t * Math.exp(h) : t)), options).nPrime;
    return moved.map((v, i) => (v - (n0[i] as number)) / h);
  });
  return base.map((_, i) => columns.map((col) => col[i] as number));
}
