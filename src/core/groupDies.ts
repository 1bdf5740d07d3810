/**
 * The dies of one reduction group, each as a ladder of speed steps (speedSteps.ts: repeats
 * compared and merged, exact duplicates counted once), and the flow-instability test across the
 * long dies (flowInstability.ts): the steps from a break on are set aside before any end
 * correction, so nothing is smoothed across the break.
 */
import { Warning, warning } from "./errors";
import { FlowBreak, InstabilityOptions, findFlowBreak } from "./flowInstability";
import { RepeatOptions, SpeedLadder, speedSteps } from "./speedSteps";
import type { RowFate } from "./rowAccount";
import type { PointRow } from "./reduceTypes";
import { cluster, millimetres } from "./grouping";

/** A point of a group; grouped points also carry their temperature (K or null). */
export type GroupPoint = PointRow & { temperature?: number | null };

/** One die of a group with its speed steps. */
export interface GroupDie {
  dieLength: number;
  /** "L=20 mm" */
  label: string;
  /** L/R (round) or L/H (slit): the x of the Bagley plot */
  lengthOverRadius: number;
  orifice: boolean;
  /** indices of the die's readings among the group's points */
  indices: number[];
  /** the die's steps; its indices refer to `indices` */
  ladder: SpeedLadder;
  /** one point per step, ascending rate: the first reading with the step's rate and pressure */
  steps: PointRow[];
  /** steps.slice(0, stable) lie below a flow instability (all of them when there is none) */
  stable: number;
}

/** How a group measures its dies (from reduceGroup). */
export interface DieGeometry {
  /** x of the Bagley plot for a die length */
  xOf: (length: number) => number;
  /** τ = ΔP·g for a die length */
  stressFactor: (length: number) => number;
  isOrifice: (length: number) => boolean;
}

/**
 * The group's dies (ascending length), each reduced to speed steps.
 * @param points the group's points (any order)
 */
export function groupDies(points: readonly GroupPoint[], geometry: DieGeometry, repeats: RepeatOptions): GroupDie[] {
  const indices = points.map((_, i) => i);
  const byLength = cluster(indices, (i) => (points[i] as GroupPoint).dieLength, (a, b) => Math.abs(a - b) <= 1e-6 * a);
  return byLength.map((members) => {
    const first = points[members[0] as number] as GroupPoint;
    const dieLength = first.dieLength;
    const readings = members.map((i) => {
      const p = points[i] as GroupPoint;
      return { rate: p.shearRateApparent, pressure: p.pressure, row: p.row, key: [p.dieDiameter, p.slitWidth, p.slitHeight, p.flowRate, p.pressure, p.temperature].join("|") };
    });
    const ladder = speedSteps(readings, repeats);
    const g = geometry.stressFactor(dieLength);
    const steps = ladder.steps.map((s): PointRow => {
      const p = points[members[s.used[0] as number] as number] as GroupPoint;
      return { ...p, flowRate: (p.flowRate * s.rate) / p.shearRateApparent, shearRateApparent: s.rate, pressure: s.pressure, wallShearStressApparent: s.pressure * g };
    });
    return {
      dieLength,
      label: `L=${millimetres(dieLength)}`,
      lengthOverRadius: geometry.xOf(dieLength),
      orifice: geometry.isOrifice(dieLength),
      indices: members,
      ladder,
      steps,
      stable: steps.length,
    };
  });
}

/**
 * Tests the long dies for a shared flow instability (flowInstability.ts) and sets each die's
 * `stable` count. Returns the break (null when none) and the isolated falls per long die.
 */
export function markInstability(dies: GroupDie[], options: Partial<InstabilityOptions>): { flowBreak: FlowBreak | null; falls: { die: GroupDie; rates: number[] }[] } {
  const long = dies.filter((d) => !d.orifice && d.steps.length >= 3);
  if (long.length === 0) return { flowBreak: null, falls: [] };
  const result = findFlowBreak(
    long.map((d) => ({ x: d.steps.map((p) => Math.log(p.shearRateApparent)), y: d.steps.map((p) => Math.log(p.pressure)) })),
    options,
  );
  if (result.break) long.forEach((d, k) => (d.stable = result.break?.firstFlagged[k] ?? d.steps.length));
  const falls = long.map((die, k) => ({ die, rates: (result.falls[k] ?? []).map((i) => (die.steps[i] as PointRow).shearRateApparent) })).filter((f) => f.rates.length > 0);
  return { flowBreak: result.break, falls };
}

/**
 * The FLOW_INSTABILITY warning of a break: which dies or which curve, the rate range, the step
 * against the continuation and the wall stress where it sets in.
 * @param where "die L=20 mm, L=30 mm" or "the corrected flow curve"
 * @param lastStable the highest rate below the break, 1/s (null when none), and its wall stress, Pa
 */
export function instabilityWarning(where: string, flowBreak: FlowBreak, fromRate: number, toRate: number, lastStable: { rate: number; stress: number } | null): Warning {
  const what = flowBreak.falls ? "falls" : "stalls";
  const onset = lastStable ? ` The last stable point is ${fmt(lastStable.rate)} 1/s at a wall stress of ${fmt(lastStable.stress / 1e6)} MPa.` : "";
  return warning(
    "FLOW_INSTABILITY",
    `Flow instability in ${where}: from ${fmt(fromRate)} 1/s${toRate > fromRate ? ` to ${fmt(toRate)} 1/s` : ""} the pressure ${what}, ${Math.abs(flowBreak.jump * 100).toFixed(0)} % below the continuation of the readings below (spurt, stick–slip or melt fracture).${onset} Those readings were left out of the reduction and are listed as flagged; nothing was smoothed across the break.`,
  );
}

/** The FLOW_INSTABILITY warning of isolated falls (kept in the reduction). */
export function fallsWarning(falls: { die: GroupDie; rates: number[] }[]): Warning {
  return warning(
    "FLOW_INSTABILITY",
    `The pressure falls as the speed rises, beyond the scatter of the readings, at ${falls.map((f) => `${f.die.label}: ${f.rates.map(fmt).join(", ")} 1/s`).join("; ")}, and recovers above: an isolated low reading or an oscillating flow (stick–slip). The readings were kept; check them.`,
  );
}

function fmt(x: number): string {
  return Number(x.toPrecision(3)).toString();
}

/**
 * Every reading's fate from its step's fate: the first reading of a step takes the step's fate;
 * further readings averaged into a used step are skipped as "repeat" (merged; else they share its
 * reason); exact duplicates are "duplicate", drifted repeats "drifted".
 * @param stepFate the fate of step `s` of die `d` (indices into `dies` and its steps)
 * @returns one fate per group point, aligned with the points
 */
export function readingFates(pointCount: number, dies: readonly GroupDie[], stepFate: (d: number, s: number) => RowFate): RowFate[] {
  const fates: RowFate[] = new Array<RowFate>(pointCount).fill({ skipped: "notNeeded" });
  dies.forEach((die, d) => {
    die.ladder.steps.forEach((step, s) => {
      const fate = stepFate(d, s);
      step.used.forEach((r, k) => (fates[die.indices[r] as number] = k === 0 || fate !== "used" ? fate : { skipped: "repeat" }));
      for (const r of step.duplicates) fates[die.indices[r] as number] = { skipped: "duplicate" };
      for (const r of step.drifted) fates[die.indices[r] as number] = { skipped: "drifted" };
    });
  });
  return fates;
}

/** The READINGS_NOT_USED warning for the rows skipped as "notNeeded" (null when none). */
export function unusedWarning(points: readonly PointRow[], fates: readonly RowFate[]): Warning | null {
  const rows = points.filter((_, i) => {
    const f = fates[i];
    return typeof f === "object" && f.skipped === "notNeeded";
  });
  if (rows.length === 0) return null;
  const shown = rows.slice(0, 8).map((p) => `row ${p.row} (L=${millimetres(p.dieLength)}, ${fmt(p.shearRateApparent)} 1/s)`);
  return warning(
    "READINGS_NOT_USED",
    `${rows.length} reading(s) lie between or beyond the rates the result was drawn at and were not needed by any Bagley line or flow-curve point: ${shown.join(", ")}${rows.length > 8 ? ` and ${rows.length - 8} more` : ""}.`,
  );
}
