/**
 * Which settings can apply to the data read: a check or choice the data cannot support (wall
 * slip with one die bore, a Bagley correction with one die length, a temperature shift at one
 * temperature, ...) is switched off in the form with the reason beside it, instead of stopping
 * the run with an error. Uses the core's own grouping (temperature, bore) and orifice test, so the
 * pane and the reduction agree. Pure.
 */
import { apparentPoint, groupPoints } from "../../../core/grouping";
import { isOrificeDie } from "../../../core/orifice";
import { DEFAULT_REDUCE_OPTIONS, type Measurement } from "../../../core/reduce";

/** A setting the data decide about. */
export type DataDependentSetting = "bagley" | "orifice" | "slip" | "pressureDependence" | "extensional" | "temperatureShift" | "master" | "crossWlf" | "slitEdgeCorrection";

/** Whether a setting applies, and if not, why (in words for the field). */
export type Applicability = Readonly<Record<DataDependentSetting, { ok: boolean; reason: string }>>;

const ok = { ok: true, reason: "" } as const;

/** What the data allow (see the module comment). Measurements that fail the core's checks are left out here; the run reports them. */
export function applicability(measurements: readonly Measurement[]): Applicability {
  const points = measurements.flatMap((m, i) => {
    try {
      return [apparentPoint(m, i)];
    } catch {
      return [];
    }
  });
  const groups = groupPoints(points, DEFAULT_REDUCE_OPTIONS);
  const lengthsOf = (g: (typeof groups)[number], long: boolean) => {
    const lengths = new Set<number>();
    for (const p of g.points) {
      const orifice = g.slit === undefined && isOrificeDie(p.dieLength, p.dieDiameter);
      if (orifice !== long) lengths.add(Number(p.dieLength.toPrecision(6)));
    }
    return lengths.size;
  };
  const maxLong = Math.max(0, ...groups.map((g) => lengthsOf(g, true)));
  const anyOrifice = groups.some((g) => lengthsOf(g, false) > 0);
  const temps = new Set(groups.map((g) => g.temperature).filter((t): t is number => t !== null).map((t) => Math.round(t * 10)));
  const boresAtOneT = new Map<number | null, number>();
  for (const g of groups) if (g.slit === undefined) boresAtOneT.set(g.temperature, (boresAtOneT.get(g.temperature) ?? 0) + 1);
  const maxBores = Math.max(0, ...boresAtOneT.values());
  return {
    bagley: maxLong >= 2 ? ok : { ok: false, reason: "needs two or more die lengths of one bore; the data have one" },
    orifice: anyOrifice ? ok : { ok: false, reason: "needs an orifice die (L/D below 1); the data have none" },
    slip: maxBores >= 2 ? ok : { ok: false, reason: "needs two or more round die bores at one temperature; the data have one" },
    pressureDependence: maxLong >= 3 ? ok : { ok: false, reason: `needs three or more die lengths of one bore; the data have ${maxLong}` },
    extensional: maxLong >= 2 || anyOrifice ? ok : { ok: false, reason: "needs an entrance pressure: two or more die lengths, or an orifice die" },
    temperatureShift: temps.size >= 2 ? ok : { ok: false, reason: `needs flow curves at two or more temperatures; the data have ${temps.size}` },
    master: temps.size >= 2 ? ok : { ok: false, reason: `needs flow curves at two or more temperatures; the data have ${temps.size}` },
    // Cross-WLF's η0(T) has three constants (D1, D2, A1): three temperatures at least (temperature/masterFit.ts)
    crossWlf: temps.size >= 3 ? ok : { ok: false, reason: `Cross-WLF needs flow curves at three or more temperatures; the data have ${temps.size}` },
    slitEdgeCorrection: groups.some((g) => g.slit !== undefined) ? ok : { ok: false, reason: "needs a slit die; the data have round dies only" },
  };
}
