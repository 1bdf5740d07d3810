/**
 * One group's reduction (one temperature, one die bore or slit size): its dies, the end correction
 * (Bagley across die lengths, an orifice die, or none), the entrance-pressure comparison when an
 * orifice die is present, and the Rabinowitsch correction of the corrected curve.
 *
 *   Bagley: ΔP = ΔP_ent + 2τ_w·(L/R) at each apparent rate (L/H for a slit); τ_w = slope/2.
 *   Rabinowitsch: γ̇_w = γ̇_a(3n′+1)/(4n′) round, γ̇_a(2n′+1)/(3n′) slit; η = τ_w/γ̇_w.
 *
 * Returns the group and, per flow-curve point, where it came from (for the optional methods).
 */
import { RheoError, Warning, warning } from "./errors";
import { BagleyRow, bagleyCorrection } from "./bagley";
import { rabinowitschCorrection } from "./rabinowitsch";
import { slitWarnings } from "./slit";
import { DEFAULT_ORIFICE_OPTIONS, OrificeOptions, compareEntrancePressures, orificeCorrection, orificeLandCorrection, shortestOrificeDie } from "./orifice";
import { geometricMean, interpolateLogLog } from "./interpolate";
import { bagleyStressUncertainty } from "./uncertainty";
import type { CurveSource } from "./reduceMethods";
import type { EntrancePressureRow, FlowCurveRow, PointRow, ReduceOptions, ReductionGroup } from "./reduceTypes";
import { cluster, groupLabel, millimetres } from "./grouping";


/**
 * Reduces one group of points (see the module comment).
 * @param slit the slit's width and height (m) for a slit group; omitted for a round die
 * @throws RheoError("missing") naming dieLength when the group has only orifice dies, a single
 *   die length with the Bagley correction, or no orifice die with the orifice correction
 */
export function reduceGroup(
  points: PointRow[],
  temperature: number | null,
  opt: ReduceOptions,
  slit?: { width: number; height: number },
): { group: ReductionGroup; sources: CurveSource[] } {
  const geometry = slit ? "slit" : "round";
  const dieDiameter = slit ? NaN : geometricMean(points.map((p) => p.dieDiameter));
  const label = groupLabel({ temperature, dieDiameter, slitWidth: slit?.width, slitHeight: slit?.height });
  // x of the Bagley plot: L/R for round dies, L/H for slits (ΔP = ΔP_ent + 2τ_w·x in both).
  const xOf = (length: number) => (slit ? length / slit.height : (2 * length) / dieDiameter);
  // τ = ΔP·g with g = D/(4L) (round) or H/(2L) (slit)
  const stressFactor = (length: number) => (slit ? slit.height / (2 * length) : dieDiameter / (4 * length));
  const orificeOpt: OrificeOptions = { ...DEFAULT_ORIFICE_OPTIONS, ...opt.orifice };
  const isOrifice = (length: number) => length / (slit ? slit.height : dieDiameter) < orificeOpt.maxLengthOverDiameter;
  const byLength = cluster(points, (p) => p.dieLength, (a, b) => Math.abs(a - b) <= 1e-6 * a);
  const dies = byLength.map((g) => {
    const dieLength = (g[0] as PointRow).dieLength;
    const die: ReductionGroup["dies"][number] = { dieLength, lengthOverRadius: xOf(dieLength), label: `L=${millimetres(dieLength)}`, points: g.length };
    if (isOrifice(dieLength)) die.orifice = true;
    return die;
  });
  const longDies = byLength.filter((g) => !isOrifice((g[0] as PointRow).dieLength));
  // the orifice die (the shortest, when several); its land is subtracted (orifice.ts)
  const orificeDie = shortestOrificeDie(points.filter((p) => isOrifice(p.dieLength)));
  const orificePoints = orificeDie?.points ?? [];
  const orificeLength = orificeDie?.dieLength ?? 0;
  const warnings: Warning[] = slit ? slitWarnings(slit.width, slit.height) : [];
  const ratioName = slit ? "L/H" : "L/D";
  if (longDies.length === 0) {
    throw new RheoError("missing", "dieLength", `${label} has only orifice dies (${ratioName} < ${orificeOpt.maxLengthOverDiameter}); a long die is needed too`);
  }
  if (orificePoints.length > 0 && opt.endCorrection !== "orifice") {
    warnings.push(
      warning("ORIFICE_DIE_NOT_ON_BAGLEY", `The die of ${ratioName} < ${orificeOpt.maxLengthOverDiameter} (L = ${millimetres((orificePoints[0] as PointRow).dieLength)}) is treated as an orifice die: it is kept off the Bagley line and its entrance pressure (its reading less its land) is listed beside Bagley's.${orificeDie && orificeDie.otherLengths.length > 0 ? ` The other orifice dies (L = ${orificeDie.otherLengths.map(millimetres).join(", ")}) are not used.` : ""}`),
    );
  }
  if (opt.endCorrection === "orifice" && orificePoints.length === 0) {
    throw new RheoError("missing", "dieLength", `${label} has no orifice die (${ratioName} < ${orificeOpt.maxLengthOverDiameter}); the orifice end correction needs one, or choose bagley or none`);
  }
  const orificeRates = orificePoints.map((p) => p.shearRateApparent);
  const orificePressures = orificePoints.map((p) => p.pressure);
  const orificeAt = (rate: number) => (orificePoints.length > 0 ? (interpolateLogLog(orificeRates, orificePressures, rate) ?? null) : null);
  // land-corrected orifice entrance pressure at a rate, with τ_w from Bagley or, failing that, from
  // the longest die paired with the orifice (ΔP_long at this rate)
  const orificeEntranceAt = (rate: number, bagleyStress: number | null, longPressure: number | null): number | null => {
    const pO = orificeAt(rate);
    if (pO === null) return null;
    if (bagleyStress !== null) return pO - 2 * bagleyStress * xOf(orificeLength);
    if (longPressure === null || !(longPressure > pO)) return null;
    return orificeLandCorrection(longPressure, xOf(longestLength), pO, xOf(orificeLength)).entrancePressure;
  };
  let bagley: BagleyRow[] = [];
  const wantBagley = opt.endCorrection === "bagley" || (opt.endCorrection === "orifice" && longDies.length >= 2);
  if (wantBagley) {
    if (longDies.length < 2) {
      throw new RheoError(
        "missing",
        "dieLength",
        `${label} has a single die length (${millimetres(longDies[0]?.[0]?.dieLength ?? 0)}); the Bagley correction needs two or more (or choose no end correction)`,
      );
    }
    const result = bagleyCorrection(
      longDies.flat().map((p) => ({
        die: `L=${millimetres(p.dieLength)}`,
        lengthOverRadius: xOf(p.dieLength),
        shearRateApparent: p.shearRateApparent,
        pressure: p.pressure,
      })),
      opt.bagley,
    );
    bagley = result.rows;
    warnings.push(...result.warnings);
  }
  let curve: { rate: number; stress: number; source: CurveSource }[];
  const longest = longDies[longDies.length - 1] as PointRow[];
  const longestLength = (longest[0] as PointRow).dieLength;
  if (opt.endCorrection === "bagley") {
    curve = bagley.map((r) => ({
      rate: r.shearRateApparent,
      stress: r.wallShearStress,
      source: {
        pressure: Math.max(...r.points.map((p) => p.pressure)),
        entrancePressure: r.entrancePressure,
        stressUncertainty: (uP: number) => bagleyStressUncertainty(r.points.map((p) => p.lengthOverRadius), uP, r.slopeStandardError),
        bagleyPoints: r.points.map((p) => ({ lengthOverRadius: p.lengthOverRadius, pressure: p.pressure })),
      },
    }));
  } else if (opt.endCorrection === "orifice") {
    // For a slit, a "diameter" of 2H makes D/(4L) equal H/(2L).
    const corrected = orificeCorrection(
      {
        dieDiameter: slit ? 2 * slit.height : dieDiameter,
        dieLength: longestLength,
        shearRateApparent: longest.map((p) => p.shearRateApparent),
        pressure: longest.map((p) => p.pressure),
      },
      { shearRateApparent: orificeRates, pressure: orificePressures, dieLength: orificeLength },
    );
    warnings.push(...corrected.warnings);
    const g = stressFactor(longestLength - orificeLength);
    curve = corrected.rows
      .map((r) => ({
        rate: r.shearRateApparent,
        stress: r.wallShearStress,
        source: { pressure: r.pressure, entrancePressure: r.entrancePressureOrifice, stressUncertainty: (uP: number) => Math.SQRT2 * uP * g, bagleyPoints: null },
      }))
      .sort((a, b) => a.rate - b.rate);
  } else {
    warnings.push(
      warning("END_CORRECTION_NONE", `No end correction: the wall stress of the longest die (${millimetres(longestLength)}) includes its entrance loss and is overestimated.`),
    );
    const g = stressFactor(longestLength);
    curve = longest
      .map((p) => ({
        rate: p.shearRateApparent,
        stress: p.wallShearStressApparent,
        source: { pressure: p.pressure, entrancePressure: orificeEntranceAt(p.shearRateApparent, null, p.pressure), stressUncertainty: (uP: number) => uP * g, bagleyPoints: null },
      }))
      .sort((a, b) => a.rate - b.rate);
  }
  let entrancePressures: EntrancePressureRow[] | undefined;
  if (orificePoints.length > 0 && (bagley.length > 0 || opt.endCorrection !== "bagley")) {
    const rates = bagley.length > 0 ? bagley.map((r) => r.shearRateApparent) : curve.map((c) => c.rate);
    const fromBagley = rates.map((rate) => bagley.find((r) => r.shearRateApparent === rate)?.entrancePressure ?? null);
    const bagleyStress = (rate: number) => bagley.find((r) => r.shearRateApparent === rate)?.wallShearStress ?? null;
    const longAt = (rate: number) => curve.find((c) => c.rate === rate)?.source.pressure ?? null;
    const fromOrifice = rates.map((rate) => orificeEntranceAt(rate, bagleyStress(rate), longAt(rate)));
    const cmp = compareEntrancePressures(rates, fromBagley, fromOrifice, orificeOpt.maxDisagreement, orificeLength / (slit ? slit.height : dieDiameter));
    warnings.push(...cmp.warnings);
    entrancePressures = rates.map((rate, i) => ({
      shearRateApparent: rate,
      entrancePressure: fromBagley[i] ?? null,
      entrancePressureOrifice: fromOrifice[i] ?? null,
      orificePressure: orificeAt(rate),
      difference: cmp.difference[i] ?? null,
    }));
  }
  const rab = rabinowitschCorrection(
    curve.map((c) => c.rate),
    curve.map((c) => c.stress),
    { ...opt.rabinowitsch, geometry },
  );
  warnings.push(...rab.warnings);
  const flowCurve: FlowCurveRow[] = curve.map((c, i) => {
    const wall = rab.shearRateWall[i] ?? null;
    return {
      shearRateApparent: c.rate,
      wallShearStress: c.stress,
      nPrime: rab.nPrime[i] as number,
      shearRateWall: wall,
      viscosity: wall === null ? null : c.stress / wall,
      viscosityApparent: c.stress / c.rate,
    };
  });
  const group: ReductionGroup = { temperature, dieDiameter, geometry, dies, points, bagley, flowCurve, warnings };
  if (slit) {
    group.slitWidth = slit.width;
    group.slitHeight = slit.height;
  }
  if (entrancePressures) group.entrancePressures = entrancePressures;
  return { group, sources: curve.map((c) => c.source) };
}

