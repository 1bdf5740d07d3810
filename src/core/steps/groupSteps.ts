/**
 * Which die runs of a recording belong to which reduction group: a run joins the group of its
 * temperature (within temperatureTolerance, K) and bore or slit size (within diameterTolerance,
 * relative) — the same tolerances the reduction groups its points by (grouping.ts).
 */
import type { ReduceOptions, ReductionGroup } from "../reduceTypes";
import type { RunSteps } from "./runSteps";
import type { TraceSteps } from "./traceSteps";

/** The runs of each group (same order as `groups`) and the runs no group took. */
export interface RunsByGroup {
  byGroup: RunSteps[][];
  unassigned: RunSteps[];
}

function matches(run: RunSteps, g: ReductionGroup, tol: Pick<ReduceOptions, "temperatureTolerance" | "diameterTolerance">): boolean {
  const die = run.die;
  if (!die) return false;
  if ((run.temperature === null) !== (g.temperature === null)) return false;
  if (run.temperature !== null && g.temperature !== null && Math.abs(run.temperature - g.temperature) > tol.temperatureTolerance) return false;
  const close = (a: number, b: number) => Math.abs(a - b) <= tol.diameterTolerance * b;
  if (g.geometry === "slit") {
    return die.slitWidth !== undefined && die.slitHeight !== undefined && close(die.slitWidth, g.slitWidth as number) && close(die.slitHeight, g.slitHeight as number);
  }
  return die.dieDiameter !== undefined && close(die.dieDiameter, g.dieDiameter);
}

/**
 * Assigns every run to the first group it matches.
 * @example runsByGroup(result.groups, trace, DEFAULT_REDUCE_OPTIONS).byGroup[0].length
 */
export function runsByGroup(groups: readonly ReductionGroup[], trace: TraceSteps, tol: Pick<ReduceOptions, "temperatureTolerance" | "diameterTolerance">): RunsByGroup {
  const byGroup: RunSteps[][] = groups.map(() => []);
  const unassigned: RunSteps[] = [];
  for (const run of trace.runs) {
    const i = groups.findIndex((g) => matches(run, g, tol));
    if (i >= 0) (byGroup[i] as RunSteps[]).push(run);
    else unassigned.push(run);
  }
  return { byGroup, unassigned };
}
