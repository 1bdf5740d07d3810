/**
 * Representative-rate ("Schümmer") viscosity: a cross-check of the Rabinowitsch correction that
 * needs no differentiation (Schümmer & Worthoff, Chem. Eng. Sci. 33 (1978) 759; from memory).
 * In a round capillary the shear rate at r = (π/4)·R is nearly independent of the flow index, so
 *
 *   γ̇* = (π/4)·γ̇_a,  η(γ̇*) ≈ τ_w/γ̇_a  (the apparent viscosity, placed at the representative rate).
 *
 * For a power-law liquid the ratio of η* to the true η(γ̇*) is exactly
 * ((3n+1)/(4n))^n·(4/π)^(n−1): 1 at n = 1, 0.991 at n = 0.5, 0.969 at n = 0.3, 0.947 at n = 0.2
 * (algebra from γ̇_w = γ̇_a(3n+1)/(4n); test/representativeRate.test.ts). That is the method's own
 * bias, not an error of the Rabinowitsch result: the check divides it out with the point's n′,
 * deviation_corrected = (η* ÷ η_Rabinowitsch)/ratio(n′) − 1, and warns on the corrected deviation.
 * Round dies only: the slit's representative position is not given here.
 */
import { RheoError, Warning, requirePositive, warning } from "./errors";
import { interpolateLogLog } from "./interpolate";

/** The representative position r = (π/4)·R for round capillaries (Schümmer & Worthoff 1978). */
export const REPRESENTATIVE_RATE_FACTOR = Math.PI / 4;

/**
 * The representative-rate method's own ratio η* ÷ η(γ̇*) for a power-law liquid of index n:
 * ((3n+1)/(4n))^n·(4/π)^(n−1) (module comment).
 * @param flowIndex n (> 0)
 * @example representativeRateBias(0.2) // 0.9469
 */
export function representativeRateBias(flowIndex: number): number {
  requirePositive(flowIndex, "flowIndex");
  const n = flowIndex;
  return Math.pow((3 * n + 1) / (4 * n), n) * Math.pow(4 / Math.PI, n - 1);
}

/** Options of {@link representativeRateCheck}. */
export interface RepresentativeRateOptions {
  /** warn where the two viscosities differ by more than this fraction once the method's power-law bias is divided out ("a few percent"; common practice, no source) */
  maxDeviation: number;
}

/** Defaults of {@link RepresentativeRateOptions}. */
export const DEFAULT_REPRESENTATIVE_RATE_OPTIONS: Readonly<RepresentativeRateOptions> = Object.freeze({ maxDeviation: 0.05 });

/**
 * Representative shear rate γ̇* = (π/4)·γ̇_a and viscosity η* = τ_w/γ̇_a.
 * @param shearRateApparent γ̇_a, 1/s (> 0)
 * @param wallShearStress end-corrected τ_w, Pa (> 0)
 * @returns γ̇* (1/s) and η* (Pa·s)
 * @example representativeViscosity(100, 1e5) // { shearRate: 78.54, viscosity: 1000 }
 */
export function representativeViscosity(shearRateApparent: number, wallShearStress: number): { shearRate: number; viscosity: number } {
  requirePositive(shearRateApparent, "shearRateApparent");
  requirePositive(wallShearStress, "wallShearStress");
  return { shearRate: REPRESENTATIVE_RATE_FACTOR * shearRateApparent, viscosity: wallShearStress / shearRateApparent };
}

/** One point of the cross-check. */
export interface RepresentativeRateRow {
  /** γ̇*, 1/s */
  shearRateRepresentative: number;
  /** η* = τ_w/γ̇_a, Pa·s */
  viscosityRepresentative: number;
  /** (η* − η_Rabinowitsch(γ̇*))/η_Rabinowitsch(γ̇*); null where γ̇* lies outside the Rabinowitsch curve */
  deviation: number | null;
  /** the method's own deviation for a power law of the point's n′, ratio(n′) − 1; null where n′ ≤ 0 */
  expectedDeviation: number | null;
  /** (1 + deviation)/ratio(n′) − 1: what is left once the method's bias is divided out; null where either is */
  deviationCorrected: number | null;
}

/**
 * Representative-rate viscosities of a flow curve, each compared with the Rabinowitsch viscosity
 * interpolated (log–log) to its representative rate.
 *
 * Warning code: REPRESENTATIVE_RATE_DISAGREES (|deviationCorrected| > maxDeviation somewhere:
 * the Rabinowitsch slope is suspect, e.g. noisy data or a strongly curved flow curve).
 *
 * @param shearRateApparent γ̇_a per point, 1/s
 * @param wallShearStress τ_w per point, Pa
 * @param shearRateWall Rabinowitsch wall rate per point (null where undefined), 1/s
 * @param viscosity Rabinowitsch viscosity per point (null where undefined), Pa·s
 * @param nPrime n′ per point (for the method's bias); omitted: no correction (bias taken as 0)
 * @throws RheoError("value") for unequal lengths; ("domain") for non-positive rates or stresses.
 */
export function representativeRateCheck(
  shearRateApparent: number[],
  wallShearStress: number[],
  shearRateWall: (number | null)[],
  viscosity: (number | null)[],
  options: Partial<RepresentativeRateOptions> = {},
  nPrime?: number[],
): { rows: RepresentativeRateRow[]; warnings: Warning[] } {
  const opt: RepresentativeRateOptions = { ...DEFAULT_REPRESENTATIVE_RATE_OPTIONS, ...options };
  const n = shearRateApparent.length;
  for (const [name, arr] of [["wallShearStress", wallShearStress], ["shearRateWall", shearRateWall], ["viscosity", viscosity], ["nPrime", nPrime ?? shearRateApparent]] as const) {
    if (arr.length !== n) throw new RheoError("value", name, `has ${arr.length} values but shearRateApparent has ${n}`);
  }
  const known: { w: number; v: number }[] = [];
  shearRateWall.forEach((w, i) => {
    const v = viscosity[i] ?? null;
    if (w !== null && v !== null && w > 0 && v > 0) known.push({ w, v });
  });
  const rows = shearRateApparent.map((rate, i) => {
    const rep = representativeViscosity(rate, wallShearStress[i] as number);
    const rab = known.length >= 2 ? interpolateLogLog(known.map((p) => p.w), known.map((p) => p.v), rep.shearRate) : undefined;
    const np = nPrime === undefined ? 1 : (nPrime[i] as number);
    const ratio = np > 0 && Number.isFinite(np) ? representativeRateBias(np) : null;
    const deviation = rab === undefined ? null : (rep.viscosity - rab) / rab;
    return {
      shearRateRepresentative: rep.shearRate,
      viscosityRepresentative: rep.viscosity,
      deviation,
      expectedDeviation: ratio === null ? null : ratio - 1,
      deviationCorrected: deviation === null || ratio === null ? null : (1 + deviation) / ratio - 1,
    };
  });
  const bad = rows.filter((r) => r.deviationCorrected !== null && Math.abs(r.deviationCorrected) > opt.maxDeviation);
  const warnings =
    bad.length > 0
      ? [
          warning(
            "REPRESENTATIVE_RATE_DISAGREES",
            `The representative-rate viscosity differs from the Rabinowitsch viscosity by more than ${Math.round(opt.maxDeviation * 100)} % at ${bad.map((r) => fmt(r.shearRateRepresentative)).join(", ")} 1/s, beyond the method's own power-law bias at that n': the Rabinowitsch slope n' may be unreliable there.`,
          ),
        ]
      : [];
  return { rows, warnings };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
