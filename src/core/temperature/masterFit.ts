/**
 * The fit across temperatures: one viscosity model fitted jointly to the flow curves of every
 * temperature of a test, with its temperature law, by time–temperature superposition
 * (Dealy & Wang, Melt Rheology (2013), ch. 4; Ferry, Viscoelastic Properties of Polymers (1980)):
 *
 *   ln η(γ̇, T) = ln a_T + ln η_ref(a_T·γ̇)        η_ref: Carreau–Yasuda, Carreau, Cross or power law at T_ref
 *   Arrhenius   ln a_T = (Ea/R)(1/T − 1/T_ref)
 *   WLF         ln a_T = −ln 10 · c1 (T − T_ref)/(c2 + T − T_ref)   (Williams, Landel & Ferry 1955)
 *
 * and Cross-WLF (Hieber & Shen, J. Non-Newt. Fluid Mech. 7 (1980) 1), reported with the names of
 * the common injection-moulding form: η = η0/(1 + (η0·γ̇/τ*)^(1−n)),
 * η0 = D1·exp(−A1(T − T*)/(Ã2 + T − T*)), T* = D2 + D3·p, A2 = Ã2 + D3·p. Capillary points carry
 * no separate pressure level, so D3 is held at 0 (T* = D2, A2 = Ã2); Ã2 is held at 51.6 K (the
 * universal WLF C2) unless given. Keys: n, tauStar, D1, D2, D3, A1, A2tilde. Cross-WLF is a WLF
 * law with T_ref = D2, c1 = A1/ln 10, c2 = Ã2.
 *
 * The shared shape is what makes the fit worth doing: each temperature sees the curve through a
 * window shifted by a_T, so the joint fit sees a wider reduced-rate window than any one curve, and
 * η0 and λ can be determined where one temperature alone cannot.
 *
 * Method: residuals r = ln η_model − ln η over every point, solved by the Levenberg–Marquardt
 * solver of fit/ with analytic Jacobians: ∂r/∂p (model parameters at the reduced rate) and
 * ∂r/∂θ = ∂ln a_T/∂θ·(1 + d ln η_ref/d ln γ̇) for the law's constants θ. Start: the polynomial
 * shift fit (fitShift.ts) for θ, then the model fitted to the master curve it gives. Parameters
 * are judged as in a single-curve fit (fit/parameterReport.ts), the plateau test on the reduced
 * window (a_T·γ̇ over every temperature).
 */
import { RheoError, requirePositive, warning, type Warning } from "../errors";
import { DEFAULT_FIT_OPTIONS } from "../fit/options";
import { fitModel, type FitResult } from "../fit/fitModel";
import { levenbergMarquardt, type LeastSquaresProblem, type StopReason } from "../fit/levenbergMarquardt";
import { fitStatistics } from "../fit/statistics";
import { tQuantile } from "../fit/studentT";
import { transformFor, type Transform } from "../fit/transforms";
import { dataWindows, plateauTest, type Undetermined } from "../fit/determination";
import { reportParameters, type ParameterEntry } from "../fit/parameterReport";
import { checkParameterValue, getModel, type ModelDefinition, type ParameterSpec } from "../models";
import { PLATEAU_PARAMETERS } from "../models/families";
import { CROSS_WLF_DEFAULT_A2 } from "../models/crossWlf";
import { inside } from "../models/guess";
import { parameter } from "../models/parameterSpec";
import { materialFixed, MATERIAL_CLASSES, type MaterialClass } from "../flowCurveFits";
import { validateCurves, type TemperatureCurve } from "./curves";
import { fitArrheniusShift, fitWlfShift } from "./fitShift";
import { masterCurve } from "./masterCurve";
import { GAS_CONSTANT, WLF_UNIVERSAL_C2, type ShiftLaw } from "./shiftFactors";

/** Models the fit across temperatures accepts. */
export const MASTER_MODELS = Object.freeze(["power-law", "cross", "carreau", "carreau-yasuda", "cross-wlf"] as const);
export type MasterModel = (typeof MASTER_MODELS)[number];

/** Temperature laws of the fit across temperatures (Cross-WLF carries its own). */
export const MASTER_LAWS = Object.freeze(["arrhenius", "wlf"] as const);
export type MasterLaw = (typeof MASTER_LAWS)[number];

/** Options of {@link fitMasterCurve}; defaults in {@link DEFAULT_MASTER_FIT_OPTIONS}. */
export interface MasterFitOptions {
  /** The temperature law; required for every model but cross-wlf (which has its own). */
  law: MasterLaw | null;
  /**
   * T_ref (K) of the law; required for every model but cross-wlf, whose reference temperature is
   * D2: given, it holds D2 there (commonly the glass transition); absent, D2 is fitted.
   */
  referenceTemperature: number | null;
  /** Melt (default) holds η∞ = 0 (flowCurveFits.ts). */
  material: MaterialClass;
  /**
   * Parameters held at given SI values: model parameters, activationEnergy (J/mol), c1, c2 (K);
   * for cross-wlf n, tauStar, D1, D2 (K), D3 (K/Pa, only 0), A1, A2tilde (K).
   */
  fixed: Record<string, number>;
  /**
   * Starting values (SI) of free parameters, by the same names as `fixed`; when every free
   * parameter has one, the automatic start (polynomial shift fit, then the model on its master
   * curve) is skipped. For cross-wlf they go to the single-curve fitter (fit/fitModel.ts).
   */
  initial: Record<string, number>;
  maxIterations: number;
  confidenceLevel: number;
  /** Largest relative standard error of a determined parameter (fit/determination.ts). */
  maxRelativeStandardError: number;
}

/** Defaults of the fit across temperatures; docs and tests import this constant. */
export const DEFAULT_MASTER_FIT_OPTIONS: Readonly<MasterFitOptions> = Object.freeze({
  law: null,
  referenceTemperature: null,
  material: "melt",
  fixed: {},
  initial: {},
  maxIterations: DEFAULT_FIT_OPTIONS.maxIterations,
  confidenceLevel: DEFAULT_FIT_OPTIONS.confidenceLevel,
  maxRelativeStandardError: DEFAULT_FIT_OPTIONS.maxRelativeStandardError,
} as MasterFitOptions);

/** What the fit across temperatures found. SI units; standard errors NaN where undefined. */
export interface MasterFitResult {
  model: MasterModel;
  law: MasterLaw;
  /** K; D2 for cross-wlf */
  referenceTemperature: number;
  /** the model's parameters at T_ref (the law's constants are activationEnergy or c1, c2) */
  parameters: Record<string, number>;
  /** free parameters, the law's constants included */
  standardErrors: Record<string, number>;
  confidenceIntervals: Record<string, [number, number]>;
  /** Ea (J/mol), Arrhenius only */
  activationEnergy?: number;
  /** WLF (and Cross-WLF) only: c1 (-), c2 (K) */
  c1?: number;
  c2?: number;
  determined: Record<string, boolean>;
  undetermined: Record<string, Undetermined>;
  wellDetermined: boolean;
  fixed: string[];
  converged: boolean;
  stopReason: StopReason;
  iterations: number;
  r2: number;
  /** in ln η */
  rmse: number;
  aic: number;
  ssr: number;
  pointCount: number;
  parameterCount: number;
  /** the measured temperatures (K), ascending */
  temperatures: number[];
  /** a_T at each measured temperature */
  factors: { temperature: number; aT: number }[];
  /** reduced rates a_T·γ̇ (1/s) the fit saw; the curve at T_ref is an extrapolation outside them */
  reducedShearRateRange: [number, number];
  warnings: Warning[];
}

const ACTIVATION_ENERGY = parameter("activationEnergy", "J/mol", "flow activation energy Ea", 0);
const C1 = parameter("c1", "1", "WLF constant c1", 0);

/** Specifications of the Cross-WLF parameters under their literature names. */
export const CROSS_WLF_LITERATURE: readonly ParameterSpec[] = Object.freeze([
  parameter("n", "1", "flow index n (0 < n < 1)", 0, { max: 1 }),
  parameter("tauStar", "Pa", "critical stress τ* at the onset of shear thinning", 0),
  parameter("D1", "Pa.s", "zero-shear viscosity at T = T*", 0),
  parameter("D2", "K", "T* at zero pressure (commonly the glass transition)", 0),
  parameter("D3", "K/Pa", "pressure dependence of T* (held at 0)", 0, { minInclusive: true }),
  parameter("A1", "1", "WLF-type constant A1", 0),
  parameter("A2tilde", "K", "WLF-type constant Ã2 (held at 51.6 K unless given)", 0),
]);

/**
 * Fits one model jointly to viscosity curves at several temperatures (see the module comment).
 * @param curves one curve per temperature: T (K), γ̇ (1/s), η (Pa·s); at least two temperatures
 *   (three for cross-wlf, whose η0(T) has three constants)
 * @param model power-law, cross, carreau, carreau-yasuda or cross-wlf
 * @throws RheoError naming the argument: an unknown model or law, a missing law or reference
 *   temperature, invalid curves (naming curves[i].field and row), fewer temperatures than the
 *   law needs, fixed values outside a parameter's range or of unknown names, D3 other than 0.
 * @example fitMasterCurve(curves, "carreau-yasuda", { law: "arrhenius", referenceTemperature: 483.15 }).activationEnergy
 */
export function fitMasterCurve(curves: readonly TemperatureCurve[], model: string, options: Partial<MasterFitOptions> = {}): MasterFitResult {
  const opts: MasterFitOptions = { ...DEFAULT_MASTER_FIT_OPTIONS, ...Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) };
  const id = String(model).trim().toLowerCase().replace(/[\s_]+/g, "-");
  if (!(MASTER_MODELS as readonly string[]).includes(id)) {
    throw new RheoError("value", "model", `the fit across temperatures takes ${MASTER_MODELS.join(", ")}; got "${model}"`);
  }
  if (!MATERIAL_CLASSES.includes(opts.material)) throw new RheoError("value", "material", `unknown material class "${String(opts.material)}"; accepted: ${MATERIAL_CLASSES.join(", ")}`);
  if (!(opts.maxIterations > 0) || !(opts.confidenceLevel > 0 && opts.confidenceLevel < 1) || !(opts.maxRelativeStandardError > 0)) {
    throw new RheoError("value", "options", "maxIterations and maxRelativeStandardError must be positive, confidenceLevel between 0 and 1");
  }
  if (id === "cross-wlf") return fitCrossWlf(curves, opts);
  const law = opts.law;
  if (law === null) throw new RheoError("missing", "law", `the fit of ${id} across temperatures needs a temperature law: ${MASTER_LAWS.join(" or ")}`);
  if (!(MASTER_LAWS as readonly string[]).includes(law)) throw new RheoError("value", "law", `unknown temperature law "${String(law)}"; accepted: ${MASTER_LAWS.join(", ")}`);
  if (opts.referenceTemperature === null) throw new RheoError("missing", "referenceTemperature", `the ${law} law needs a reference temperature (K)`);
  requirePositive(opts.referenceTemperature, "referenceTemperature");
  validateCurves(curves, 2);
  return fitShiftedModel(curves, getModel(id), law, opts.referenceTemperature, opts);
}

/** One point of the joint fit. */
interface Point {
  T: number;
  lnRate: number;
  lnEta: number;
}

/** d ln η/d ln γ̇ of an isothermal model from its gradient: λ·∂ln η/∂λ for models of λγ̇, n − 1 for the power law. */
function rateSlope(def: ModelDefinition): (p: ArrayLike<number>, gradient: Float64Array) => number {
  const lambda = def.parameters.findIndex((s) => s.name === "lambda");
  if (lambda >= 0) return (p, g) => (p[lambda] as number) * (g[lambda] as number);
  const n = def.parameters.findIndex((s) => s.name === "n");
  if (def.id === "power-law") return (p) => (p[n] as number) - 1;
  throw new RheoError("value", "model", `${def.id} cannot be shifted in the fit across temperatures`);
}

function fitShiftedModel(curves: readonly TemperatureCurve[], def: ModelDefinition, law: MasterLaw, Tref: number, opts: MasterFitOptions): MasterFitResult {
  const points: Point[] = curves.flatMap((c) => c.shearRate.map((g, i) => ({ T: c.temperature, lnRate: Math.log(g), lnEta: Math.log(c.viscosity[i] as number) })));
  const temperatures = [...new Set(curves.map((c) => c.temperature))].sort((a, b) => a - b);
  const Tmin = temperatures[0] as number;
  const Tmax = temperatures[temperatures.length - 1] as number;
  const warnings: Warning[] = [];
  const c2Spec = parameter("c2", "K", "WLF constant c2", Math.max(0, Tref - Tmin));
  const lawSpecs = law === "arrhenius" ? [ACTIVATION_ENERGY] : [C1, c2Spec];
  const specs = [...def.parameters, ...lawSpecs];
  const m = def.parameters.length;

  // Held values: the material's, then the user's (validated), then C2 with fewer than three temperatures.
  const held: Record<string, number> = { ...materialFixed(opts.material, def.id) };
  for (const [name, value] of Object.entries(opts.fixed)) {
    const spec = specs.find((s) => s.name === name);
    if (!spec) throw new RheoError("value", `fixed.${name}`, `unknown parameter for ${def.id} with the ${law} law; accepted: ${specs.map((s) => s.name).join(", ")}`);
    if (spec === c2Spec || lawSpecs.includes(spec)) {
      if (!Number.isFinite(value) || value <= spec.min) throw new RheoError("domain", `fixed.${name}`, `must be greater than ${spec.min}, got ${value}`);
    } else checkParameterValue(def, name, value, `fixed.${name}`);
    held[name] = value;
  }
  if (law === "wlf" && temperatures.length < 3 && held.c1 === undefined && held.c2 === undefined) {
    held.c2 = Math.max(WLF_UNIVERSAL_C2, c2Spec.min + 1);
    warnings.push(warning("MASTER_C2_HELD", `two temperatures determine one WLF constant: c2 is held at ${held.c2} K and c1 fitted`));
  }
  const freeIndex = specs.map((_, j) => j).filter((j) => !((specs[j] as ParameterSpec).name in held));
  const k = freeIndex.length;
  if (k === 0) throw new RheoError("value", "fixed", `holds every parameter of ${def.id} with the ${law} law; nothing is left to fit`);
  if (points.length <= k) throw new RheoError("missing", "curves", `${points.length} points cannot determine ${k} free parameters; at least ${k + 1} are needed`);

  const logShift = (p: ArrayLike<number>, T: number, grad: Float64Array | null): number => {
    if (law === "arrhenius") {
      const x = 1 / T - 1 / Tref;
      if (grad) grad[0] = x / GAS_CONSTANT;
      return ((p[m] as number) / GAS_CONSTANT) * x;
    }
    const dT = T - Tref;
    const c1 = p[m] as number;
    const den = (p[m + 1] as number) + dT;
    if (grad) {
      grad[0] = (-Math.LN10 * dT) / den;
      grad[1] = (Math.LN10 * c1 * dT) / (den * den);
    }
    return (-Math.LN10 * c1 * dT) / den;
  };

  for (const [name, value] of Object.entries(opts.initial)) {
    const spec = specs.find((x) => x.name === name);
    if (!spec || name in held) throw new RheoError("value", `initial.${name}`, `is not a free parameter of ${def.id} with the ${law} law; free: ${specs.filter((x) => !(x.name in held)).map((x) => x.name).join(", ")}`);
    if (!(Number.isFinite(value) && value > spec.min && value < spec.max)) throw new RheoError("domain", `initial.${name}`, `must lie inside (${spec.min}, ${spec.max}), got ${value}`);
  }
  const everyGiven = specs.every((x) => x.name in held || x.name in opts.initial);
  const start = everyGiven ? Float64Array.from(specs, (x) => held[x.name] ?? (opts.initial[x.name] as number)) : startValues(curves, def, law, Tref, specs, held, opts);
  for (const [name, value] of Object.entries(opts.initial)) start[specs.findIndex((x) => x.name === name)] = value;
  const transforms = freeIndex.map((j) => transformFor(specs[j] as ParameterSpec));
  const slope = rateSlope(def);
  const p = Float64Array.from(start);
  const dpdu = new Float64Array(k);
  const gradient = new Float64Array(m);
  const lawGrad = new Float64Array(lawSpecs.length);
  const n = points.length;
  const problem: LeastSquaresProblem = {
    residualCount: n,
    parameterCount: k,
    evaluate(u, r, jac) {
      for (let f = 0; f < k; f++) {
        const t = transforms[f] as Transform;
        p[freeIndex[f] as number] = t.fromFree(u[f] as number);
        dpdu[f] = t.derivative(u[f] as number);
      }
      for (let i = 0; i < n; i++) {
        const pt = points[i] as Point;
        const lnA = logShift(p, pt.T, jac ? lawGrad : null);
        const L = def.logGradient(p, Math.exp(pt.lnRate + lnA), NaN, gradient);
        const ri = L + lnA - pt.lnEta;
        if (!Number.isFinite(ri)) return false;
        r[i] = ri;
        if (!jac) continue;
        const through = 1 + slope(p, gradient);
        for (let f = 0; f < k; f++) {
          const j = freeIndex[f] as number;
          const d = j < m ? (gradient[j] as number) : (lawGrad[j - m] as number) * through;
          const v = d * (dpdu[f] as number);
          if (!Number.isFinite(v)) return false;
          jac[i * k + f] = v;
        }
      }
      return true;
    },
  };
  const u0 = freeIndex.map((j, f) => (transforms[f] as Transform).toFree(start[j] as number));
  const solved = levenbergMarquardt(problem, u0, { ...DEFAULT_FIT_OPTIONS, maxIterations: opts.maxIterations });
  if (solved.stopReason === "not-finite") throw new RheoError("convergence", "curves", `the fit of ${def.id} across temperatures gives non-finite viscosities at its starting values`);
  for (let f = 0; f < k; f++) p[freeIndex[f] as number] = (transforms[f] as Transform).fromFree(solved.u[f] as number);

  // Jacobian in the original parameters (∂r/∂p = (∂r/∂u)/(dp/du)) and each column's influence on ln η.
  const jacobian = Float64Array.from(solved.jacobian);
  const influence = new Float64Array(k);
  freeIndex.forEach((j, f) => {
    const d = (transforms[f] as Transform).derivative(solved.u[f] as number);
    for (let i = 0; i < n; i++) {
      const v = (jacobian[i * k + f] as number) / d;
      jacobian[i * k + f] = v;
      influence[f] = Math.max(influence[f] as number, Math.abs(v * (p[j] as number)));
    }
  });
  const stats = fitStatistics(jacobian, solved.residuals, Float64Array.from(points, (q) => q.lnEta), new Float64Array(n).fill(1), k, opts.confidenceLevel);

  const modelParameters: Record<string, number> = {};
  def.parameters.forEach((s, j) => (modelParameters[s.name] = p[j] as number));
  const aT = (T: number) => Math.exp(logShift(p, T, null));
  const reducedRates = points.map((q) => Math.exp(q.lnRate) * aT(q.T));
  const reducedViscosity = points.map((q) => Math.exp(q.lnEta) / aT(q.T));
  const plateau = solved.converged ? plateauTest(def.id, modelParameters, dataWindows(reducedRates, reducedViscosity)) : {};
  const entries: ParameterEntry[] = specs.map((spec, j) => {
    const f = freeIndex.indexOf(j);
    return {
      spec,
      value: p[j] as number,
      free: f >= 0,
      standardError: f >= 0 ? (stats.standardErrors[f] as number) : NaN,
      atBound: f >= 0 && (influence[f] as number) < 1e-7,
      plateau: plateau[spec.name],
    };
  });
  const t = tQuantile((1 + opts.confidenceLevel) / 2, n - k);
  const report = reportParameters(entries, t, opts.maxRelativeStandardError, PLATEAU_PARAMETERS[def.id]?.plateau);
  if (!solved.converged) warnings.push(warning("NOT_CONVERGED", `the fit of ${def.id} across temperatures stopped after ${solved.iterations} iterations (${solved.stopReason}) before converging`));
  warnings.push(...report.warnings);
  if (stats.singular) warnings.push(warning("SINGULAR_COVARIANCE", `the parameters of ${def.id} with the ${law} law are not independently determined by these data; no standard errors`));
  if (Tref < Tmin || Tref > Tmax) {
    warnings.push(warning("REFERENCE_OUTSIDE_DATA", `the reference temperature ${Tref} K lies outside the measured ${Tmin}–${Tmax} K; the curve at T_ref is an extrapolation in temperature`));
  }
  const lawValue = (name: string) => p[specs.findIndex((s) => s.name === name)] as number;
  return {
    model: def.id as MasterModel,
    law,
    referenceTemperature: Tref,
    parameters: modelParameters,
    standardErrors: report.standardErrors,
    confidenceIntervals: report.confidenceIntervals,
    ...(law === "arrhenius" ? { activationEnergy: lawValue("activationEnergy") } : { c1: lawValue("c1"), c2: lawValue("c2") }),
    determined: report.determined,
    undetermined: report.undetermined,
    wellDetermined: solved.converged && !stats.singular && Object.keys(report.undetermined).length === 0,
    fixed: specs.filter((s) => s.name in held).map((s) => s.name),
    converged: solved.converged,
    stopReason: solved.stopReason,
    iterations: solved.iterations,
    r2: stats.r2,
    rmse: stats.rmse,
    aic: stats.aic,
    ssr: stats.ssr,
    pointCount: n,
    parameterCount: k,
    temperatures,
    factors: temperatures.map((T) => ({ temperature: T, aT: aT(T) })),
    reducedShearRateRange: [Math.min(...reducedRates), Math.max(...reducedRates)],
    warnings,
  };
}

/**
 * Starting values: the law's constants from the polynomial shift fit (or common values when it
 * fails: Ea 50 kJ/mol; c1 8.86, c2 101.6 K, the WLF constants at T_ref ≈ T_g + 50 K, Williams,
 * Landel & Ferry 1955, from memory), then the model fitted to the master curve they give.
 */
function startValues(
  curves: readonly TemperatureCurve[],
  def: ModelDefinition,
  law: MasterLaw,
  Tref: number,
  specs: readonly ParameterSpec[],
  held: Record<string, number>,
  opts: MasterFitOptions,
): Float64Array {
  const m = def.parameters.length;
  let shift: ShiftLaw;
  if (law === "arrhenius") {
    let Ea = held.activationEnergy;
    if (Ea === undefined) {
      try {
        Ea = fitArrheniusShift(curves, Tref).activationEnergy;
      } catch {
        Ea = 50e3;
      }
      if (!(Ea > 0)) Ea = 50e3;
    }
    shift = { law, referenceTemperature: Tref, activationEnergy: Ea };
  } else {
    let C1v = held.c1;
    let C2v = held.c2;
    if (C1v === undefined || C2v === undefined) {
      try {
        const s = fitWlfShift(curves, Tref, { ...(C1v !== undefined ? { C1: C1v } : {}), ...(C2v !== undefined ? { C2: C2v } : {}) });
        C1v ??= s.C1;
        C2v ??= s.C2;
      } catch {
        C1v ??= 8.86;
        C2v ??= 101.6;
      }
    }
    const c2Min = (specs[m + 1] as ParameterSpec).min;
    if (!(C1v > 0)) C1v = 8.86;
    if (!(C2v > c2Min)) C2v = c2Min + 50;
    shift = { law, referenceTemperature: Tref, C1: C1v, C2: C2v };
  }
  const master = masterCurve(curves, shift);
  const modelHeld = Object.fromEntries(Object.entries(held).filter(([name]) => def.parameters.some((s) => s.name === name)));
  let modelStart: number[];
  try {
    const fit = fitModel(def.id, { shearRate: master.shearRate, viscosity: master.viscosity }, { fixed: modelHeld, maxIterations: opts.maxIterations });
    modelStart = def.parameters.map((s) => fit.parameters[s.name] as number);
  } catch {
    modelStart = def.initialGuess({ shearRate: master.shearRate, viscosity: master.viscosity });
  }
  const lawStart = shift.law === "arrhenius" ? [shift.activationEnergy] : [shift.C1, shift.C2];
  return Float64Array.from(specs, (spec, j) => {
    if (spec.name in held) return held[spec.name] as number;
    const v = j < m ? (modelStart[j] as number) : (lawStart[j - m] as number);
    return inside(v, spec.min, spec.max);
  });
}

/** Cross-WLF through the single-curve fitter (the model carries T), reported under its literature names. */
function fitCrossWlf(curves: readonly TemperatureCurve[], opts: MasterFitOptions): MasterFitResult {
  validateCurves(curves, 2);
  const known = CROSS_WLF_LITERATURE.map((s) => s.name);
  const toModel: Record<string, string> = { n: "n", tauStar: "tauStar", D1: "D1", D2: "Tstar", A1: "A1", A2tilde: "A2" };
  const fixed: Record<string, number> = { A2: CROSS_WLF_DEFAULT_A2 };
  for (const [name, value] of Object.entries(opts.fixed)) {
    if (!known.includes(name)) throw new RheoError("value", `fixed.${name}`, `unknown Cross-WLF parameter; accepted: ${known.join(", ")}`);
    if (name === "D3") {
      if (value !== 0) throw new RheoError("value", "fixed.D3", `only 0 is supported: capillary points carry no separate pressure level to determine D3, got ${value}`);
      continue;
    }
    fixed[toModel[name] as string] = value;
  }
  if (opts.referenceTemperature !== null) {
    requirePositive(opts.referenceTemperature, "referenceTemperature");
    if (fixed.Tstar !== undefined && fixed.Tstar !== opts.referenceTemperature) {
      throw new RheoError("value", "referenceTemperature", `is Cross-WLF's D2, which fixed.D2 already holds at ${fixed.Tstar} K; give one of them`);
    }
    fixed.Tstar = opts.referenceTemperature;
  }
  const data = {
    shearRate: curves.flatMap((c) => [...c.shearRate]),
    viscosity: curves.flatMap((c) => [...c.viscosity]),
    temperature: curves.flatMap((c) => c.shearRate.map(() => c.temperature)),
  };
  const initial: Record<string, number> = {};
  for (const [name, value] of Object.entries(opts.initial)) {
    if (!(name in toModel)) throw new RheoError("value", `initial.${name}`, `is not a fitted Cross-WLF parameter; accepted: ${Object.keys(toModel).join(", ")}`);
    initial[toModel[name] as string] = value;
  }
  let fit: FitResult;
  try {
    fit = fitModel("cross-wlf", data, { fixed, initial, maxIterations: opts.maxIterations, confidenceLevel: opts.confidenceLevel, maxRelativeStandardError: opts.maxRelativeStandardError });
  } catch (e) {
    if (e instanceof RheoError && e.argument === "temperature") throw e.retarget({ argument: "curves" });
    throw e;
  }
  const rename = (record: Record<string, number>) => Object.fromEntries(Object.entries(toModel).filter(([, mName]) => mName in record).map(([lit, mName]) => [lit, record[mName] as number]));
  const parameters: Record<string, number> = { ...rename(fit.parameters), D3: 0 };
  const order = (r: Record<string, number>) => Object.fromEntries(known.filter((nm) => nm in r).map((nm) => [nm, r[nm] as number]));
  const standardErrors: Record<string, number> = order(rename(fit.standardErrors));
  if (standardErrors.A1 !== undefined) standardErrors.c1 = standardErrors.A1 / Math.LN10;
  const confidenceIntervals: Record<string, [number, number]> = {};
  for (const [lit, mName] of Object.entries(toModel)) if (fit.confidenceIntervals[mName]) confidenceIntervals[lit] = fit.confidenceIntervals[mName] as [number, number];
  const determined: Record<string, boolean> = {};
  const undetermined: Record<string, Undetermined> = {};
  for (const lit of known) {
    const mName = toModel[lit];
    determined[lit] = mName !== undefined && fit.determined[mName] === true;
    const u = mName !== undefined ? fit.undetermined[mName] : undefined;
    if (u) undetermined[lit] = u;
  }
  determined.c1 = determined.A1 === true;
  determined.c2 = false;
  const temperatures = [...new Set(data.temperature)].sort((a, b) => a - b);
  const D2 = parameters.D2 as number;
  const A1 = parameters.A1 as number;
  const A2 = parameters.A2tilde as number;
  const aT = (T: number) => Math.exp((-A1 * (T - D2)) / (A2 + T - D2));
  const reduced = data.shearRate.map((g, i) => g * aT(data.temperature[i] as number));
  const d2Free = !fit.fixed.includes("Tstar");
  const warnings = [
    ...fit.warnings.map((w) => {
      const message = w.message.replace(/\bTstar\b/g, "D2").replace(/\bA2\b/g, "A2tilde");
      // the usual cause: data without WLF curvature (an Arrhenius-like melt) let D2 drift off with D1 and A1
      const hint = w.code === "NOT_CONVERGED" && d2Free ? "; D2 is not pinned by these temperatures: hold it (commonly at the glass transition) or fit Cross, Carreau or Carreau–Yasuda with an Arrhenius law" : "";
      return { ...w, message: message + hint };
    }),
    warning("MASTER_PRESSURE_TERM_HELD", "Cross-WLF's pressure coefficient D3 is held at 0 (T* = D2, A2 = Ã2): the capillary points carry no separate pressure level to determine it"),
  ];
  return {
    model: "cross-wlf",
    law: "wlf",
    referenceTemperature: D2,
    parameters: order(parameters),
    standardErrors,
    confidenceIntervals,
    c1: A1 / Math.LN10,
    c2: A2,
    determined,
    undetermined,
    wellDetermined: fit.wellDetermined,
    fixed: known.filter((lit) => lit === "D3" || fit.fixed.includes(toModel[lit] as string)),
    converged: fit.converged,
    stopReason: fit.stopReason,
    iterations: fit.iterations,
    r2: fit.r2,
    rmse: fit.rmse,
    aic: fit.aic,
    ssr: fit.ssr,
    pointCount: fit.pointCount,
    parameterCount: fit.parameterCount,
    temperatures,
    factors: temperatures.map((T) => ({ temperature: T, aT: aT(T) })),
    reducedShearRateRange: [Math.min(...reduced), Math.max(...reduced)],
    warnings,
  };
}
