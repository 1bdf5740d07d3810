/**
 * One group's reduction (one temperature, one die bore or slit size): its dies as speed steps
 * (repeats compared, groupDies.ts), the flow-instability test (readings above a break set aside),
 * the end correction (Bagley across die lengths at one rate ladder, an orifice die, or none), a
 * second instability test on the corrected curve, the checks of the Bagley lines, the
 * entrance-pressure comparison when an orifice die is present, the Rabinowitsch correction of the
 * stable curve, and what became of every row.
 *
 *   Bagley: ΔP = ΔP_ent + 2τ_w·(L/R) at each apparent rate (L/H for a slit); τ_w = slope/2.
 *   Rabinowitsch: γ̇_w = γ̇_a(3n′+1)/(4n′) round, γ̇_a(2n′+1)/(3n′) slit; η = τ_w/γ̇_w.
 *
 * Returns the group and, per flow-curve point, where it came from (for the optional methods).
 */
import { RheoError, Warning, warning } from "./errors";
import { BagleyDie, BagleyRow, bagleyLines } from "./bagley";
import { bagleyLineChecks } from "./bagleyChecks";
import { rabinowitschCorrection } from "./rabinowitsch";
import { slitWarnings } from "./slit";
import { DEFAULT_ORIFICE_OPTIONS, OrificeOptions, compareEntrancePressures, orificeCorrection, orificeLandCorrection, shortestOrificeDie } from "./orifice";
import { geometricMean, interpolateLogLog } from "./interpolate";
import { bagleyStressUncertainty } from "./uncertainty";
import type { CurveSource } from "./reduceMethods";
import type { EntrancePressureRow, FlaggedPoint, FlowCurveRow, PointRow, ReduceOptions, ReductionGroup, StabilityRow } from "./reduceTypes";
import { groupLabel, millimetres } from "./grouping";
import { DEFAULT_REPEAT_OPTIONS, repeatWarnings } from "./speedSteps";
import { findFlowBreak, meltFractureNote } from "./flowInstability";
import { pressureOnLadder } from "./rateLadder";
import { GroupDie, GroupPoint, fallsWarning, groupDies, instabilityWarning, markInstability, readingFates, unusedWarning } from "./groupDies";
import { RowFate, tallyRows } from "./rowAccount";


/**
 * Reduces one group of points (see the module comment).
 * @param slit the slit's width and height (m) for a slit group; omitted for a round die
 * @throws RheoError("missing") naming dieLength when the group has only orifice dies, a single
 *   die length with the Bagley correction, or no orifice die with the orifice correction
 */
export function reduceGroup(
  points: GroupPoint[],
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
  const repeatOpt = { ...DEFAULT_REPEAT_OPTIONS, ...opt.repeats };
  const allDies = groupDies(points, { xOf, stressFactor, isOrifice }, repeatOpt);
  const dies = allDies.map((d) => {
    const die: ReductionGroup["dies"][number] = { dieLength: d.dieLength, lengthOverRadius: d.lengthOverRadius, label: d.label, points: d.indices.length, steps: d.steps.length };
    if (d.orifice) die.orifice = true;
    return die;
  });
  const warnings: Warning[] = slit ? slitWarnings(slit.width, slit.height) : [];
  warnings.push(...repeatWarnings(allDies.map((d) => ({ die: d.label, readings: d.indices.map((i) => ({ rate: NaN, pressure: NaN, row: (points[i] as PointRow).row })), ladder: d.ladder })), repeatOpt.stabilityThreshold));
  const instability = markInstability(allDies, opt.instability);
  if (instability.falls.length > 0) warnings.push(fallsWarning(instability.falls));
  const stableLong = allDies.filter((d) => !d.orifice && d.stable > 0);
  const longDies = stableLong.map((d) => d.steps.slice(0, d.stable));
  const orificeDies = allDies.filter((d) => d.orifice);
  // the orifice die (the shortest, when several); its land is subtracted (orifice.ts)
  const orificeDie = shortestOrificeDie(orificeDies.flatMap((d) => d.steps));
  const orificePoints = orificeDie?.points ?? [];
  const orificeLength = orificeDie?.dieLength ?? 0;
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
  let bagleyDies: BagleyDie[] = [];
  let lines: ReturnType<typeof bagleyLines> | null = null;
  const wantBagley = opt.endCorrection === "bagley" || (opt.endCorrection === "orifice" && longDies.length >= 2);
  if (wantBagley) {
    if (longDies.length < 2) {
      throw new RheoError(
        "missing",
        "dieLength",
        `${label} has a single die length (${millimetres(longDies[0]?.[0]?.dieLength ?? 0)}); the Bagley correction needs two or more (or choose no end correction)`,
      );
    }
    bagleyDies = stableLong.map((d, k) => ({
      die: d.label,
      lengthOverRadius: d.lengthOverRadius,
      rates: (longDies[k] as PointRow[]).map((p) => p.shearRateApparent),
      pressures: (longDies[k] as PointRow[]).map((p) => p.pressure),
    }));
    lines = bagleyLines(bagleyDies, opt.bagley);
    bagley = lines.rows;
    warnings.push(...lines.warnings);
  }
  let curve: { rate: number; stress: number; source: CurveSource }[];
  // the longest stable die (the flow curve of "none" and "orifice")
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
  const flagged: FlaggedPoint[] = [];
  const breakAt = instability.flowBreak ? Math.exp(instability.flowBreak.x) : Infinity;
  if (instability.flowBreak) {
    const above = allDies.flatMap((d) => d.steps.slice(d.orifice ? d.steps.length : d.stable).map((p) => ({ d, p })));
    for (const { d, p } of above) flagged.push({ source: d.label, shearRateApparent: p.shearRateApparent, pressure: p.pressure, wallShearStress: p.wallShearStressApparent, reason: "FLOW_INSTABILITY" });
    const rates = above.map((a) => a.p.shearRateApparent);
    const below = curve.filter((c) => c.rate < breakAt);
    const last = below[below.length - 1];
    const labels = [...new Set(above.map((a) => a.d.label))];
    const where = `${labels.length === 1 ? "die" : "dies"} ${labels.join(", ")}`;
    const lo = rates.reduce((m, r) => Math.min(m, r), Infinity);
    const hi = rates.reduce((m, r) => Math.max(m, r), 0);
    warnings.push(instabilityWarning(where, instability.flowBreak, lo, hi, last ? { rate: last.rate, stress: last.stress } : null));
  }
  const curveBreak = curve.length >= 4 ? findFlowBreak([{ x: curve.map((c) => Math.log(c.rate)), y: curve.map((c) => Math.log(c.stress)) }], opt.instability).break : null;
  let curveBreakRate = Infinity;
  if (curveBreak) {
    const k = curveBreak.firstFlagged[0] as number;
    const cut = curve.slice(k);
    curveBreakRate = (cut[0] as { rate: number }).rate;
    for (const c of cut) flagged.push({ source: "flow curve", shearRateApparent: c.rate, pressure: null, wallShearStress: c.stress, reason: "FLOW_INSTABILITY" });
    const last = curve[k - 1] as { rate: number; stress: number };
    warnings.push(instabilityWarning("the corrected flow curve", curveBreak, curveBreakRate, (cut[cut.length - 1] as { rate: number }).rate, last));
    curve = curve.slice(0, k);
  }
  const keptLines = bagley.map((r, k) => ({ r, k })).filter(({ r }) => r.shearRateApparent < curveBreakRate);
  const cutLines = bagley.map((r, k) => ({ r, k })).filter(({ r }) => r.shearRateApparent >= curveBreakRate);
  bagley = keptLines.map(({ r }) => r);
  if (lines) warnings.push(...bagleyLineChecks(bagley, bagleyDies, opt.bagley.checks));
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
  const maxStress = curve.reduce((m, c) => (c.stress > m.stress ? c : m), { rate: NaN, stress: 0 });
  const note = meltFractureNote(maxStress.stress, maxStress.rate, opt.instability);
  if (note) warnings.push(note);
  // What became of every reading (rowAccount.ts): steps used by a kept line or point, else why not.
  const curveRates = new Set(curve.map((c) => c.rate));
  const usedSteps = new Set<string>();
  const cutSteps = new Set<string>();
  const mark = (target: Set<string>, die: GroupDie, steps: number[]) => steps.forEach((s) => target.add(`${allDies.indexOf(die)}:${s}`));
  const markRows = (rows: { k: number }[], target: Set<string>) => {
    for (const { k } of rows) for (const u of lines?.rowSteps[k] ?? []) mark(target, stableLong[u.die] as GroupDie, u.steps);
  };
  markRows(keptLines, usedSteps);
  markRows(cutLines, cutSteps);
  const longestDie = stableLong[stableLong.length - 1] as GroupDie;
  if (opt.endCorrection !== "bagley") {
    longestDie.steps.forEach((p, s) => {
      if (curveRates.has(p.shearRateApparent)) mark(usedSteps, longestDie, [s]);
      else if (p.shearRateApparent >= curveBreakRate) mark(cutSteps, longestDie, [s]);
    });
  }
  const orificeLadder = { rates: orificePoints.map((p) => p.shearRateApparent), pressures: orificePoints.map((p) => p.pressure) };
  const orificeStep = new Map<PointRow, [GroupDie, number]>(orificeDies.flatMap((d) => d.steps.map((p, s): [PointRow, [GroupDie, number]] => [p, [d, s]])));
  const orificeRatesUsed = entrancePressures ? entrancePressures.map((e) => e.shearRateApparent) : opt.endCorrection === "orifice" ? [...curveRates] : [];
  for (const rate of orificeRatesUsed) {
    for (const i of pressureOnLadder(orificeLadder, rate, 0)?.steps ?? []) {
      const [die, s] = orificeStep.get(orificePoints[i] as PointRow) as [GroupDie, number];
      mark(usedSteps, die, [s]);
    }
  }
  // a die's step whose rate is a ladder rate holds that rate exactly (rateLadder.ts copies it)
  const dropped = new Set(lines?.dropped ?? []);
  const nonRising = new Set(lines?.nonRising ?? []);
  const fates = readingFates(points.length, allDies, (d, s): RowFate => {
    const die = allDies[d] as GroupDie;
    const key = `${d}:${s}`;
    if (usedSteps.has(key)) return "used";
    if ((!die.orifice && s >= die.stable) || cutSteps.has(key)) return { skipped: "instability" };
    const rate = (die.steps[s] as PointRow).shearRateApparent;
    if (die.orifice) return { skipped: "notNeeded" };
    if (opt.endCorrection === "none" && die !== longestDie) return { skipped: "noEndCorrection" };
    if (opt.endCorrection === "orifice" && die === longestDie) return { skipped: orificeAt(rate) === null ? "orificeOutside" : "orificeTooHigh" };
    if (dropped.has(rate)) return { skipped: "oneDie" };
    if (nonRising.has(rate)) return { skipped: "nonRising" };
    return { skipped: "notNeeded" };
  });
  const unused = unusedWarning(points, fates);
  if (unused) warnings.push(unused);
  const stability: StabilityRow[] = allDies.flatMap((d) =>
    d.ladder.repeats.map((r) => {
      const first = points[d.indices[r.first] as number] as PointRow;
      return { die: d.label, dieLength: d.dieLength, shearRateApparent: first.shearRateApparent, flowRate: first.flowRate, firstRow: r.firstRow, firstPressure: r.firstPressure, repeatRow: r.repeatRow, repeatPressure: r.repeatPressure, change: r.change, used: r.used };
    }),
  );
  const group: ReductionGroup = {
    temperature,
    dieDiameter,
    geometry,
    dies,
    points,
    bagley,
    flowCurve,
    stability,
    flagged,
    smoother: rab.smoother,
    rows: tallyRows(fates),
    warnings,
  };
  if (slit) {
    group.slitWidth = slit.width;
    group.slitHeight = slit.height;
  }
  if (entrancePressures) group.entrancePressures = entrancePressures;
  return { group, sources: curve.map((c) => c.source) };
}

