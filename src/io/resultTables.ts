/**
 * Every result table of a run, described once: an id, a title, the group it belongs to, its
 * columns (a stable key, a plain header, one display unit, how many significant figures), and its
 * rows already in the display units. The command line's text, the results workbook, the HTML
 * report and the task pane all render these descriptions, so a result added here appears on every
 * surface and a column means the same everywhere. A new result = one table builder below.
 *
 * Display units (one spelling each, as the pane and the reports show them): shear rate 1/s, stress
 * kPa, pressure bar, viscosity Pa·s, temperature °C, lengths mm, speeds mm/s, energies kJ/mol.
 * An undefined value is `null` (an empty cell) and the table's notes say why; a number that is not
 * finite never reaches a table.
 */
import type { Warning } from "../core/errors";
import { groupLabel, type ReductionGroup } from "../core/reduce";
import type { ReductionRun } from "../core/run";
import { ROW_SKIP_REASONS, type RowAccount } from "../core/rowAccount";
import { evaluateModel, getModel, type ParameterSpec } from "../core/models";
import type { FitResult } from "../core/fit";
import type { Undetermined } from "../core/fit/determination";
import type { Verdict } from "../core/fit/verdict";
import { CROSS_WLF_LITERATURE } from "../core/temperature/masterFit";
import { logSpaced } from "../core/planner";
import { displayUnit, modelName, parameterSymbol } from "./displayNames";
import { DEFAULT_REDUCE_OPTIONS } from "../core/reduceTypes";
import type { RunSteps } from "../core/steps/runSteps";
import { runsByGroup } from "../core/steps/groupSteps";
import { stepNote } from "./stepRecord";
import { UNCERTAINTY_SOURCES, type UncertaintySource } from "../core/uncertaintyBudget";
import { r2Digits, undeterminedText } from "./fitFormat";

/** One cell: a number in the column's unit, text, a flag, or null for an empty cell. */
export type ResultCell = number | string | boolean | null;

/** One column. */
export interface ResultColumn {
  /** stable id (the JSON key where one exists), e.g. "wallShearStress" */
  key: string;
  /** plain label without unit, e.g. "Wall shear stress" */
  header: string;
  /** display unit, one spelling: "kPa", "1/s", "Pa·s", "°C", "mm", "bar"; "" for none */
  unit: string;
  kind: "number" | "text" | "flag";
  /** significant figures to show (default 4) */
  digits?: number;
}

/** One table of results. */
export interface ResultTable {
  /** "groups", "bagley", "flowCurve", "fitParameters", "warnings", ... */
  id: string;
  title: string;
  /** the group label when the table belongs to one group */
  scope?: string;
  columns: ResultColumn[];
  rows: ResultCell[][];
  /** why some cells are empty, what a column means */
  notes?: string[];
  /** keys of the columns to keep on a narrow screen */
  keyColumns?: string[];
  /** how a chart of this table is drawn (x and y column keys) */
  chart?: { kind: "bagley" | "flowCurve" | "viscosity" | "nPrime" | "master" | "joined"; x: string; y: string[]; logX?: boolean; logY?: boolean; seriesBy?: string };
}

/**
 * Tables that mostly carry the points of a chart (the Bagley plot's points and lines, the n′ curve,
 * the master curve): the workbook and the report show them with their charts; terminal text leaves
 * them out (their numbers are in the other tables or the input).
 */
export const CHART_DATA_TABLES: ReadonlySet<string> = new Set(["bagleyPoints", "rabinowitsch", "master", "joinedCurve"]);

/** A header with its unit the way every surface prints it: "Wall shear stress [kPa]". */
export function headerWithUnit(c: Pick<ResultColumn, "header" | "unit">): string {
  return c.unit === "" ? c.header : `${c.header} [${c.unit}]`;
}

const num = (key: string, header: string, unit: string, digits?: number): ResultColumn => ({ key, header, unit, kind: "number", ...(digits ? { digits } : {}) });
const text = (key: string, header: string): ResultColumn => ({ key, header, unit: "", kind: "text" });
const flag = (key: string, header: string): ResultColumn => ({ key, header, unit: "", kind: "flag" });

/** A finite number scaled by `factor`, else null (an empty cell). */
function v(x: number | null | undefined, factor = 1): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : x * factor;
}
const celsius = (kelvin: number | null): number | null => (kelvin === null ? null : kelvin - 273.15);
const KPA = 1e-3;
const BAR = 1e-5;
const MM = 1e3;

export function groupsTable(run: ReductionRun): ResultTable {
  const rows = run.result.groups.map((g, i): ResultCell[] => {
    const rates = g.flowCurve.map((f) => f.shearRateWall).filter((x): x is number => x !== null);
    const etas = g.flowCurve.map((f) => f.viscosity).filter((x): x is number => x !== null);
    const verdict = run.groupFits[i]?.verdict;
    return [
      groupLabel(g),
      celsius(g.temperature),
      g.geometry === "slit" ? null : v(g.dieDiameter, MM),
      g.dies.length,
      g.flowCurve.length,
      rates.length ? Math.min(...rates) : null,
      rates.length ? Math.max(...rates) : null,
      etas.length ? Math.min(...etas) : null,
      etas.length ? Math.max(...etas) : null,
      verdict?.recommended ? modelName(verdict.recommended) : null,
      verdict ? VERDICT_WORDS[verdict.status] : null,
      run.warnings.filter((w) => w.scope === groupLabel(g)).length,
      g.smoother.curve,
    ];
  });
  return {
    id: "groups",
    title: "Groups reduced",
    columns: [
      text("group", "Group"),
      num("temperature", "Temperature", "°C"),
      num("dieDiameter", "Die diameter", "mm"),
      num("dies", "Dies", ""),
      num("points", "Points", ""),
      num("shearRateWallMin", "True wall rate, lowest", "1/s"),
      num("shearRateWallMax", "True wall rate, highest", "1/s"),
      num("viscosityMin", "Viscosity, lowest", "Pa·s"),
      num("viscosityMax", "Viscosity, highest", "Pa·s"),
      text("recommendedModel", "Recommended model"),
      text("verdict", "Verdict"),
      num("warnings", "Warnings", ""),
      text("smoother", "Rabinowitsch smoother"),
    ],
    rows,
    notes: [
      ...(run.result.groups.some((g) => g.geometry === "slit") ? ["Slit groups have no die diameter; their label gives width × height."] : []),
      "Rabinowitsch smoother: the curve that gave n′ — transition (n′ → 1 at low rates, the Carreau–Yasuda shape), transition-free (free low-rate slope), or the polynomial or method used.",
    ],
    keyColumns: ["group", "points", "viscosityMin", "viscosityMax", "recommendedModel"],
  };
}

/** The verdict's status in words. */
const VERDICT_WORDS: Readonly<Record<Verdict["status"], string>> = Object.freeze({
  "well-determined": "well determined",
  "not-well-determined": "no model well determined",
  none: "no model fitted",
});

/** Columns of a parameter table (one fit). */
const PARAMETER_COLUMNS: readonly ResultColumn[] = Object.freeze([
  text("parameter", "Parameter"),
  text("unit", "Unit (SI)"),
  num("value", "Value", ""),
  num("standardError", "Standard error", "", 3),
  num("ci95Low", "95 % interval, low", ""),
  num("ci95High", "95 % interval, high", ""),
  flag("fixed", "Held fixed"),
  flag("determined", "Determined by the data"),
  text("note", "Note"),
]);

/**
 * One parameter row: a value outside the measured rates is left empty (it is an extrapolation) and
 * the note gives the bound the data support; a held parameter has no uncertainty.
 */
function parameterRow(
  spec: Pick<ParameterSpec, "name" | "unit">,
  fit: { parameters: Record<string, number>; standardErrors: Record<string, number>; confidenceIntervals: Record<string, [number, number]>; determined: Record<string, boolean>; undetermined: Record<string, Undetermined>; fixed: string[] },
  value = fit.parameters[spec.name],
  held = fit.fixed.includes(spec.name),
): ResultCell[] {
  const u: Undetermined | undefined = fit.undetermined[spec.name];
  const outside = u?.outsideData === true;
  const ci = fit.confidenceIntervals[spec.name];
  const se = fit.standardErrors[spec.name];
  const notes: string[] = [];
  if (!held && u) notes.push(undeterminedText(u, displayUnit(spec.unit) || "1"));
  if (!held && !outside && se !== undefined && !Number.isFinite(se)) notes.push("no standard error: the data cannot separate it (singular covariance)");
  return [
    parameterSymbol(spec.name),
    displayUnit(spec.unit),
    outside ? null : v(value),
    held || outside ? null : v(se),
    ci && !outside ? v(ci[0]) : null,
    ci && !outside ? v(ci[1]) : null,
    held,
    fit.determined[spec.name] === true,
    notes.join("; "),
  ];
}

/** The recommended model of each group (the one verdict), parameter by parameter; the status and reason in the notes. */
function verdictTable(label: string, verdict: Verdict, id = "verdict", title = "Recommended model"): ResultTable {
  const fit: FitResult | null = verdict.fit;
  const stats = fit ? `R² ${Number.isFinite(fit.r2) ? fit.r2.toFixed(r2Digits([fit.r2])) : "undefined"}, RMS error of ln η ${Number(fit.rmse.toPrecision(3))}, ${fit.pointCount} points, fitted rates ${Number(fit.shearRateRange[0].toPrecision(3))}–${Number(fit.shearRateRange[1].toPrecision(3))} 1/s (the curve is an extrapolation outside them).` : "";
  const status = verdict.recommended ? `${modelName(verdict.recommended)}: ${VERDICT_WORDS[verdict.status]}.` : "No model fitted.";
  return {
    id,
    title,
    scope: label,
    columns: [text("model", "Model"), ...PARAMETER_COLUMNS],
    rows: fit ? getModel(fit.model).parameters.map((p) => [modelName(fit.model), ...parameterRow(p, fit)]) : [],
    notes: [status, verdict.reason, ...(stats ? [stats] : []), "Empty value: not determined by the data (an extrapolation); the note gives the bound the data support."],
    keyColumns: ["model", "parameter", "value", "determined"],
  };
}

export function bagleyTable(g: ReductionGroup): ResultTable | null {
  if (g.bagley.length === 0) return null;
  return {
    id: "bagley",
    title: "Bagley end correction",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("wallShearStress", "Wall shear stress", "kPa"),
      num("entrancePressure", "Entrance pressure", "bar"),
      num("endCorrection", "End correction e", "", 3),
      num("r2", "R²", "", 6),
      num("diesUsed", "Dies", ""),
    ],
    rows: g.bagley.map((b) => [b.shearRateApparent, v(b.wallShearStress, KPA), v(b.entrancePressure, BAR), v(b.endCorrection), v(b.r2), b.diesUsed]),
    keyColumns: ["shearRateApparent", "wallShearStress", "endCorrection"],
  };
}

/** The Bagley plot's data: per rate the (L/R, ΔP) points and the fitted line drawn back to ΔP = 0 at L/R = −e. */
function bagleyPointsTable(g: ReductionGroup): ResultTable | null {
  if (g.bagley.length === 0) return null;
  const rows: ResultCell[][] = [];
  for (const b of g.bagley) {
    rows.push([b.shearRateApparent, "line at zero pressure", v(-b.endCorrection), null, 0]);
    for (const p of [...b.points].sort((x, y) => x.lengthOverRadius - y.lengthOverRadius)) {
      rows.push([b.shearRateApparent, p.interpolated ? `${p.die} (interpolated)` : p.die, v(p.lengthOverRadius), v(p.pressure, BAR), v(b.slope * p.lengthOverRadius + b.entrancePressure, BAR)]);
    }
  }
  return {
    id: "bagleyPoints",
    title: "Bagley plot data",
    scope: groupLabel(g),
    columns: [num("shearRateApparent", "Apparent shear rate", "1/s"), text("die", "Die"), num("lengthOverRadius", g.geometry === "slit" ? "L/H" : "L/R", ""), num("pressure", "Pressure drop", "bar"), num("pressureLine", "Bagley line", "bar")],
    rows,
    notes: ["One line per apparent shear rate: the measured pressure drops and the fitted Bagley line, drawn back to zero pressure at L/R = −e."],
    chart: { kind: "bagley", x: "lengthOverRadius", y: ["pressure", "pressureLine"], seriesBy: "shearRateApparent" },
  };
}

export function flowCurveTable(g: ReductionGroup): ResultTable {
  const columns: ResultColumn[] = [
    num("shearRateApparent", "Apparent shear rate", "1/s"),
    num("wallShearStress", "Wall shear stress", "kPa"),
    num("nPrime", "n′", "", 3),
    num("shearRateWall", "True wall shear rate", "1/s"),
    num("viscosity", "Viscosity", "Pa·s"),
    num("viscosityApparent", "Apparent viscosity", "Pa·s"),
  ];
  const rep = g.representativeRate;
  const unc = g.uncertainty;
  if (rep) {
    columns.push(
      num("shearRateRepresentative", "Representative rate", "1/s"),
      num("viscosityRepresentative", "Representative viscosity", "Pa·s"),
      num("representativeDeviation", "Representative vs Rabinowitsch", "%", 3),
      num("representativeExpectedDeviation", "Method's own bias at n′", "%", 3),
      num("representativeDeviationCorrected", "Difference beyond the bias", "%", 3),
    );
  }
  if (unc) columns.push(num("wallShearStressUncertainty", "± wall shear stress (k = 2)", "kPa", 2), num("shearRateWallUncertainty", "± true wall rate (k = 2)", "1/s", 2), num("viscosityUncertainty", "± viscosity (k = 2)", "Pa·s", 2));
  const rows = g.flowCurve.map((f, i): ResultCell[] => {
    const row: ResultCell[] = [f.shearRateApparent, v(f.wallShearStress, KPA), v(f.nPrime), v(f.shearRateWall), v(f.viscosity), v(f.viscosityApparent)];
    const r = rep?.[i];
    if (rep) row.push(v(r?.shearRateRepresentative), v(r?.viscosityRepresentative), v(r?.deviation, 100), v(r?.expectedDeviation, 100), v(r?.deviationCorrected, 100));
    const u = unc?.[i];
    if (unc) row.push(v(u?.wallShearStress, KPA), v(u?.shearRateWall), v(u?.viscosity));
    return row;
  });
  const notes: string[] = [];
  if (g.flowCurve.some((f) => f.shearRateWall === null)) notes.push("Empty true wall rate and viscosity: the smoothed slope n′ is not positive there, so no Rabinowitsch correction exists.");
  if (g.slitShapeFactor !== undefined) notes.push(`Slit edge correction: true wall rates divided, viscosities multiplied, by the Newtonian shape factor ${Number(g.slitShapeFactor.toPrecision(4))}.`);
  if (rep) notes.push("Representative rate: for a power law the method itself reads ((3n+1)/(4n))^n·(4/π)^(n−1) of the true viscosity; the last column is what is left once that is divided out.");
  return {
    id: "flowCurve",
    title: "Flow curve (Rabinowitsch-corrected)",
    scope: groupLabel(g),
    columns,
    rows,
    notes: notes.length ? notes : undefined,
    keyColumns: ["shearRateWall", "wallShearStress", "viscosity"],
    chart: { kind: "flowCurve", x: "shearRateWall", y: ["wallShearStress"], logX: true, logY: true },
  };
}

/** The Rabinowitsch step: n′ and the factor between true and apparent wall rate, per point. */
function rabinowitschTable(g: ReductionGroup): ResultTable {
  const factor = (n: number) => (g.geometry === "slit" ? (2 * n + 1) / (3 * n) : (3 * n + 1) / (4 * n));
  return {
    id: "rabinowitsch",
    title: "Rabinowitsch correction",
    scope: groupLabel(g),
    columns: [num("shearRateApparent", "Apparent shear rate", "1/s"), num("nPrime", "n′", "", 3), num("rateFactor", "True over apparent rate", ""), num("shearRateWall", "True wall shear rate", "1/s")],
    rows: g.flowCurve.map((f) => [f.shearRateApparent, v(f.nPrime), f.nPrime > 0 ? v(factor(f.nPrime)) : null, v(f.shearRateWall)]),
    notes: [g.geometry === "slit" ? "True over apparent rate (2n′ + 1)/(3n′) (slit)." : "True over apparent rate (3n′ + 1)/(4n′)."],
    chart: { kind: "nPrime", x: "shearRateApparent", y: ["nPrime"], logX: true },
  };
}

/** Measured viscosity beside the lowest-AIC model of the group's ranking, at the measured rates. */
function viscosityModelTable(run: ReductionRun, g: ReductionGroup, i: number): ResultTable | null {
  if (!run.comparisons) return null;
  // the one verdict's model (src/core/fit/verdict.ts), drawn over the measured rates only
  const verdict = run.groupFits[i]?.verdict;
  const best = verdict?.fit ? { model: verdict.fit.model, result: verdict.fit } : undefined;
  const points = g.flowCurve.filter((f) => f.shearRateWall !== null && f.viscosity !== null) as { shearRateWall: number; viscosity: number }[];
  if (points.length === 0) return null;
  const model = best ? evaluateModel(best.model, best.result.parameters, points.map((p) => p.shearRateWall)) : null;
  return {
    id: "viscosityModel",
    title: "Viscosity and model",
    scope: groupLabel(g),
    columns: [num("shearRateWall", "True wall shear rate", "1/s"), num("viscosity", "Viscosity", "Pa·s"), text("model", "Recommended model"), num("viscosityModel", "Model viscosity", "Pa·s"), num("modelDeviation", "Model vs measured", "%", 3)],
    rows: points.map((p, k) => {
      const m = model?.[k] ?? null;
      return [p.shearRateWall, p.viscosity, best ? modelName(best.model) : null, v(m), m === null ? null : v((m / p.viscosity - 1) * 100)];
    }),
    notes: [best ? `Model: ${modelName(best.model)}, the recommended model of this group (${verdict?.status === "well-determined" ? "well determined" : "no model is well determined"}; parameters in the model-fit tables).` : "No model was ranked for this group."],
    keyColumns: ["shearRateWall", "viscosity", "viscosityModel"],
    chart: { kind: "viscosity", x: "shearRateWall", y: ["viscosity", "viscosityModel"], logX: true, logY: true },
  };
}

const SOURCE_HEADERS: Record<UncertaintySource, string> = {
  zero: "Transducer zero",
  gain: "Transducer gain",
  scatter: "Reading scatter",
  dieBore: "Die bore",
  dieLength: "Die length",
  pistonSpeed: "Piston speed",
  temperature: "Melt temperature",
};

/** The uncertainty budget of the viscosity: each input's share, u_c and U (k = 2), relative, per point. */
function uncertaintyBudgetTable(g: ReductionGroup): ResultTable | null {
  const budget = g.uncertaintyBudget;
  if (!budget) return null;
  const sources = UNCERTAINTY_SOURCES.filter((src) => budget.some((r) => r.contributions.some((c) => c.source === src)));
  const k = budget[0]?.coverageFactor ?? 2;
  const rel = (x: number | null | undefined, of: number | null) => (x === null || x === undefined || of === null || !(of > 0) ? null : v((x / of) * 100));
  return {
    id: "uncertaintyBudget",
    title: "Uncertainty budget",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("viscosity", "Viscosity", "Pa·s"),
      ...sources.map((src) => num(src, `u(η): ${SOURCE_HEADERS[src].toLowerCase()}`, "%", 2)),
      num("combined", "u_c(η)", "%", 2),
      num("expanded", `U(η), k = ${k}`, "%", 2),
      num("expandedWallShearStress", `U(τ_w), k = ${k}`, "%", 2),
      num("nPrimeUncertainty", "u(n′)", "", 2),
    ],
    rows: budget.map((r, i) => {
      const f = g.flowCurve[i];
      const eta = f?.viscosity ?? null;
      return [
        r.shearRateApparent,
        v(eta),
        ...sources.map((src) => rel(r.contributions.find((c) => c.source === src)?.viscosity, eta)),
        rel(r.combined.viscosity, eta),
        rel(r.expanded.viscosity, eta),
        rel(r.expanded.wallShearStress, f?.wallShearStress ?? null),
        v(r.combined.nPrime),
      ];
    }),
    notes: [
      "Standard uncertainties u of the viscosity at each point's apparent rate, in % of it, one column per input; u_c is their root sum of squares (inputs independent), U = k·u_c (about 95 %).",
      "Transducer zero and gain are one error shared by every reading: the zero cancels in the Bagley slope. Each die's bore and length are independent. Every input passes through the smoother's n′.",
    ],
    keyColumns: ["shearRateApparent", "combined", "expanded"],
  };
}

function entrancePressureTable(g: ReductionGroup): ResultTable | null {
  if (!g.entrancePressures) return null;
  return {
    id: "entrancePressures",
    title: "Entrance pressure: Bagley and orifice die",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("entrancePressure", "Bagley", "bar"),
      num("entrancePressureOrifice", "Orifice die, land removed", "bar"),
      num("orificePressure", "Orifice die reading", "bar"),
      num("difference", "Difference", "%", 3),
    ],
    rows: g.entrancePressures.map((e) => [e.shearRateApparent, v(e.entrancePressure, BAR), v(e.entrancePressureOrifice, BAR), v(e.orificePressure, BAR), v(e.difference, 100)]),
    notes: [
      "Empty: that estimate does not exist at this rate (no Bagley line, or outside the orifice die's range).",
      "The orifice die's reading includes its own land; 2τ_w·L/R of the land is removed before the comparison.",
    ],
  };
}

function extensionalTable(g: ReductionGroup): ResultTable | null {
  if (!g.extensional) return null;
  return {
    id: "extensional",
    title: "Extensional viscosity (Cogswell)",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("shearRateWall", "True wall shear rate", "1/s"),
      num("shearRate", "Shear rate used", "1/s"),
      num("entrancePressure", "Entrance pressure", "bar"),
      num("tensileStress", "Tensile stress", "kPa"),
      num("extensionRate", "Extension rate", "1/s"),
      num("extensionalViscosity", "Extensional viscosity", "Pa·s"),
      num("troutonRatio", "Trouton ratio", "", 3),
    ],
    rows: g.extensional.map((e) => [v(e.shearRateApparent), v(e.shearRateWall), v(e.shearRate), v(e.entrancePressure, BAR), v(e.tensileStress, KPA), v(e.extensionRate), v(e.extensionalViscosity), v(e.troutonRatio)]),
    notes: [
      g.extensional[0]?.shearRateBasis === "wall"
        ? "Shear rate used: the true (Rabinowitsch-corrected) wall rate with the true viscosity."
        : "Shear rate used: the apparent wall rate 4Q/(πR³) with the apparent viscosity, as in Cogswell's derivation. The Trouton ratio does not depend on the choice.",
    ],
    keyColumns: ["extensionRate", "extensionalViscosity", "troutonRatio"],
  };
}

function heatingTable(g: ReductionGroup): ResultTable | null {
  if (!g.heating) return null;
  const h = g.heating;
  return {
    id: "heating",
    title: "Viscous heating",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("pressure", "Pressure", "bar"),
      num("adiabaticTemperatureRise", "Adiabatic rise", "K", 3),
      num("meanVelocity", "Mean velocity", "mm/s", 3),
      num("nahmeGriffithNumber", "Nahme–Griffith number", "", 3),
      num("brinkmanNumber", "Brinkman number", "", 3),
      num("graetzNumber", "Graetz number", "", 3),
    ],
    rows: h.rows.map((r) => [r.shearRateApparent, v(r.pressure, BAR), v(r.adiabaticTemperatureRise), v(r.meanVelocity, MM), v(r.nahmeGriffithNumber), v(r.brinkmanNumber), v(r.graetzNumber)]),
    notes: [
      `b = ${Number(h.temperatureCoefficient.toPrecision(3))} 1/K (${h.temperatureCoefficientSource}).`,
      "b is the shift-law (constant-stress) coefficient; the Nahme–Griffith number uses n′·b, the coefficient at the held rate.",
      "Na = n′·b·η·V²/k: developed flow reads the viscosity low by about Na/2. Graetz number ≤ 5: heat conducted to the wall; above 50: kept in the melt (the adiabatic rise bounds it).",
    ],
  };
}

function pressureDependenceTable(g: ReductionGroup): ResultTable | null {
  if (!g.pressureDependence) return null;
  const pd = g.pressureDependence;
  return {
    id: "pressureDependence",
    title: "Pressure dependence (curved Bagley lines)",
    scope: groupLabel(g),
    columns: [
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("pressureCoefficientConstantStress", "β (constant stress)", "1/GPa", 3),
      num("pressureCoefficientConstantStressStandardError", "± β (1 s.e.)", "1/GPa", 2),
      num("pressureCoefficientConstantRate", "Curvature coefficient n′β", "1/GPa", 3),
      num("nPrime", "n′", "", 3),
      flag("significant", "Curvature beyond scatter"),
      num("wallShearStressAtZeroPressure", "Wall shear stress at p = 0", "kPa"),
      num("entrancePressure", "Entrance pressure", "bar"),
      num("logViscosityRise", "ln viscosity rise", "", 3),
      num("diesUsed", "Dies", ""),
    ],
    rows: pd.rows.map((r) => [
      r.shearRateApparent,
      v(r.pressureCoefficientConstantStress, 1e9),
      v(r.pressureCoefficientConstantStressStandardError, 1e9),
      v(r.pressureCoefficientConstantRate, 1e9),
      v(r.nPrime),
      r.significant,
      v(r.wallShearStressAtZeroPressure, KPA),
      v(r.entrancePressure, BAR),
      v(r.logViscosityRise),
      r.diesUsed,
    ]),
    notes: [
      pd.pressureCoefficientConstantStress === null ? "No median β: no rate had a converged curved fit with a positive n′." : `Median β at constant stress = ${Number((pd.pressureCoefficientConstantStress * 1e9).toPrecision(3))} 1/GPa (compare this one with literature values).`,
      "The curvature of a Bagley line at a held flow rate measures n′·β; β = (n′β)/n′. Empty ± and curvature test: three dies fit the three parameters exactly.",
    ],
  };
}

function slipTable(run: ReductionRun): ResultTable | null {
  const slip = run.result.slip;
  if (!slip) return null;
  return {
    id: "slip",
    title: "Wall slip (Mooney)",
    columns: [
      num("temperature", "Temperature", "°C"),
      num("wallShearStress", "Wall shear stress", "kPa"),
      num("slipVelocity", "Slip velocity", "mm/s", 3),
      flag("slipApplied", "Slip corrected"),
      num("slipVelocityStandardError", "± slip velocity (1 s.e.)", "mm/s", 2),
      num("shearRateApparentCorrected", "Slip-corrected apparent rate", "1/s"),
      num("shearRateWall", "True wall shear rate", "1/s"),
      num("viscosity", "Viscosity", "Pa·s"),
      num("r2", "R²", "", 4),
    ],
    notes: slip.some((s) => !s.slipApplied) ? ["Not slip corrected: the fitted slip velocity is negative (no slip detectable); the corrected rate is the bores' mean."] : undefined,
    rows: slip.map((s) => [celsius(s.temperature), v(s.wallShearStress, KPA), v(s.slipVelocity, MM), s.slipApplied, v(s.slipVelocityStandardError, MM), v(s.shearRateApparentCorrected), v(s.shearRateWall), v(s.viscosity), v(s.r2)]),
    keyColumns: ["wallShearStress", "slipVelocity", "viscosity"],
  };
}

function meltFlowTable(run: ReductionRun): ResultTable | null {
  const m = run.result.meltFlowRate;
  if (!m) return null;
  return {
    id: "meltFlowRate",
    title: "Melt-flow-rate point (apparent, standard die 2.095 × 8.000 mm)",
    columns: [num("flowRate", "Flow rate", "mm³/s"), num("pressure", "Pressure", "bar"), num("shearRateApparent", "Apparent shear rate", "1/s"), num("wallShearStressApparent", "Apparent wall stress", "kPa"), num("viscosityApparent", "Apparent viscosity", "Pa·s")],
    rows: [[v(m.flowRate, 1e9), v(m.pressure, BAR), v(m.shearRateApparent), v(m.wallShearStressApparent, KPA), v(m.viscosityApparent)]],
  };
}

function stabilityTable(g: ReductionGroup): ResultTable | null {
  if (g.stability.length === 0) return null;
  return {
    id: "stability",
    title: "Repeated readings (stability check)",
    scope: groupLabel(g),
    columns: [
      text("die", "Die"),
      num("shearRateApparent", "Apparent shear rate", "1/s"),
      num("firstRow", "First row", ""),
      num("firstPressure", "First reading", "bar"),
      num("repeatRow", "Repeat row", ""),
      num("repeatPressure", "Repeat", "bar"),
      num("change", "Change", "%", 3),
      text("used", "Used"),
    ],
    rows: g.stability.map((r) => [r.die, r.shearRateApparent, r.firstRow, v(r.firstPressure, BAR), r.repeatRow, v(r.repeatPressure, BAR), v(r.change, 100), r.used === "mean" ? "mean of both" : "first reading only"]),
    notes: ["A repeat within the stability limit is averaged with the first reading; beyond it the melt has changed and the first reading alone is used (warning REPEAT_DRIFT)."],
    keyColumns: ["die", "shearRateApparent", "change", "used"],
  };
}

function flaggedTable(g: ReductionGroup): ResultTable | null {
  if (g.flagged.length === 0) return null;
  return {
    id: "flagged",
    title: "Set aside above a flow instability",
    scope: groupLabel(g),
    columns: [text("source", "Die or curve"), num("shearRateApparent", "Apparent shear rate", "1/s"), num("pressure", "Pressure", "bar"), num("wallShearStress", "Wall shear stress", "kPa"), text("reason", "Why")],
    rows: g.flagged.map((f) => [f.source, f.shearRateApparent, v(f.pressure, BAR), v(f.wallShearStress, KPA), f.reason]),
    notes: ["Die readings show their apparent wall stress; flow-curve points their end-corrected stress. None of them entered the end correction or the Rabinowitsch smoothing (warning FLOW_INSTABILITY)."],
  };
}

function rowsTable(run: ReductionRun): ResultTable {
  const left = (a: RowAccount) =>
    Object.entries(a.rowsSkipped)
      .filter(([reason, n]) => reason !== "repeat" && n > 0)
      .map(([reason, n]) => `${n} ${(ROW_SKIP_REASONS as Record<string, string>)[reason] ?? reason}`)
      .join(", ") || null;
  const row = (label: string, a: RowAccount): ResultCell[] => [label, a.rowsRead, a.rowsUsed, a.rowsSkipped.repeat ?? 0, left(a)];
  const rows: ResultCell[][] = run.result.groups.map((g) => row(groupLabel(g), g.rows));
  if (run.result.groups.length > 1) rows.push(row("all groups", run.result.rows));
  return {
    id: "rows",
    title: "Rows used and left out",
    columns: [text("group", "Group"), num("rowsRead", "Rows", ""), num("rowsUsed", "Used", ""), num("merged", "Merged repeats", ""), text("left", "Left out")],
    rows,
    notes: ["Rows = used + merged + left out. Each reason is explained by a warning that lists the rows. Rows the file reader skipped (blank, comment) are in the input line."],
  };
}

function fitParameterTable(run: ReductionRun): ResultTable | null {
  const rows: ResultCell[][] = [];
  run.result.groups.forEach((g, i) => {
    const fits = [
      ...(run.modelFits?.[i] ? [{ model: run.modelFits[i].model, rank: null as number | null, result: run.modelFits[i] }] : []),
      ...(run.comparisons?.[i]?.ranked ?? []).map((r, k) => ({ model: r.model, rank: k + 1 as number | null, result: r.result })),
    ];
    for (const f of fits) {
      for (const p of getModel(f.model).parameters) rows.push([groupLabel(g), modelName(f.model), f.rank, ...parameterRow(p, f.result)]);
    }
  });
  if (rows.length === 0) return null;
  return {
    id: "fitParameters",
    title: "Model fits: parameters (SI units)",
    columns: [text("group", "Group"), text("model", "Model"), num("rank", "Rank by AIC", ""), ...PARAMETER_COLUMNS],
    rows,
    notes: [
      "Empty value: not determined by the data (outside the measured rates; the note gives the bound they support).",
      "Empty standard error or interval: the parameter was held, or the data cannot separate it (singular covariance).",
    ],
    keyColumns: ["model", "parameter", "value", "standardError"],
  };
}

function fitRankingTable(run: ReductionRun): ResultTable | null {
  if (!run.comparisons) return null;
  const rows: ResultCell[][] = [];
  run.result.groups.forEach((g, i) => {
    const c = run.comparisons?.[i];
    c?.ranked.forEach((r, k) => rows.push([groupLabel(g), k + 1, modelName(r.model), v(r.aic), v(r.deltaAic), v(r.akaikeWeight), v(r.result.r2), v(r.result.rmse), r.result.converged, null, r.result.wellDetermined, c.verdict.recommended === r.model]));
    c?.failed.forEach((f) => rows.push([groupLabel(g), null, modelName(f.model), null, null, null, null, null, false, f.reason, false, false]));
  });
  // R² with enough digits that the models of the table differ (two significant digits of 1 − R²)
  const r2s = (run.comparisons ?? []).flatMap((c) => c.ranked.map((r) => r.result.r2));
  return {
    id: "fitRanking",
    title: "Model fits: ranking by AIC",
    columns: [
      text("group", "Group"),
      num("rank", "Rank", ""),
      text("model", "Model"),
      num("aic", "AIC", "", 5),
      num("deltaAic", "ΔAIC", "", 3),
      num("akaikeWeight", "Akaike weight", "", 3),
      num("r2", "R²", "", r2Digits(r2s)),
      num("rmse", "RMS error of ln η", "", 3),
      flag("converged", "Converged"),
      text("reason", "Why not fitted"),
      flag("wellDetermined", "Well determined"),
      flag("recommended", "Recommended"),
    ],
    rows,
    notes: ["Rank by AIC, not R²; the recommended model is the adequate (ΔAIC ≤ 10), well-determined model of lowest AIC, else the simplest adequate one (docs/methods.md)."],
    keyColumns: ["group", "rank", "model", "deltaAic", "recommended"],
  };
}

function shiftTable(run: ReductionRun): ResultTable | null {
  const s = run.shift;
  if (!s) return null;
  const f = s.fit;
  const notes =
    f.law === "arrhenius"
      ? [`Arrhenius: Ea = ${Number((f.activationEnergy / 1e3).toPrecision(4))} ± ${Number((f.activationEnergyStandardError / 1e3).toPrecision(2))} kJ/mol (1 s.e.).`]
      : [
          `WLF: C1 = ${Number(f.C1.toPrecision(4))} ± ${Number(f.C1StandardError.toPrecision(2))}, C2 = ${Number(f.C2.toPrecision(4))}${f.C2Source === "fitted" ? ` ± ${Number(f.C2StandardError.toPrecision(2))}` : ""} K (1 s.e.)${
            f.C2Source === "universal" ? "; C2 held at the universal 51.6 K converted to the reference temperature" : f.C2Source === "held" ? "; C2 held" : ""
          }.`,
        ];
  if (f.verticalShift) notes.push(`Vertical shift bT = ρ(T)T/(ρref·Tref) with a melt expansion coefficient of ${f.verticalShift.thermalExpansion} 1/K.`);
  notes.push(`Reference temperature ${Number((f.referenceTemperature - 273.15).toPrecision(5))} °C (${s.referenceChoice === "given" ? "given" : "the middle measured temperature"}); die diameter ${Number((s.dieDiameter * MM).toPrecision(4))} mm.`);
  return {
    id: "shift",
    title: `Temperature shift (${f.law === "arrhenius" ? "Arrhenius" : "WLF"})`,
    columns: f.verticalShift ? [num("temperature", "Temperature", "°C"), num("aT", "Shift factor aT", "", 4), num("bT", "Vertical factor bT", "", 4)] : [num("temperature", "Temperature", "°C"), num("aT", "Shift factor aT", "", 4)],
    rows: f.factors.map((x) => (f.verticalShift ? [celsius(x.temperature), v(x.aT), v(x.bT)] : [celsius(x.temperature), v(x.aT)])),
    notes,
  };
}

/** The shift law's constants as numbers with their standard errors (the notes of the shift table say them in words). */
function shiftConstantsTable(run: ReductionRun): ResultTable | null {
  const s = run.shift;
  if (!s) return null;
  const f = s.fit;
  const rows: ResultCell[][] =
    f.law === "arrhenius"
      ? [["Activation energy Ea", v(f.activationEnergy, 1e-3), v(f.activationEnergyStandardError, 1e-3), "kJ/mol"]]
      : [["C1", v(f.C1), v(f.C1StandardError), ""], ["C2", v(f.C2), v(f.C2StandardError), "K"]];
  rows.push(["Reference temperature", celsius(f.referenceTemperature), null, "°C"], ["Die diameter of the shifted groups", v(s.dieDiameter, MM), null, "mm"], ["RMS error of the joint fit (ln η)", v(f.rmse), null, ""]);
  return {
    id: "shiftConstants",
    title: "Temperature shift: constants",
    columns: [text("constant", "Constant"), num("value", "Value", ""), num("standardError", "Standard error", "", 3), text("unit", "Unit")],
    rows,
    notes: f.law === "wlf" ? ["An empty standard error: that constant was held."] : undefined,
  };
}

/** Every point reduced to the reference temperature: a_T·γ̇ and η/a_T, one series per measured temperature. */
function masterTable(run: ReductionRun): ResultTable | null {
  const s = run.shift;
  if (!s) return null;
  const m = s.master;
  return {
    id: "master",
    title: `Master curve at ${Number((m.referenceTemperature - 273.15).toPrecision(5))} °C`,
    columns: [num("temperature", "Measured at", "°C"), num("aT", "aT", "", 4), num("reducedShearRate", "aT × shear rate", "1/s"), num("reducedViscosity", "Viscosity / aT", "Pa·s")],
    // by measured temperature, then rate: each temperature's points together
    rows: m.shearRate
      .map((rate, k) => ({ k, rate, t: m.temperature[k] as number }))
      .sort((a, b) => a.t - b.t || a.rate - b.rate)
      .map(({ k, rate, t }) => [celsius(t), v(m.aT[k]), v(rate), v(m.viscosity[k])]),
    chart: { kind: "master", x: "reducedShearRate", y: ["reducedViscosity"], logX: true, logY: true, seriesBy: "temperature" },
  };
}

/** The fit across temperatures: the model's parameters at T_ref and the law's constants, then a_T. */
export function masterFitTables(run: Pick<ReductionRun, "master">): ResultTable[] {
  const m = run.master;
  if (!m) return [];
  const specs = m.model === "cross-wlf" ? CROSS_WLF_LITERATURE : getModel(m.model).parameters;
  const lawSpecs: [ParameterSpec["name"], string, number | undefined][] = m.law === "arrhenius" ? [["activationEnergy", "J/mol", m.activationEnergy]] : [["c1", "1", m.c1], ["c2", "K", m.c2]];
  const rows = [
    ...specs.map((p) => parameterRow(p, m)),
    ...lawSpecs.map(([name, unit, value]) => parameterRow({ name, unit }, m, value, m.fixed.includes(name) || (m.model === "cross-wlf" && name === "c2"))),
  ];
  const tref = `${m.model === "cross-wlf" ? "D2" : "T_ref"} = ${Number((m.referenceTemperature - 273.15).toPrecision(5))} °C`;
  const temps = m.temperatures.map((t) => Number((t - 273.15).toPrecision(5))).join(", ");
  return [
    {
      id: "masterFit",
      title: "Fit across temperatures",
      columns: [...PARAMETER_COLUMNS],
      rows,
      notes: [
        `${modelName(m.model)}${m.model === "cross-wlf" ? " (its own WLF law)" : ` × ${m.law === "arrhenius" ? "Arrhenius" : "WLF"}`}.`,
        `${tref}; ${temps} °C; die diameter ${Number((m.dieDiameter * MM).toPrecision(4))} mm; ${m.pointCount} points; reduced rates ${Number(m.reducedShearRateRange[0].toPrecision(3))}–${Number(m.reducedShearRateRange[1].toPrecision(3))} 1/s.`,
        `${m.converged ? "Converged" : `NOT converged (${m.stopReason})`}; ${m.wellDetermined ? "every parameter determined by the data" : "not every parameter is determined by the data"}; R² ${Number.isFinite(m.r2) ? m.r2.toFixed(r2Digits([m.r2])) : "undefined"}.`,
      ],
      keyColumns: ["parameter", "value", "determined"],
    },
    {
      id: "masterFitFactors",
      title: "Fit across temperatures, aT",
      columns: [num("temperature", "Temperature", "°C"), num("aT", "Shift factor aT", "", 4)],
      rows: m.factors.map((f) => [celsius(f.temperature), v(f.aT)]),
    },
  ];
}

/** The rotational curve joined to the capillary one: the verdict on the joined curve, the overlap in the notes. */
export function joinedTable(run: Pick<ReductionRun, "joined">): ResultTable | null {
  const j = run.joined;
  if (!j) return null;
  const t = verdictTable(`rotational + capillary${j.temperature === null ? "" : `, ${Number((j.temperature - 273.15).toPrecision(5))} °C`}`, j.fits.verdict, "rotationalJoin", "Rotational and capillary joined");
  const o = j.join.overlap;
  const overlap = o
    ? `Overlap ${Number(o.shearRateMin.toPrecision(3))}–${Number(o.shearRateMax.toPrecision(3))} 1/s: rotational/capillary ${Number(o.ratio.toPrecision(3))} (largest deviation ${Number((100 * o.maxDeviation).toPrecision(3))} %, ${o.withinTolerance ? "within" : "OUTSIDE"} the tolerance).`
    : "The rotational and capillary curves share no rate range: their agreement is not checked.";
  return { ...t, notes: [overlap, `${j.join.shearRate.length} points (${j.join.source.filter((x) => x === "rotational").length} rotational) joined with ${j.groups.join(", ")}.`, ...(t.notes ?? [])] };
}

/** Points of the joined curve's recommended model in {@link joinedCurveTable}. */
export const JOINED_MODEL_POINTS = 24;

/**
 * The joined curve for its chart: the capillary points, then the rotational points, as the join
 * holds them (viscosity), then the recommended model of the joined curve on a log grid over their
 * whole rate range (model viscosity).
 */
export function joinedCurveTable(run: Pick<ReductionRun, "joined">): ResultTable | null {
  const j = run.joined;
  if (!j || j.join.shearRate.length === 0) return null;
  const rows: ResultTable["rows"] = [];
  for (const source of ["capillary", "rotational"] as const) {
    j.join.shearRate.forEach((rate, i) => {
      if (j.join.source[i] === source) rows.push([source, v(rate), v(j.join.viscosity[i]), null]);
    });
  }
  const { recommended, fit } = j.fits.verdict;
  if (recommended && fit) {
    const grid = logSpaced(Math.min(...j.join.shearRate), Math.max(...j.join.shearRate), JOINED_MODEL_POINTS);
    const eta = evaluateModel(recommended, fit.parameters, grid);
    grid.forEach((rate, i) => rows.push([`${modelName(recommended)} (recommended)`, v(rate), null, v(eta[i])]));
  }
  return {
    id: "joinedCurve",
    title: "Joined curve, data and model",
    columns: [text("source", "Source"), num("shearRate", "Shear rate", "1/s"), num("viscosity", "Viscosity", "Pa·s"), num("modelViscosity", "Model viscosity", "Pa·s")],
    rows,
    chart: { kind: "joined", x: "shearRate", y: ["viscosity", "modelViscosity"], logX: true, logY: true, seriesBy: "source" },
  };
}

/** The warnings table: every warning of the run, most serious first. */
export function warningsTable(warnings: readonly Warning[]): ResultTable {
  const rank = { serious: 0, caution: 1, info: 2 } as const;
  const sorted = [...warnings].sort((a, b) => rank[a.severity] - rank[b.severity]);
  return {
    id: "warnings",
    title: "Warnings",
    columns: [text("severity", "Severity"), text("code", "Code"), text("scope", "Where"), text("message", "Message")],
    rows: sorted.map((w) => [w.severity, w.code, w.scope ?? null, w.message]),
    keyColumns: ["severity", "message"],
  };
}

/** Every table of a run, in reading order: groups, then per group its tables, then across groups. */
export function resultTables(run: ReductionRun): ResultTable[] {
  const tables: (ResultTable | null)[] = [groupsTable(run)];
  const steps = run.steps ? runsByGroup(run.result.groups, run.steps, DEFAULT_REDUCE_OPTIONS) : null;
  run.result.groups.forEach((g, i) => {
    const runs = steps?.byGroup[i] ?? [];
    if (runs.length > 0) tables.push(stepsTable(runs, groupLabel(g)));
    tables.push(bagleyTable(g), bagleyPointsTable(g), flowCurveTable(g), uncertaintyBudgetTable(g), rabinowitschTable(g), viscosityModelTable(run, g, i), entrancePressureTable(g), extensionalTable(g), heatingTable(g), pressureDependenceTable(g), stabilityTable(g), flaggedTable(g));
    const gf = run.groupFits[i];
    if (gf) tables.push(verdictTable(gf.label, gf.verdict));
  });
  if (steps && steps.unassigned.length > 0) tables.push({ ...stepsTable(steps.unassigned), title: "Steps of die runs with no point in the flow curve" });
  if (run.steps) tables.push(thermalChecksTable(run.steps.runs));
  tables.push(slipTable(run), meltFlowTable(run), fitRankingTable(run), fitParameterTable(run), shiftTable(run), shiftConstantsTable(run), masterTable(run), ...masterFitTables(run), joinedTable(run), joinedCurveTable(run), rowsTable(run), warningsTable(run.warnings));
  return tables.filter((t): t is ResultTable => t !== null);
}

// ---------------------------------------------------------------------------------------------
// Pressure recordings: the steps of each die run and the repeated-first-speed checks

/**
 * The steps of die runs: where each plateau was read (step start, window start and end), its mean
 * and standard deviation, whether it is steady and whether it went into the flow curve, and a
 * plain note (src/io/stepRecord.ts). Times on each run's own clock.
 * @param scope the group label when the runs belong to one group
 */
export function stepsTable(runs: readonly RunSteps[], scope?: string): ResultTable {
  const rows: ResultCell[][] = runs.flatMap((r) =>
    r.steps.map((s) => [r.run, r.label || null, s.step, v(s.pistonSpeed, MM), v(s.stepStart), v(s.start), v(s.end), s.samples, v(s.pressure, BAR), v(s.pressureStd, BAR), s.steady, s.used, stepNote(s) || null]),
  );
  return {
    id: "steps",
    title: "Steps of the pressure recording",
    ...(scope !== undefined ? { scope } : {}),
    columns: [
      num("run", "Die run", ""),
      text("die", "Die"),
      num("step", "Step", ""),
      num("pistonSpeed", "Piston speed", "mm/s"),
      num("stepStart", "Step start", "s"),
      num("start", "Window start", "s"),
      num("end", "Window end", "s"),
      num("samples", "Samples", ""),
      num("pressure", "Pressure", "bar"),
      num("pressureStd", "Pressure sd", "bar", 2),
      flag("steady", "Steady"),
      flag("used", "In flow curve"),
      text("note", "Note"),
    ],
    rows,
    notes: ["Pressure: mean over the window (net of barrel friction with a blank run); sd: standard deviation of the window's readings. Times on each die run's own clock."],
    keyColumns: ["step", "pistonSpeed", "pressure", "steady"],
  };
}

/** The repeated first speed of each die run that has one (thermal-stability check), or null. */
export function thermalChecksTable(runs: readonly RunSteps[]): ResultTable | null {
  const rows: ResultCell[][] = runs.flatMap((r) => {
    const c = r.thermalCheck;
    return c ? [[r.run, r.label || null, v(c.pistonSpeed, MM), v(c.firstPressure, BAR), v(c.repeatPressure, BAR), v(c.change, 100), c.withinLimit, c.bothSteady]] : [];
  });
  if (rows.length === 0) return null;
  return {
    id: "thermalChecks",
    title: "Repeated first speed (thermal stability)",
    columns: [
      num("run", "Die run", ""),
      text("die", "Die"),
      num("pistonSpeed", "Piston speed", "mm/s"),
      num("firstPressure", "First", "bar"),
      num("repeatPressure", "Repeat", "bar"),
      num("change", "Change", "%", 2),
      flag("withinLimit", "Within limit"),
      flag("bothSteady", "Both steady"),
    ],
    rows,
    keyColumns: ["run", "change", "withinLimit"],
  };
}
