/**
 * Data types of the reduction pipeline (reduce.ts): its input measurement, options and result
 * tables, all in SI units.
 */
import { Warning } from "./errors";
import { BagleyOptions, BagleyRow } from "./bagley";
import { RabinowitschOptions, SmootherRecord } from "./rabinowitsch";
import { RepeatComparison, RepeatOptions } from "./speedSteps";
import { InstabilityOptions } from "./flowInstability";
import { RowAccount } from "./rowAccount";
import { OrificeOptions } from "./orifice";
import { MeltFlowResult } from "./meltFlowRate";
import { DEFAULT_METHOD_OPTIONS, GroupMethodResults, MethodOptions, SlipResultRow } from "./reduceMethods";

/** One raw measurement, SI. */
export interface Measurement {
  /** die bore D, m (round dies; omitted for a slit) */
  dieDiameter?: number;
  /** slit width W, m (slit dies, with slitHeight; then no dieDiameter) */
  slitWidth?: number;
  /** slit height (gap) H, m */
  slitHeight?: number;
  /** die land length L, m */
  dieLength: number;
  /** volumetric flow rate Q, m³/s */
  flowRate: number;
  /** measured pressure drop ΔP (includes entrance and exit losses), Pa */
  pressure: number;
  /**
   * standard deviation of the plateau pressure, Pa (a step read off a pressure–time trace;
   * optional, ≥ 0): the reading's own scatter, propagated by the uncertainty budget (uncertaintyBudget.ts)
   */
  pressureStd?: number;
  /** melt temperature, K (optional; points without one form their own group) */
  temperature?: number;
  /** the source row (1-based), carried into error messages */
  row?: number;
}

/** Options of {@link reduce}. */
export interface ReduceOptions extends MethodOptions {
  /**
   * "bagley": end correction across die lengths (needs ≥ 2 lengths); "none": apparent stress of the
   * longest die; "orifice": the longest die minus an orifice die's pressure at the same rate
   */
  endCorrection: "bagley" | "none" | "orifice";
  /** which dies count as orifice dies, and when the two entrance pressures disagree */
  orifice: Partial<OrificeOptions>;
  /** a melt-flow-rate result to place as an apparent point: MVR (m³/s) or MFR (kg/s) with density, load (kg) */
  meltFlowRate: { volumeRate?: number; massRate?: number; density?: number; load: number } | null;
  bagley: Partial<BagleyOptions>;
  rabinowitsch: Partial<RabinowitschOptions>;
  /** which readings of a die share a speed, and the stability threshold of repeats (speedSteps.ts) */
  repeats: Partial<RepeatOptions>;
  /** the flow-instability test (flowInstability.ts) */
  instability: Partial<InstabilityOptions>;
  /**
   * K: neighbouring temperature readings closer than this belong to one set-point (one group,
   * reported at the mean of its readings with their spread; see grouping.ts)
   */
  temperatureTolerance: number;
  /** diameters closer than this relative difference count as one diameter */
  diameterTolerance: number;
}

/** Defaults of {@link ReduceOptions}. */
export const DEFAULT_REDUCE_OPTIONS: Readonly<ReduceOptions> = Object.freeze({
  endCorrection: "bagley",
  bagley: {},
  rabinowitsch: {},
  repeats: {},
  instability: {},
  temperatureTolerance: 1,
  diameterTolerance: 0.005,
  orifice: {},
  meltFlowRate: null,
  ...DEFAULT_METHOD_OPTIONS,
});

/** A raw point with its apparent quantities. */
export interface PointRow {
  row: number;
  /** D, m (NaN for a slit) */
  dieDiameter: number;
  /** slit W and H, m (slits only) */
  slitWidth?: number;
  slitHeight?: number;
  dieLength: number;
  flowRate: number;
  pressure: number;
  /** plateau standard deviation of the pressure, Pa (when given) */
  pressureStd?: number;
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** τ_w,app = ΔP·D/(4L) (ΔP·H/(2L) for a slit), Pa */
  wallShearStressApparent: number;
}

/** One point of the corrected flow curve. */
export interface FlowCurveRow {
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** end-corrected τ_w, Pa */
  wallShearStress: number;
  /** d ln τ_w / d ln γ̇_a */
  nPrime: number;
  /** true wall shear rate γ̇_w, 1/s (null where n' ≤ 0) */
  shearRateWall: number | null;
  /** η = τ_w/γ̇_w, Pa·s (null where γ̇_w is) */
  viscosity: number | null;
  /** η_a = τ_w/γ̇_a, Pa·s */
  viscosityApparent: number;
}

/** The reduction of one temperature and die diameter. */
export interface ReductionGroup extends GroupMethodResults {
  /** K (the mean of the group's readings), or null when the data carry no temperature */
  temperature: number | null;
  /** K: highest minus lowest temperature reading of the group (absent when the data carry no temperature) */
  temperatureSpread?: number;
  /** the group's temperature readings: how many, lowest and highest (K) */
  temperatureReadings?: { count: number; min: number; max: number };
  /** m (NaN for a slit group: see slitWidth and slitHeight) */
  dieDiameter: number;
  /** "round" or "slit" */
  geometry: "round" | "slit";
  /** slit W and H, m (slit groups only) */
  slitWidth?: number;
  slitHeight?: number;
  /**
   * lengthOverRadius is L/R for round dies and L/H for slits; points counts the die's readings,
   * steps its distinct speeds (repeats merged); orifice marks an orifice die
   */
  dies: { dieLength: number; lengthOverRadius: number; label: string; points: number; steps: number; orifice?: boolean }[];
  /** both entrance-pressure estimates side by side, when the group has an orifice die */
  entrancePressures?: EntrancePressureRow[];
  points: PointRow[];
  bagley: BagleyRow[];
  flowCurve: FlowCurveRow[];
  /** every repeated reading compared with the first at its speed (empty without repeats) */
  stability: StabilityRow[];
  /** readings and corrected points set aside above a flow instability */
  flagged: FlaggedPoint[];
  /** the curve that gave n' (Rabinowitsch) */
  smoother: SmootherRecord;
  /** what became of every row of the group */
  rows: RowAccount;
  warnings: Warning[];
}

/** A repeated reading compared with the first reading at its speed (one die). */
export interface StabilityRow extends Pick<RepeatComparison, "firstRow" | "firstPressure" | "repeatRow" | "repeatPressure" | "change" | "used"> {
  /** the die's label, "L=20 mm" */
  die: string;
  dieLength: number;
  /** γ̇_a of the first reading, 1/s */
  shearRateApparent: number;
  /** Q of the first reading, m³/s */
  flowRate: number;
}

/** A reading or corrected point set aside above a flow instability. */
export interface FlaggedPoint {
  /** the die ("L=20 mm"), or "flow curve" for an end-corrected point */
  source: string;
  /** γ̇_a, 1/s */
  shearRateApparent: number;
  /** the die's pressure, Pa (null for a flow-curve point) */
  pressure: number | null;
  /** Pa: apparent for a die reading, end-corrected for a flow-curve point */
  wallShearStress: number;
  /** the warning code that explains it */
  reason: "FLOW_INSTABILITY";
}

/** The Bagley and orifice estimates of the entrance pressure at one apparent rate, Pa. */
export interface EntrancePressureRow {
  shearRateApparent: number;
  /** Bagley intercept, or null where no Bagley line exists at this rate */
  entrancePressure: number | null;
  /**
   * entrance pressure from the orifice die: its reading at this rate (interpolated log–log) minus
   * the pressure of its own land, 2τ_w·L_o/R (orifice.ts); null outside its range
   */
  entrancePressureOrifice: number | null;
  /** the orifice die's reading at this rate (entrance plus its land), Pa, or null outside its range */
  orificePressure: number | null;
  /** (Bagley − orifice)/orifice, or null */
  difference: number | null;
}

/** Result of {@link reduce}. */
export interface ReductionResult {
  groups: ReductionGroup[];
  /** Mooney slip rows (option `slip`), one set per temperature with two or more diameters */
  slip?: SlipResultRow[];
  /** the melt-flow-rate point (option `meltFlowRate`) */
  meltFlowRate?: MeltFlowResult;
  /** what became of every row, over all groups */
  rows: RowAccount;
  /** every group's warnings, each prefixed with its group */
  warnings: Warning[];
}
