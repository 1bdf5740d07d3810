/**
 * Plans and lot comparisons as sheet-ready tables: a header row of `quantity [unit]` cells and rows
 * of numbers and words in display units, plus the pass/fail flags and chart series a results sheet
 * needs. Shared by RHEO.PLAN / RHEO.LOTCHECK, the CLI's text output and the task pane, so that every
 * surface shows the same columns in the same units.
 */
import { fromSI } from "../core/units";
import type { Plan } from "../core/planner";
import type { FlowCurveTable, LotComparison, LotPointStatus } from "../core/lotComparison";
import type { RangeFlag } from "../core/transducerChoice";

/** Display units of the plan tables, defined once. */
export const PLAN_TABLE_UNITS = Object.freeze({
  viscosity: "Pa.s",
  volumetricFlow: "mm3/s",
  speed: "mm/min",
  stress: "kPa",
  pressure: "bar",
  time: "s",
  duration: "min",
  volume: "cm3",
  mass: "g",
});

export type PlanTableUnits = { -readonly [K in keyof typeof PLAN_TABLE_UNITS]: string };

/** A table for a sheet: header cells and rows. */
export interface SheetTable {
  header: string[];
  rows: (string | number)[][];
}

/** Words shown for a range flag (upper case where the engineer must act). */
export const RANGE_FLAG_TEXT: Record<RangeFlag, string> = { ok: "ok", low: "LOW", high: "HIGH", over: "OVER FULL SCALE" };

/** Words shown for a lot point's status. */
export const LOT_STATUS_TEXT: Record<LotPointStatus, string> = { pass: "PASS", fail: "FAIL", "not-compared": "NOT COMPARED" };

/** One row per step of every die: the speed ladder with predicted pressures and material. */
export function planStepTable(plan: Plan, units: Partial<PlanTableUnits> = {}): SheetTable {
  const u: PlanTableUnits = { ...PLAN_TABLE_UNITS, ...units };
  const header = [
    "die",
    "step",
    "shear_rate_apparent [1/s]",
    "shear_rate_wall [1/s]",
    `viscosity [${u.viscosity}]`,
    `flow_rate [${u.volumetricFlow}]`,
    `piston_speed [${u.speed}]`,
    `wall_shear_stress [${u.stress}]`,
    `pressure [${u.pressure}]`,
    "transducer",
    "full_scale_used [%]",
    "range",
    `step_time [${u.time}]`,
    `volume [${u.volume}]`,
    `mass [${u.mass}]`,
    `cumulative_mass [${u.mass}]`,
    "in_barrel",
  ];
  const rows = plan.dies.flatMap((d) =>
    d.steps.map((s) => [
      d.die.name,
      s.step,
      s.shearRateApparent,
      s.shearRateWall,
      fromSI(s.viscosity, u.viscosity, "viscosity"),
      fromSI(s.flowRate, u.volumetricFlow, "volumetricFlow"),
      fromSI(s.pistonSpeed, u.speed, "speed"),
      fromSI(s.wallShearStress, u.stress, "pressure"),
      fromSI(s.pressure, u.pressure, "pressure"),
      d.transducer.name,
      s.fractionOfFullScale * 100,
      RANGE_FLAG_TEXT[s.flag],
      fromSI(s.stepTime, u.time, "time"),
      fromSI(s.volume, u.volume, "volume"),
      fromSI(s.mass, u.mass, "mass"),
      fromSI(s.cumulativeMass, u.mass, "mass"),
      s.withinCapacity ? "yes" : "NO: barrel empty",
    ]),
  );
  return { header, rows };
}

/** One row per die (one barrel load each) and a total row: transducer, material, time. */
export function planSummaryTable(plan: Plan, units: Partial<PlanTableUnits> = {}): SheetTable {
  const u: PlanTableUnits = { ...PLAN_TABLE_UNITS, ...units };
  const header = [
    "die",
    "transducer",
    `full_scale [${u.pressure}]`,
    "transducer_choice",
    `pressure_min [${u.pressure}]`,
    `pressure_max [${u.pressure}]`,
    `volume [${u.volume}]`,
    `mass [${u.mass}]`,
    "barrel_used [%]",
    `duration [${u.duration}]`,
  ];
  const p = (v: number) => fromSI(v, u.pressure, "pressure");
  const rows: (string | number)[][] = plan.dies.map((d) => [
    d.die.name,
    d.transducer.name,
    p(d.transducer.fullScale),
    d.suggested ? (d.transducerCoversAll ? "suggested" : "suggested, covers not all steps") : "given",
    p(Math.min(...d.steps.map((s) => s.pressure))),
    p(Math.max(...d.steps.map((s) => s.pressure))),
    fromSI(d.volume, u.volume, "volume"),
    fromSI(d.mass, u.mass, "mass"),
    d.capacityUsed * 100,
    fromSI(d.duration, u.duration, "time"),
  ]);
  rows.push([
    "total",
    "",
    "",
    `barrel holds ${round(fromSI(plan.barrelVolume, u.volume, "volume"))} ${u.volume} = ${round(fromSI(plan.barrelMass, u.mass, "mass"))} ${u.mass}`,
    "",
    "",
    fromSI(plan.totalVolume, u.volume, "volume"),
    fromSI(plan.totalMass, u.mass, "mass"),
    "",
    fromSI(plan.totalDuration, u.duration, "time"),
  ]);
  return { header, rows };
}

function round(v: number): number {
  return Number(v.toPrecision(4));
}

/** The per-rate comparison rows, with the status column and a pass flag per row for formatting. */
export interface LotSheetTable extends SheetTable {
  /** 0-based index of the status column (for conditional formatting) */
  statusColumn: number;
  /** per row: true pass, false fail, null not compared */
  passFlags: (boolean | null)[];
}

/** Per-rate table: rate, reference, band, lot, deviation %, status. */
export function lotComparisonTable(result: LotComparison, viscosityUnit: string = PLAN_TABLE_UNITS.viscosity): LotSheetTable {
  const v = (x: number) => fromSI(x, viscosityUnit, "viscosity");
  const header = [
    "shear_rate [1/s]",
    `reference_viscosity [${viscosityUnit}]`,
    `band_lower [${viscosityUnit}]`,
    `band_upper [${viscosityUnit}]`,
    `lot_viscosity [${viscosityUnit}]`,
    "deviation [%]",
    "status",
  ];
  const rows = result.points.map((pt) => [
    pt.shearRate,
    v(pt.referenceViscosity),
    v(pt.lower),
    v(pt.upper),
    pt.lotViscosity === null ? "" : v(pt.lotViscosity),
    pt.deviation === null ? "" : pt.deviation * 100,
    LOT_STATUS_TEXT[pt.status],
  ]);
  const passFlags = result.points.map((pt) => (pt.status === "not-compared" ? null : pt.status === "pass"));
  return { header, rows, statusColumn: header.length - 1, passFlags };
}

/** The verdict lines: verdict, tolerance, worst point, counts. */
export function lotVerdictTable(result: LotComparison): SheetTable {
  const worst = result.worst;
  return {
    header: ["verdict", LOT_STATUS_TEXT[result.verdict]],
    rows: [
      ["tolerance [%]", result.tolerance * 100],
      ["worst_shear_rate [1/s]", worst ? worst.shearRate : ""],
      ["worst_deviation [%]", worst && worst.deviation !== null ? worst.deviation * 100 : ""],
      ["points_compared", result.compared],
      ["points_failed", result.failed],
      ["points_not_compared", result.notCompared],
    ],
  };
}

/** One series of the overlay chart (x: shear rate 1/s; y in the viscosity unit; log–log axes). */
export interface ChartSeries {
  name: string;
  role: "reference" | "band-lower" | "band-upper" | "lot";
  /** suggested drawing: the reference solid, the band dashed, the lot as markers */
  style: "line" | "dashed" | "markers";
  x: number[];
  y: number[];
}

/** Chart specification: the lot's measured points over the reference and its band. */
export function lotChartSeries(result: LotComparison, lot: FlowCurveTable, viscosityUnit: string = PLAN_TABLE_UNITS.viscosity): ChartSeries[] {
  const v = (x: number) => fromSI(x, viscosityUnit, "viscosity");
  const x = result.points.map((p) => p.shearRate);
  const pct = result.tolerance * 100;
  return [
    { name: "reference", role: "reference", style: "line", x, y: result.points.map((p) => v(p.referenceViscosity)) },
    { name: `reference −${pct} %`, role: "band-lower", style: "dashed", x, y: result.points.map((p) => v(p.lower)) },
    { name: `reference +${pct} %`, role: "band-upper", style: "dashed", x, y: result.points.map((p) => v(p.upper)) },
    { name: "lot", role: "lot", style: "markers", x: [...lot.shearRate], y: lot.viscosity.map(v) },
  ];
}
