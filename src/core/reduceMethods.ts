/**
 * The optional checks and methods of a reduction, applied to each reduced group (and across
 * groups) by reduce.ts: representative-rate cross-check, transducer uncertainty, viscous
 * heating, Cogswell extensional viscosity, pressure dependence, Mooney slip and the
 * temperature coefficient of viscosity. Each method lives in its own module; this one only
 * feeds them the group's data and gathers their results and warnings.
 */
import { RheoError, Warning, warning } from "./errors";
import type { FlowCurveRow, ReductionGroup } from "./reduce";
import { slitEdgeCorrection } from "./slit";
import { RepresentativeRateOptions, RepresentativeRateRow, representativeRateCheck } from "./representativeRate";
import { Transducer, UncertaintyOptions, UncertaintyRow, transducerWarnings } from "./uncertainty";
import { BudgetPoint, UncertaintyBudgetOptions, UncertaintyBudgetRow, uncertaintyBudget } from "./uncertaintyBudget";
import { apparentPoint } from "./grouping";
import { reduceGroup } from "./reduceGroup";
import { geometricMean } from "./interpolate";
import type { Measurement, ReduceOptions } from "./reduceTypes";
import { HeatingOptions, HeatingProperties, HeatingRow, heatingTable, temperatureCoefficientFromShift } from "./viscousHeating";
import { CogswellOptions, CogswellRow, cogswellTable } from "./cogswell";
import { PressureDependenceOptions, PressureDependenceRow, pressureDependence } from "./pressureDependence";
import { SlipOptions, SlipRow, mooneySlip } from "./slip";
import { fitArrheniusShift } from "./temperature/fitShift";
import type { TemperatureCurve } from "./temperature/curves";

/** Options of the optional methods; all off by default. */
export interface MethodOptions {
  /** Schümmer representative-rate viscosity beside the Rabinowitsch result (round dies) */
  representativeRate: boolean | Partial<RepresentativeRateOptions>;
  /** Cogswell extensional viscosity from the entrance pressure */
  extensional: boolean | Partial<CogswellOptions>;
  /** viscous-heating estimate; b (temperatureCoefficient) is fitted across temperatures when omitted */
  heating: (HeatingProperties & Partial<HeatingOptions>) | null;
  /** curvature of the Bagley lines and the pressure coefficient of viscosity */
  pressureDependence: boolean | Partial<PressureDependenceOptions>;
  /** transducer range and accuracy: low-reading flags and the uncertainty budget (± columns) */
  transducer: (Transducer & Partial<UncertaintyOptions>) | null;
  /** tolerances of the uncertainty budget (used when a transducer is given) */
  uncertainty: Partial<UncertaintyBudgetOptions>;
  /** Mooney slip analysis across die diameters at each temperature */
  slip: boolean | Partial<SlipOptions>;
  /** slit groups: divide the true wall rate by the channel's Newtonian shape factor (slitFlow.ts) */
  slitEdgeCorrection: boolean;
}

/** Defaults of {@link MethodOptions}: every method off. */
export const DEFAULT_METHOD_OPTIONS: Readonly<MethodOptions> = Object.freeze({
  representativeRate: false,
  extensional: false,
  heating: null,
  pressureDependence: false,
  transducer: null,
  uncertainty: {},
  slip: false,
  slitEdgeCorrection: false,
});

/** Where a flow-curve point came from, as the methods need it. */
export interface CurveSource {
  /** the highest die pressure at this rate (longest die), Pa */
  pressure: number;
  /** entrance pressure used or available at this rate, Pa, or null */
  entrancePressure: number | null;
  /** standard uncertainty of τ_w given the standard uncertainty u_P of one reading, Pa */
  stressUncertainty: (pressureUncertainty: number) => number;
  /** the Bagley line's (x, ΔP) points, for the pressure-dependence fit (null without Bagley) */
  bagleyPoints: { lengthOverRadius: number; pressure: number }[] | null;
}

/** The optional results of one group (each present only when its method was asked for). */
export interface GroupMethodResults {
  /** the flow curve after the slit edge correction (slit groups with slitEdgeCorrection only) */
  flowCurve?: FlowCurveRow[];
  /** the Newtonian shape factor F applied to a slit's flow curve */
  slitShapeFactor?: number;
  representativeRate?: RepresentativeRateRow[];
  /** expanded uncertainties (k·u_c) of τ_w, γ̇_w and η per flow-curve point, from the budget */
  uncertainty?: UncertaintyRow[];
  /** the full budget per flow-curve point: each input's contribution, u_c and U */
  uncertaintyBudget?: UncertaintyBudgetRow[];
  heating?: { temperatureCoefficient: number; temperatureCoefficientSource: "given" | "fitted"; rows: HeatingRow[] };
  extensional?: CogswellRow[];
  pressureDependence?: {
    /** @deprecated median β_γ (constant rate); use pressureCoefficientConstantStress */
    pressureCoefficient: number | null;
    /** median constant-stress β, 1/Pa */
    pressureCoefficientConstantStress: number | null;
    rows: PressureDependenceRow[];
  };
}

const on = <T extends object>(v: boolean | T): T | undefined => (v === false ? undefined : v === true ? ({} as T) : v);

/**
 * Applies the asked-for methods to a reduced group; returns their results and warnings.
 * @param radius R (m) of a round die, H/2 for a slit (for the Nahme number)
 * @param temperatureCoefficient b for this group's temperature (1/K): given or fitted across temperatures
 */
export function applyGroupMethods(
  group: ReductionGroup,
  sources: CurveSource[],
  geometry: "round" | "slit",
  radius: number,
  opt: ReduceOptions,
  temperatureCoefficient: { value: number; source: "given" | "fitted" } | null,
): { results: GroupMethodResults; warnings: Warning[] } {
  const results: GroupMethodResults = {};
  const warnings: Warning[] = [];
  let fc = group.flowCurve;
  if (opt.slitEdgeCorrection && geometry === "slit" && group.slitWidth !== undefined && group.slitHeight !== undefined) {
    const edge = slitEdgeCorrection(fc, group.slitWidth, group.slitHeight);
    fc = edge.rows;
    results.flowCurve = fc;
    results.slitShapeFactor = edge.shapeFactor;
    warnings.push(...edge.warnings);
  }
  const rates = fc.map((f) => f.shearRateApparent);
  const stresses = fc.map((f) => f.wallShearStress);
  const rep = on(opt.representativeRate);
  if (rep && geometry === "round") {
    const r = representativeRateCheck(rates, stresses, fc.map((f) => f.shearRateWall), fc.map((f) => f.viscosity), rep, fc.map((f) => f.nPrime));
    results.representativeRate = r.rows;
    warnings.push(...r.warnings);
  }
  if (opt.transducer) {
    const budget = uncertaintyBudget(
      {
        points: group.points.map((p) => ({ dieDiameter: p.dieDiameter, slitWidth: p.slitWidth, slitHeight: p.slitHeight, dieLength: p.dieLength, flowRate: p.flowRate, pressure: p.pressure, pressureStd: p.pressureStd })),
        flowCurve: fc,
        rerun: rerunGroup(group, geometry, opt),
        geometry,
        rabinowitsch: opt.rabinowitsch,
        bagleyStressStandardError: fc.map((f) => {
          const line = group.bagley.find((b) => b.shearRateApparent === f.shearRateApparent);
          return opt.endCorrection === "bagley" && line && line.diesUsed >= 3 ? line.slopeStandardError / 2 : null;
        }),
        temperatureCoefficient: temperatureCoefficient?.value ?? null,
      },
      opt.transducer,
      { ...(opt.transducer.coverageFactor !== undefined ? { coverageFactor: opt.transducer.coverageFactor } : {}), ...opt.uncertainty },
    );
    results.uncertaintyBudget = budget.rows;
    results.uncertainty = budget.rows.map((r) => ({ wallShearStress: r.expanded.wallShearStress, shearRateWall: r.expanded.shearRateWall, viscosity: r.expanded.viscosity }));
    warnings.push(...budget.warnings);
    warnings.push(...transducerWarnings(group.points.map((p) => p.pressure), opt.transducer, opt.transducer));
  }
  if (opt.heating) {
    if (!temperatureCoefficient) {
      throw new RheoError("missing", "heating.temperatureCoefficient", "give b = −d ln η/dT (1/K), or measure at two or more temperatures so it can be fitted");
    }
    const longest = Math.max(...group.dies.filter((d) => !d.orifice).map((d) => d.dieLength));
    const h = heatingTable(
      fc.map((f, i) => ({ shearRateApparent: f.shearRateApparent, pressure: (sources[i] as CurveSource).pressure, nPrime: f.nPrime, shearRateWall: f.shearRateWall, viscosity: f.viscosity })),
      { geometry, radius, dieLength: longest },
      { ...opt.heating, temperatureCoefficient: temperatureCoefficient.value },
      opt.heating,
    );
    results.heating = { temperatureCoefficient: temperatureCoefficient.value, temperatureCoefficientSource: temperatureCoefficient.source, rows: h.rows };
    warnings.push(...h.warnings);
  }
  const ext = on(opt.extensional);
  if (ext) {
    if (geometry === "slit") {
      warnings.push(warning("COGSWELL_ROUND_ONLY", "The Cogswell analysis here is for round dies; it was not applied to the slit."));
    } else {
      const c = cogswellTable(
        fc.map((f, i) => ({ shearRateApparent: f.shearRateApparent, shearRateWall: f.shearRateWall, viscosity: f.viscosity, viscosityApparent: f.viscosityApparent, nPrime: f.nPrime, entrancePressure: (sources[i] as CurveSource).entrancePressure })),
        ext,
      );
      results.extensional = c.rows;
      warnings.push(...c.warnings);
    }
  }
  const pd = on(opt.pressureDependence);
  if (pd) {
    const lines = fc
      .map((f, i) => ({ shearRateApparent: f.shearRateApparent, points: (sources[i] as CurveSource).bagleyPoints, nPrime: f.nPrime }))
      .filter((l): l is { shearRateApparent: number; points: { lengthOverRadius: number; pressure: number }[]; nPrime: number } => l.points !== null);
    const r = pressureDependence(lines, pd);
    results.pressureDependence = { pressureCoefficient: r.pressureCoefficient, pressureCoefficientConstantStress: r.pressureCoefficientConstantStress, rows: r.rows };
    warnings.push(...r.warnings);
  }
  return { results, warnings };
}

/**
 * The group's reduction as a function of (perturbed) input points, for the uncertainty budget:
 * the same pipeline and options, warnings dropped; null when the perturbed data cannot be reduced.
 */
function rerunGroup(group: ReductionGroup, geometry: "round" | "slit", opt: ReduceOptions): (points: BudgetPoint[], stressOnly?: boolean) => FlowCurveRow[] | null {
  // the stresses do not depend on the smoother: the cheapest one serves when only they are read
  const cheap: ReduceOptions = { ...opt, rabinowitsch: { ...opt.rabinowitsch, method: "difference" } };
  return (points, stressOnly = false) => {
    try {
      const rows = points.map((p, i) => {
        const m: Measurement =
          geometry === "slit"
            ? { slitWidth: p.slitWidth, slitHeight: p.slitHeight, dieLength: p.dieLength, flowRate: p.flowRate, pressure: p.pressure }
            : { dieDiameter: p.dieDiameter, dieLength: p.dieLength, flowRate: p.flowRate, pressure: p.pressure };
        return apparentPoint(m, i);
      });
      const slit = geometry === "slit" ? { width: geometricMean(rows.map((r) => r.slitWidth as number)), height: geometricMean(rows.map((r) => r.slitHeight as number)) } : undefined;
      return reduceGroup(rows, group.temperature, stressOnly ? cheap : opt, slit).group.flowCurve;
    } catch (e) {
      if (e instanceof RheoError) return null;
      throw e;
    }
  };
}

/**
 * The corrected viscosity points (γ̇_w in 1/s, η in Pa·s; positive ones only) of every group with
 * a temperature, gathered into one curve per temperature (K), in the order the temperatures first
 * appear; curves without a usable point are left out. The input of the temperature-shift fits.
 */
export function groupCurvesByTemperature(groups: readonly ReductionGroup[]): TemperatureCurve[] {
  const byT = new Map<number, { shearRate: number[]; viscosity: number[] }>();
  for (const g of groups) {
    if (g.temperature === null) continue;
    const c = byT.get(g.temperature) ?? { shearRate: [], viscosity: [] };
    for (const f of g.flowCurve) {
      if (f.shearRateWall !== null && f.viscosity !== null && f.shearRateWall > 0 && f.viscosity > 0) {
        c.shearRate.push(f.shearRateWall);
        c.viscosity.push(f.viscosity);
      }
    }
    byT.set(g.temperature, c);
  }
  return [...byT.entries()].filter(([, c]) => c.shearRate.length > 0).map(([temperature, c]) => ({ temperature, ...c }));
}

/**
 * b = −d ln η/dT at each temperature of the reduction, from an Arrhenius fit of the groups'
 * viscosity curves (core/temperature/fitShift.ts). Needs two or more temperatures.
 * @returns a map from group temperature (K) to b (1/K), or null when it cannot be fitted
 */
export function fittedTemperatureCoefficients(groups: ReductionGroup[]): Map<number, number> | null {
  const curves = groupCurvesByTemperature(groups).filter((c) => c.shearRate.length >= 2);
  if (curves.length < 2) return null;
  const temps = curves.map((c) => c.temperature).sort((a, b) => a - b);
  const reference = temps[temps.length >> 1] as number;
  const fit = fitArrheniusShift(curves, reference, { polynomialDegree: 2 });
  if (!fit.converged || !(fit.activationEnergy > 0)) return null;
  return new Map(temps.map((t) => [t, temperatureCoefficientFromShift({ law: "arrhenius", referenceTemperature: reference, activationEnergy: fit.activationEnergy }, t)]));
}

/** One Mooney row of the top-level result, with its temperature. */
export interface SlipResultRow extends SlipRow {
  /** K, or null */
  temperature: number | null;
}

/**
 * Mooney slip analysis across the round groups of each temperature (≥ 2 diameters).
 * Warning code: SLIP_ONE_DIAMETER (a temperature with a single diameter was skipped).
 * @throws RheoError("missing") when no temperature has two or more diameters.
 */
export function slipAcrossGroups(groups: ReductionGroup[], options: Partial<SlipOptions>): { rows: SlipResultRow[]; warnings: Warning[] } {
  const byT = new Map<number | null, ReductionGroup[]>();
  for (const g of groups) {
    if (g.geometry === "slit") continue;
    byT.set(g.temperature, [...(byT.get(g.temperature) ?? []), g]);
  }
  const rows: SlipResultRow[] = [];
  const warnings: Warning[] = [];
  let analysed = 0;
  for (const [temperature, gs] of byT) {
    const label = temperature === null ? "" : `${Number((temperature - 273.15).toFixed(2))} °C: `;
    if (gs.length < 2) {
      warnings.push(warning("SLIP_ONE_DIAMETER", `${label}only one die diameter, so wall slip could not be analysed (the Mooney method needs two or more).`));
      continue;
    }
    const r = mooneySlip(
      gs.map((g) => ({ dieDiameter: g.dieDiameter, shearRateApparent: g.flowCurve.map((f) => f.shearRateApparent), wallShearStress: g.flowCurve.map((f) => f.wallShearStress) })),
      options,
    );
    analysed++;
    rows.push(...r.rows.map((row) => ({ temperature, ...row })));
    warnings.push(...r.warnings.map((w) => ({ ...w, message: `${label}${w.message}` })));
  }
  if (analysed === 0) {
    throw new RheoError("missing", "dieDiameter", "the slip analysis needs round dies of two or more diameters at one temperature");
  }
  return { rows, warnings };
}
