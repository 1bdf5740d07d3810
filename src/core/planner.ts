/**
 * Test planner: before the barrel is loaded, which piston speeds on which dies cover a target
 * shear-rate range with pressures the transducers can read, how much material each step uses
 * against the barrel's capacity, and how long the test takes.
 *
 * Per die: N log-spaced rates γ̇_i = γ̇_min·(γ̇_max/γ̇_min)^(i/(N−1)) (apparent or true wall rates);
 * per rate: Q, piston speed v = 4Q/(πD_b²), predicted pressure (diePressure.ts), the transducer's
 * range flag, step time, and material V = Q·t_step, m = ρV.
 *
 * Step time: the dwell time t_d; with a melt compressibility β the steady-state criterion
 * t_step = max(t_d, ln(1/ε)·β·V_melt·ΔP/Q) is used — a lumped first-order model of the pressure
 * rise: the melt in the barrel is a compliance βV_melt charged through the die's resistance ΔP/Q
 * (exact for a Newtonian liquid, conservative for a shear-thinning one whose tangent resistance
 * n'·ΔP/Q is smaller), reaching within a fraction ε of the final pressure after ln(1/ε) time
 * constants. V_melt is the melt left in the barrel at the start of the step. A planning estimate
 * derived here, not from a standard (compressionTime.ts holds the model and its source).
 *
 * Each die is assumed to be one barrel load (single-bore instrument, rates ascending); the total
 * time adds options.timePerLoad (loading, compaction, preheating) per die.
 *
 * The prior belongs to its own temperature: with priorTemperature, testTemperature and a shift law
 * (priorShift) it is moved to the test's temperature (priorViscosity.ts, shiftPriorViscosity);
 * without a law a prior at another temperature is used as it is, with a warning. The plan's
 * caution says what the predictions leave out: the pressure dependence of viscosity (the real
 * pressure of a long die at high pressure is higher than predicted) and, unless shifted, the
 * temperature difference between prior and test.
 */
import { RheoError, requireNonNegative, requirePositive, warning, type Warning } from "./errors";
import { pistonSpeedForFlowRate } from "./flow";
import { dieFlowPoint, validatePlanDie, type DieFlowPoint, type PlanDie } from "./diePressure";
import { rangeFlag, suggestTransducer, validateTransducers, type PlanTransducer, type RangeFlag } from "./transducerChoice";
import { shiftPriorViscosity, type ViscosityFunction } from "./priorViscosity";
import type { ShiftLaw } from "./temperature/shiftFactors";
import { compressionTimeConstant, settlingTime } from "./compressionTime";

/** Rules of thumb of the planner, defined once. */
export const DEFAULT_PLANNER_OPTIONS = Object.freeze({
  /** Assumed Bagley end correction e (die radii; slit heights): a planning allowance for the
   * entrance loss, 1–10 being the usual span for polymer melts (common practice, no source).
   * Give the e of an earlier Bagley plot when there is one. */
  endCorrection: 3,
  /** Lowest trusted reading, fraction of full scale (common practice, no source). */
  lowFraction: 0.05,
  /** Highest planned reading, fraction of full scale (common practice, no source). */
  highFraction: 0.9,
  /** Steady-state criterion ε: pressure within this fraction of its final value. */
  settleTolerance: 0.01,
  /** Time per barrel load for loading, compaction and preheating, s (0: not counted). */
  timePerLoad: 0,
});

export type PlannerOptions = { -readonly [K in keyof typeof DEFAULT_PLANNER_OPTIONS]: number };

/** Everything the planner needs, in SI units. */
export interface PlanInput {
  /** Barrel bore D_b, m. */
  barrelDiameter: number;
  /** Usable barrel length (piston travel), m; give this or usableVolume. */
  usableLength?: number;
  /** Usable barrel volume, m³; give this or usableLength. */
  usableVolume?: number;
  dies: PlanDie[];
  transducers: PlanTransducer[];
  /** Target rate range, 1/s, and the number of log-spaced steps (≥ 2). */
  shearRateMin: number;
  shearRateMax: number;
  points: number;
  /** "apparent" (default): the range is in apparent rates; "wall": in true wall rates. */
  rateBasis?: "apparent" | "wall";
  /** Prior viscosity η(γ̇) (priorViscosity.ts builds it from a model, a power law or an MFR). */
  viscosity: ViscosityFunction;
  /** Melt density at test temperature, kg/m³. */
  density: number;
  /** Minimum time per step, s. */
  dwellTime: number;
  /** Melt compressibility β, 1/Pa; when given the steady-state criterion applies. */
  compressibility?: number;
  /** Temperature the prior viscosity belongs to, K (optional). */
  priorTemperature?: number;
  /** Melt temperature of the planned test, K (optional). */
  testTemperature?: number;
  /** Shift law that moves the prior from priorTemperature to testTemperature (needs both). */
  priorShift?: ShiftLaw;
}

/** The caution every plan carries: what the predicted pressures leave out. */
export const PLAN_CAUTION_PRESSURE =
  "Predicted pressures are estimates from the prior viscosity. They ignore the rise of viscosity with pressure, so a long die at high pressure can read more than predicted; the instrument's manual, the transducer's and die's ratings and local rules decide what is safe to run.";

/** One step of the speed ladder. SI units. */
export interface PlanStep extends DieFlowPoint {
  step: number;
  pistonSpeed: number;
  /** pressure / full scale of the die's transducer */
  fractionOfFullScale: number;
  flag: RangeFlag;
  /** accuracy·FS / pressure (relative uncertainty of the reading), null when accuracy unknown */
  pressureUncertainty: number | null;
  /** steady-state estimate, s (null without a compressibility) */
  settleTime: number | null;
  stepTime: number;
  volume: number;
  mass: number;
  cumulativeVolume: number;
  cumulativeMass: number;
  /** false once the die's load has run out of melt */
  withinCapacity: boolean;
}

/** The plan of one die (one barrel load). */
export interface DiePlan {
  die: PlanDie;
  transducer: PlanTransducer;
  /** true when the transducer was suggested (not named in the die) */
  suggested: boolean;
  /** true when every step is inside [low, high]·FS of the transducer */
  transducerCoversAll: boolean;
  steps: PlanStep[];
  volume: number;
  mass: number;
  /** volume / barrel capacity */
  capacityUsed: number;
  /** Σ step times + timePerLoad, s */
  duration: number;
}

export interface Plan {
  dies: DiePlan[];
  barrelVolume: number;
  barrelMass: number;
  totalVolume: number;
  totalMass: number;
  totalDuration: number;
  options: PlannerOptions;
  /** what the predictions leave out (the pressure dependence, the prior's temperature): to be shown with the plan */
  caution: string[];
  warnings: Warning[];
}

/** N log-spaced values from min to max inclusive. */
export function logSpaced(min: number, max: number, count: number): number[] {
  return Array.from({ length: count }, (_, i) => (count === 1 ? min : min * Math.pow(max / min, i / (count - 1))));
}

/** Usable barrel volume: given, or πD_b²/4 × usable length (m³). */
export function barrelCapacity(barrelDiameter: number, usableLength?: number, usableVolume?: number): number {
  requirePositive(barrelDiameter, "barrelDiameter");
  if ((usableLength === undefined) === (usableVolume === undefined)) {
    throw new RheoError("missing", "usableLength", "give the usable barrel length or the usable volume (one of them)");
  }
  if (usableVolume !== undefined) return requirePositive(usableVolume, "usableVolume");
  return ((Math.PI * barrelDiameter ** 2) / 4) * requirePositive(usableLength as number, "usableLength");
}

function resolveOptions(options: Partial<PlannerOptions>): PlannerOptions {
  const o: PlannerOptions = { ...DEFAULT_PLANNER_OPTIONS };
  for (const [key, value] of Object.entries(options)) {
    if (!(key in DEFAULT_PLANNER_OPTIONS)) {
      throw new RheoError("value", "options", `unknown option "${key}"; accepted: ${Object.keys(DEFAULT_PLANNER_OPTIONS).join(", ")}`);
    }
    if (value !== undefined) o[key as keyof PlannerOptions] = requireNonNegative(value, key);
  }
  if (!(o.lowFraction < o.highFraction && o.highFraction <= 1)) {
    throw new RheoError("domain", "lowFraction", `must be below highFraction, and highFraction at most 1; got ${o.lowFraction} and ${o.highFraction}`);
  }
  if (!(o.settleTolerance > 0 && o.settleTolerance < 1)) {
    throw new RheoError("domain", "settleTolerance", `must be between 0 and 1 (e.g. 0.01), got ${o.settleTolerance}`);
  }
  return o;
}

function validateInput(input: PlanInput): void {
  requirePositive(input.shearRateMin, "shearRateMin");
  requirePositive(input.shearRateMax, "shearRateMax");
  if (!(input.shearRateMax > input.shearRateMin)) {
    throw new RheoError("domain", "shearRateMax", `must be greater than shearRateMin (${input.shearRateMin}), got ${input.shearRateMax}`);
  }
  if (!Number.isInteger(input.points) || input.points < 2 || input.points > 200) {
    throw new RheoError("value", "points", `must be a whole number from 2 to 200, got ${input.points}`);
  }
  if (input.rateBasis !== undefined && input.rateBasis !== "apparent" && input.rateBasis !== "wall") {
    throw new RheoError("value", "rateBasis", `must be "apparent" or "wall", got "${String(input.rateBasis)}"`);
  }
  if (typeof input.viscosity !== "function") throw new RheoError("missing", "viscosity", "give a prior viscosity (model, power law or MFR)");
  requirePositive(input.density, "density");
  requirePositive(input.dwellTime, "dwellTime");
  if (input.compressibility !== undefined) requirePositive(input.compressibility, "compressibility");
  if (input.priorTemperature !== undefined) requirePositive(input.priorTemperature, "priorTemperature");
  if (input.testTemperature !== undefined) requirePositive(input.testTemperature, "testTemperature");
  if (input.priorShift !== undefined && (input.priorTemperature === undefined || input.testTemperature === undefined)) {
    throw new RheoError("missing", input.priorTemperature === undefined ? "priorTemperature" : "testTemperature", "shifting the prior needs the temperature it belongs to (priorTemperature) and the test's (testTemperature)");
  }
  if (input.dies.length === 0) throw new RheoError("missing", "dies", "give at least one die");
  const names = new Set<string>();
  for (const die of input.dies) {
    if (names.has(die.name)) throw new RheoError("value", "dies", `the name "${die.name}" is used twice`);
    names.add(die.name);
    validatePlanDie(die);
  }
  validateTransducers(input.transducers);
}

/**
 * Plans a capillary test (see the module comment for the model).
 * @throws RheoError naming the input at fault; "convergence" when the prior cannot be inverted.
 * @example planTest({ barrelDiameter: 0.015, usableLength: 0.2, dies: [...], transducers: [...],
 *   shearRateMin: 10, shearRateMax: 1000, points: 5, viscosity: (g) => 1000, density: 1000, dwellTime: 30 })
 */
export function planTest(input: PlanInput, options: Partial<PlannerOptions> = {}): Plan {
  const o = resolveOptions(options);
  validateInput(input);
  const capacity = barrelCapacity(input.barrelDiameter, input.usableLength, input.usableVolume);
  const rates = logSpaced(input.shearRateMin, input.shearRateMax, input.points);
  const basis = input.rateBasis ?? "apparent";
  const warnings: Warning[] = [];
  const prior = priorAtTestTemperature(input, warnings);
  const dies = input.dies.map((die) => {
    const flows = rates.map((r) => dieFlowPoint(prior.viscosity, die, r, basis, o.endCorrection));
    const pressures = flows.map((f) => f.pressure);
    let transducer: PlanTransducer;
    let suggested = true;
    if (die.transducer !== undefined) {
      const named = input.transducers.find((t) => t.name === die.transducer);
      if (!named) throw new RheoError("value", `dies "${die.name}" transducer`, `unknown transducer "${die.transducer}"; accepted: ${input.transducers.map((t) => t.name).join(", ")}`);
      transducer = named;
      suggested = false;
    } else transducer = suggestTransducer(pressures, input.transducers, o.lowFraction, o.highFraction).transducer;
    const plan = dieSteps(die, flows, transducer, capacity, input, o);
    plan.suggested = suggested;
    warnings.push(...dieWarnings(plan, o));
    return plan;
  });
  const totalVolume = dies.reduce((s, d) => s + d.volume, 0);
  return {
    dies,
    barrelVolume: capacity,
    barrelMass: capacity * input.density,
    totalVolume,
    totalMass: totalVolume * input.density,
    totalDuration: dies.reduce((s, d) => s + d.duration, 0),
    options: o,
    caution: [PLAN_CAUTION_PRESSURE, prior.caution],
    warnings,
  };
}

const celsius = (t: number) => `${Number((t - 273.15).toFixed(1))} °C`;

/**
 * The prior at the test's temperature (module comment) and the caution sentence about it.
 * Warning code: PLAN_PRIOR_NOT_SHIFTED (prior and test temperatures differ and no law shifts it).
 */
function priorAtTestTemperature(input: PlanInput, warnings: Warning[]): { viscosity: ViscosityFunction; caution: string } {
  const { priorTemperature: tp, testTemperature: tt, priorShift } = input;
  if (priorShift && tp !== undefined && tt !== undefined) {
    const law = priorShift.law === "arrhenius" ? `Arrhenius, Ea = ${Number((priorShift.activationEnergy / 1e3).toPrecision(4))} kJ/mol` : `WLF, C1 = ${Number(priorShift.C1.toPrecision(4))}, C2 = ${Number(priorShift.C2.toPrecision(4))} K`;
    return { viscosity: shiftPriorViscosity(input.viscosity, priorShift, tp, tt), caution: `The prior viscosity was shifted from ${celsius(tp)} to the test's ${celsius(tt)} (${law}).` };
  }
  if (tp !== undefined && tt !== undefined && Math.abs(tp - tt) > 0.05) {
    warnings.push(warning("PLAN_PRIOR_NOT_SHIFTED", `the prior viscosity belongs to ${celsius(tp)} but the test runs at ${celsius(tt)} and no shift law was given: it is used unshifted, so the predicted pressures are off by the viscosity's change over ${Math.abs(tt - tp).toFixed(1)} K`));
    return { viscosity: input.viscosity, caution: `The prior viscosity belongs to ${celsius(tp)} and is used unshifted at the test's ${celsius(tt)}: give a shift law to move it.` };
  }
  return {
    viscosity: input.viscosity,
    caution: "The prior viscosity is used as given: if it was measured at another temperature than the test's, give both temperatures and a shift law so it is moved to the test's temperature.",
  };
}

function dieSteps(die: PlanDie, flows: DieFlowPoint[], transducer: PlanTransducer, capacity: number, input: PlanInput, o: PlannerOptions): DiePlan {
  let cumulative = 0;
  let time = 0;
  const steps = flows.map((f, i): PlanStep => {
    let settleTime: number | null = null;
    if (input.compressibility !== undefined) {
      const melt = Math.max(0, capacity - cumulative);
      settleTime = melt > 0 ? settlingTime(compressionTimeConstant(input.compressibility, melt, f.pressure, f.flowRate), o.settleTolerance) : 0;
    }
    const stepTime = Math.max(input.dwellTime, settleTime ?? 0);
    const volume = f.flowRate * stepTime;
    cumulative += volume;
    time += stepTime;
    return {
      ...f,
      step: i + 1,
      pistonSpeed: pistonSpeedForFlowRate(f.flowRate, input.barrelDiameter),
      fractionOfFullScale: f.pressure / transducer.fullScale,
      flag: rangeFlag(f.pressure, transducer.fullScale, o.lowFraction, o.highFraction),
      pressureUncertainty: transducer.accuracy === undefined ? null : (transducer.accuracy * transducer.fullScale) / f.pressure,
      settleTime,
      stepTime,
      volume,
      mass: volume * input.density,
      cumulativeVolume: cumulative,
      cumulativeMass: cumulative * input.density,
      withinCapacity: cumulative <= capacity,
    };
  });
  const coversAll = steps.every((s) => s.flag === "ok");
  return { die, transducer, suggested: true, transducerCoversAll: coversAll, steps, volume: cumulative, mass: cumulative * input.density, capacityUsed: cumulative / capacity, duration: time + o.timePerLoad };
}

function dieWarnings(plan: DiePlan, o: PlannerOptions): Warning[] {
  const out: Warning[] = [];
  const name = plan.die.name;
  const fs = plan.transducer.fullScale;
  const list = (flag: RangeFlag) => plan.steps.filter((s) => s.flag === flag).map((s) => s.step);
  const over = list("over");
  if (over.length > 0) {
    out.push(warning("PLAN_PRESSURE_OVER_FULL_SCALE", `die "${name}": steps ${over.join(", ")} are predicted above the full scale of transducer "${plan.transducer.name}" (${fs / 1e5} bar); drop those speeds or use a larger transducer`));
  }
  const high = list("high");
  if (high.length > 0) {
    out.push(warning("PLAN_PRESSURE_NEAR_FULL_SCALE", `die "${name}": steps ${high.join(", ")} are predicted above ${o.highFraction * 100} % of the full scale of transducer "${plan.transducer.name}"`));
  }
  const low = list("low");
  if (low.length > 0) {
    out.push(warning("PLAN_PRESSURE_LOW", `die "${name}": steps ${low.join(", ")} are predicted below ${o.lowFraction * 100} % of the full scale of transducer "${plan.transducer.name}", where readings are unreliable`));
  }
  if (plan.suggested && !plan.transducerCoversAll) {
    out.push(warning("PLAN_NO_TRANSDUCER_COVERS", `die "${name}": no transducer keeps every step between ${o.lowFraction * 100} % and ${o.highFraction * 100} % of full scale; "${plan.transducer.name}" covers most steps`));
  }
  const firstOut = plan.steps.find((s) => !s.withinCapacity);
  if (firstOut) {
    out.push(warning("PLAN_BARREL_CAPACITY_EXCEEDED", `die "${name}": the barrel runs out of melt during step ${firstOut.step} (${(plan.capacityUsed * 100).toFixed(0)} % of the usable volume needed); shorten the dwell, use fewer steps or plan a second load`));
  }
  return out;
}
