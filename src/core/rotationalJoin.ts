/**
 * Joining a rotational-rheometer curve to the capillary flow curve of the same material and
 * temperature: the rotational instrument reaches the low rates where the zero-shear plateau lies,
 * the capillary the high rates of processing; together they pin down η0.
 *
 * A rotational curve is either steady shear viscosity η(γ̇), or complex viscosity |η*|(ω) from an
 * oscillatory test, read as steady viscosity at γ̇ = ω by the Cox–Merz rule (Cox & Merz,
 * J. Polym. Sci. 28 (1958) 619: η(γ̇) = |η*|(ω) at γ̇ = ω), which holds well for many polymer melts
 * and fails for filled, gelled or yield-stress materials.
 *
 * Overlap check: in the rate range both curves cover, each curve's points are compared with the
 * other curve interpolated linearly in log–log (core/interpolate.ts); the ratio reported is the
 * geometric mean of η_rotational/η_capillary over those comparisons, and the largest single
 * deviation |ratio − 1| is compared with the tolerance (15 %: capillary end corrections, wall
 * slip and the Cox–Merz rule each commonly account for deviations of several per cent; common
 * practice, no source). Nothing is rescaled: a mismatch is reported, not patched.
 */
import { RheoError, requirePositive, warning, type Warning } from "./errors";
import { geometricMean, interpolateLogLog } from "./interpolate";

/** "steady": η(γ̇); "oscillatory": |η*|(ω), joined by the Cox–Merz rule. */
export type RotationalKind = "steady" | "oscillatory";

/** A rotational curve in SI: rates in 1/s (γ̇) or rad/s (ω), viscosities in Pa·s; T in K if known. */
export interface RotationalCurve {
  kind: RotationalKind;
  /** γ̇ (1/s) for "steady", ω (rad/s) for "oscillatory" */
  rate: readonly number[];
  /** η or |η*| (Pa·s) */
  viscosity: readonly number[];
  /** K, when the file gives it */
  temperature?: number;
}

/** Options of {@link joinRotational}; defaults in {@link DEFAULT_JOIN_OPTIONS}. */
export interface JoinOptions {
  /** Largest accepted |η_rotational/η_capillary − 1| in the overlap (see the module comment). */
  tolerance: number;
  /**
   * Largest difference (K) between the rotational curve's temperature and a capillary group's
   * for them to count as the same temperature (1 K: typical oven and plate control; common
   * practice, no source).
   */
  temperatureTolerance: number;
}

/** The documented defaults; docs and tests import this constant. */
export const DEFAULT_JOIN_OPTIONS: Readonly<JoinOptions> = Object.freeze({ tolerance: 0.15, temperatureTolerance: 1 });

/** How the two curves agree where they overlap. */
export interface JoinOverlap {
  /** the common rate range (1/s) */
  shearRateMin: number;
  shearRateMax: number;
  /** comparisons made (points of either curve inside the other's range) */
  comparisons: number;
  /** geometric mean of η_rotational/η_capillary over the comparisons */
  ratio: number;
  /** the largest |η_rotational/η_capillary − 1| of a single comparison */
  maxDeviation: number;
  withinTolerance: boolean;
}

/** A joined curve, sorted by rate, with the origin of each point. */
export interface JoinedCurve {
  shearRate: number[];
  viscosity: number[];
  source: ("capillary" | "rotational")[];
  /** null when the two curves share no rate range */
  overlap: JoinOverlap | null;
  /** the rotational curve's rate range (1/s, after Cox–Merz) */
  rotationalRange: [number, number];
  capillaryRange: [number, number];
  warnings: Warning[];
}

function checkCurve(rate: readonly number[], viscosity: readonly number[], rateName: string, viscosityName: string): void {
  if (!Array.isArray(rate) || rate.length === 0) throw new RheoError("missing", rateName, "has no points");
  if (!Array.isArray(viscosity) || viscosity.length !== rate.length) {
    throw new RheoError("value", viscosityName, `has ${Array.isArray(viscosity) ? viscosity.length : 0} values but ${rateName} has ${rate.length}`);
  }
  rate.forEach((v, i) => requirePositive(v, rateName, i + 1));
  viscosity.forEach((v, i) => requirePositive(v, viscosityName, i + 1));
}

const fmt = (v: number) => Number(v.toPrecision(3)).toString();

/**
 * Joins a rotational curve to a capillary one and checks their overlap (see the module comment).
 * @param capillary the capillary true flow curve: γ̇ (1/s), η (Pa·s)
 * @throws RheoError naming the argument and row for empty, unequal-length, non-finite or
 *   non-positive data, an unknown kind, or a tolerance that is not a positive number.
 * @example joinRotational(capillary, { kind: "oscillatory", rate: omega, viscosity: etaStar }).overlap?.ratio
 */
export function joinRotational(capillary: { shearRate: readonly number[]; viscosity: readonly number[] }, rotational: RotationalCurve, options: Partial<JoinOptions> = {}): JoinedCurve {
  const opts: JoinOptions = { ...DEFAULT_JOIN_OPTIONS, ...Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) };
  for (const key of ["tolerance", "temperatureTolerance"] as const) {
    if (!(typeof opts[key] === "number" && opts[key] > 0 && Number.isFinite(opts[key]))) throw new RheoError("value", key, `must be a number greater than zero, got ${String(opts[key])}`);
  }
  if (rotational.kind !== "steady" && rotational.kind !== "oscillatory") {
    throw new RheoError("value", "rotational.kind", `must be "steady" (viscosity vs shear rate) or "oscillatory" (complex viscosity vs angular frequency), got "${String(rotational.kind)}"`);
  }
  const rateName = rotational.kind === "steady" ? "rotational.shearRate" : "rotational.angularFrequency";
  const etaName = rotational.kind === "steady" ? "rotational.viscosity" : "rotational.complexViscosity";
  checkCurve(rotational.rate, rotational.viscosity, rateName, etaName);
  checkCurve(capillary.shearRate, capillary.viscosity, "capillary.shearRate", "capillary.viscosity");

  const rot = { x: [...rotational.rate], y: [...rotational.viscosity] };
  const cap = { x: [...capillary.shearRate], y: [...capillary.viscosity] };
  const range = (x: number[]): [number, number] => [Math.min(...x), Math.max(...x)];
  const rotRange = range(rot.x);
  const capRange = range(cap.x);
  const warnings: Warning[] = [];
  if (rotational.kind === "oscillatory") {
    warnings.push(warning("COX_MERZ_APPLIED", `complex viscosity at ${fmt(rotRange[0])}–${fmt(rotRange[1])} rad/s taken as steady shear viscosity at the same rates (Cox–Merz rule)`));
  }

  const ratios: number[] = [];
  rot.x.forEach((x, i) => {
    const c = interpolateLogLog(cap.x, cap.y, x);
    if (c !== undefined) ratios.push((rot.y[i] as number) / c);
  });
  cap.x.forEach((x, i) => {
    const r = interpolateLogLog(rot.x, rot.y, x);
    if (r !== undefined) ratios.push(r / (cap.y[i] as number));
  });
  let overlap: JoinOverlap | null = null;
  const lo = Math.max(rotRange[0], capRange[0]);
  const hi = Math.min(rotRange[1], capRange[1]);
  if (ratios.length > 0) {
    const ratio = geometricMean(ratios);
    const maxDeviation = Math.max(...ratios.map((q) => Math.abs(q - 1)));
    overlap = { shearRateMin: lo, shearRateMax: hi, comparisons: ratios.length, ratio, maxDeviation, withinTolerance: maxDeviation <= opts.tolerance };
    if (!overlap.withinTolerance) {
      warnings.push(
        warning(
          "ROTATIONAL_OVERLAP_MISMATCH",
          `in their common range ${fmt(lo)}–${fmt(hi)} 1/s the rotational viscosity is ${fmt(ratio)} times the capillary one on average and differs by up to ${fmt(100 * maxDeviation)} % (tolerance ${fmt(100 * opts.tolerance)} %): check wall slip, end corrections, the temperature${rotational.kind === "oscillatory" ? ", and whether the Cox–Merz rule holds for this material" : ""}`,
        ),
      );
    }
  } else {
    const gap = rotRange[1] < capRange[0] ? `the rotational data end at ${fmt(rotRange[1])} 1/s and the capillary data start at ${fmt(capRange[0])} 1/s` : `the capillary data end at ${fmt(capRange[1])} 1/s and the rotational data start at ${fmt(rotRange[0])} 1/s`;
    warnings.push(warning("ROTATIONAL_NO_OVERLAP", `the rotational and capillary curves share no rate range (${gap}); their agreement cannot be checked and the joined curve assumes it`));
  }

  const points = [
    ...cap.x.map((x, i) => ({ x, y: cap.y[i] as number, source: "capillary" as const })),
    ...rot.x.map((x, i) => ({ x, y: rot.y[i] as number, source: "rotational" as const })),
  ].sort((a, b) => a.x - b.x);
  return {
    shearRate: points.map((p) => p.x),
    viscosity: points.map((p) => p.y),
    source: points.map((p) => p.source),
    overlap,
    rotationalRange: rotRange,
    capillaryRange: capRange,
    warnings,
  };
}
