/**
 * Builds the results sheet plan of a run: warnings, then per group the Bagley table, the flow
 * curve with the standard error of the wall stress (and, when asked for, the ± columns of the
 * transducer uncertainty and the Schümmer cross-check), the orifice/Bagley entrance pressures,
 * the extensional, heating and pressure-dependence tables, the model ranking and fitted
 * parameters; then the slip table and the temperature shift. Chart data on the right; native
 * charts (Bagley plot per group with its lines extended to zero pressure, log–log flow curve,
 * viscosity with the best model of each group or every model, n' vs rate, master curve).
 * Values are SI from the core converted once here to the display units below.
 */
import { fromSI } from "../core/units";
import { getModel } from "../core/models";
import type { ReductionGroup, ReductionResult } from "../core/reduce";
import type { ShiftOutput } from "./temperatureShift";
import type { GroupFits, RunOutput } from "./runReduction";
import { groupLabel } from "./runReduction";
import { CellBlock, CellValue, ChartSpec, SeriesSpec, SheetPlan, blockLayout } from "./sheetPlan";

/** Units of the results sheet (one place; headers and conversions read it). */
export const DEFAULT_OUTPUT_UNITS = Object.freeze({
  rate: "1/s",
  stress: "kPa",
  pressure: "bar",
  viscosity: "Pa.s",
  temperature: "C",
  length: "mm",
});

/** Our chart palette: one colour per group (deep teal first, then amber, plum, ...). */
export const GROUP_COLOURS = ["#0b6e69", "#c77c0e", "#7a3b8f", "#2f5d9e", "#a23b2a", "#4f7a28"];
/** Bagley lines run from teal to amber over the rates. */
const RATE_RAMP: [number[], number[]] = [[11, 110, 105], [199, 124, 14]];

/**
 * Where things go on the results sheet (0-based columns). The charts start at `chartCol` or one
 * column right of the widest table, whichever is further right; the chart data follow the charts.
 */
export const RESULTS_LAYOUT = Object.freeze({ tableCol: 0, chartCol: 9, chartCols: 8, chartRows: 16, dataCol: 19 });

const U = DEFAULT_OUTPUT_UNITS;

/** Names and stamp of a run, decided by the caller (the writer makes the names unique). */
export interface PlanMeta {
  names: { results: string; method: string };
  version: string;
  /** ISO date-time of the run */
  date: string;
}

function rampColour(i: number, n: number): string {
  const t = n <= 1 ? 0 : i / (n - 1);
  const [a, b] = RATE_RAMP;
  return "#" + a.map((v, k) => Math.round(v + ((b[k] as number) - v) * t).toString(16).padStart(2, "0")).join("");
}

const kPa = (pa: number) => fromSI(pa, U.stress, "pressure");
const bar = (pa: number) => fromSI(pa, U.pressure, "pressure");
const fmt = (x: number) => Number(x.toPrecision(4)).toString();

/** Stacks blocks down a column, one blank row between them. */
class Stack {
  row: number;
  readonly blocks: CellBlock[] = [];
  constructor(readonly col: number, start: number) {
    this.row = start;
  }
  add(block: Omit<CellBlock, "row" | "col">, gap = 1): CellBlock {
    const b: CellBlock = { ...block, row: this.row, col: this.col };
    this.blocks.push(b);
    this.row += blockLayout(b).rowCount + gap;
    return b;
  }
}

function bagleyBlock(g: ReductionGroup, n: number): Omit<CellBlock, "row" | "col"> {
  return {
    id: `bagley-${n}`,
    role: "table",
    title: "Bagley end correction",
    header: [`shear rate app. [${U.rate}]`, `wall shear stress [${U.stress}]`, `std. error of stress [${U.stress}]`, `entrance pressure [${U.pressure}]`, "end correction e [-]", "R² [-]", "dies"],
    rows: g.bagley.map((b) => [b.shearRateApparent, kPa(b.wallShearStress), b.diesUsed > 2 ? kPa(b.slopeStandardError / 2) : null, bar(b.entrancePressure), b.endCorrection, b.r2, b.diesUsed]),
    numberFormats: ["0.00", "0.000", "0.000", "0.000", "0.000", "0.0000", "0"],
  };
}

function flowBlock(g: ReductionGroup, n: number): Omit<CellBlock, "row" | "col"> {
  const se = new Map(g.bagley.map((b) => [b.shearRateApparent, b.diesUsed > 2 ? kPa(b.slopeStandardError / 2) : null]));
  const header = [`shear rate app. [${U.rate}]`, `wall shear stress [${U.stress}]`, `std. error of stress [${U.stress}]`, "n' [-]", `shear rate wall [${U.rate}]`, `viscosity [${U.viscosity}]`, `apparent viscosity [${U.viscosity}]`];
  const formats: (string | null)[] = ["0.00", "0.000", "0.000", "0.000", "0.00", "0.0", "0.0"];
  if (g.uncertainty) {
    header.push(`± wall shear stress [${U.stress}]`, `± shear rate wall [${U.rate}]`, `± viscosity [${U.viscosity}]`);
    formats.push("0.000", "0.00", "0.0");
  }
  if (g.representativeRate) {
    header.push(`Schümmer shear rate [${U.rate}]`, `Schümmer viscosity [${U.viscosity}]`, "Schümmer vs Rabinowitsch [%]");
    formats.push("0.00", "0.0", "0.0");
  }
  const rows = g.flowCurve.map((f, i): CellValue[] => {
    const row: CellValue[] = [f.shearRateApparent, kPa(f.wallShearStress), se.get(f.shearRateApparent) ?? null, f.nPrime, f.shearRateWall, f.viscosity, f.viscosityApparent];
    const u = g.uncertainty?.[i];
    if (g.uncertainty) row.push(u ? kPa(u.wallShearStress) : null, u?.shearRateWall ?? null, u?.viscosity ?? null);
    const r = g.representativeRate?.[i];
    if (g.representativeRate) row.push(r?.shearRateRepresentative ?? null, r?.viscosityRepresentative ?? null, r && r.deviation !== null ? r.deviation * 100 : null);
    return row;
  });
  const title = g.uncertainty ? "Flow curve (Rabinowitsch-corrected; ± expanded uncertainty, k = 2)" : "Flow curve (Rabinowitsch-corrected)";
  return { id: `flow-${n}`, role: "table", title, header, rows, numberFormats: formats };
}

/** The optional method tables of a group (entrance pressures, Cogswell, heating, pressure dependence). */
function methodBlocks(g: ReductionGroup, n: number): Omit<CellBlock, "row" | "col">[] {
  const out: Omit<CellBlock, "row" | "col">[] = [];
  const barOrNull = (v: number | null) => (v === null ? null : bar(v));
  if (g.entrancePressures) {
    out.push({
      id: `entrance-${n}`,
      role: "table",
      title: "Entrance pressure: Bagley and orifice die",
      header: [`shear rate app. [${U.rate}]`, `Bagley intercept [${U.pressure}]`, `orifice die [${U.pressure}]`, "Bagley vs orifice [%]"],
      rows: g.entrancePressures.map((e) => [e.shearRateApparent, barOrNull(e.entrancePressure), barOrNull(e.entrancePressureOrifice), e.difference === null ? null : e.difference * 100]),
      numberFormats: ["0.00", "0.000", "0.000", "0.0"],
    });
  }
  if (g.extensional) {
    out.push({
      id: `extensional-${n}`,
      role: "table",
      title: "Extensional viscosity (Cogswell)",
      header: [`shear rate wall [${U.rate}]`, `entrance pressure [${U.pressure}]`, `tensile stress [${U.stress}]`, "extension rate [1/s]", `extensional viscosity [${U.viscosity}]`, "Trouton ratio [-]"],
      rows: g.extensional.map((e) => [e.shearRateWall, bar(e.entrancePressure), kPa(e.tensileStress), e.extensionRate, e.extensionalViscosity, e.troutonRatio]),
      numberFormats: ["0.00", "0.000", "0.000", "0.00", "0", "0.00"],
    });
  }
  if (g.heating) {
    out.push({
      id: `heating-${n}`,
      role: "table",
      title: `Viscous heating (b = ${fmt(g.heating.temperatureCoefficient)} 1/K, ${g.heating.temperatureCoefficientSource})`,
      header: [`shear rate app. [${U.rate}]`, `die pressure [${U.pressure}]`, "adiabatic rise [K]", "Nahme number [-]"],
      rows: g.heating.rows.map((h) => [h.shearRateApparent, bar(h.pressure), h.adiabaticTemperatureRise, h.nahmeNumber]),
      numberFormats: ["0.00", "0.000", "0.00", "0.000"],
    });
  }
  if (g.pressureDependence) {
    const beta = g.pressureDependence.pressureCoefficient;
    const rows: CellValue[][] = g.pressureDependence.rows.map((r) => [r.shearRateApparent, r.pressureCoefficient * 1e9, kPa(r.wallShearStressAtZeroPressure), bar(r.entrancePressure), r.logViscosityRise, r.diesUsed, r.converged ? "yes" : "no"]);
    out.push({
      id: `pressure-${n}`,
      role: "table",
      title: `Pressure dependence (median β = ${beta === null ? "not determined" : `${fmt(beta * 1e9)} 1/GPa`})`,
      header: [`shear rate app. [${U.rate}]`, "β [1/GPa]", `wall stress at p = 0 [${U.stress}]`, `entrance pressure [${U.pressure}]`, "ln viscosity rise [-]", "dies", "converged"],
      rows: rows.length > 0 ? rows : [["No rate had three or more dies on its Bagley line."]],
      numberFormats: ["0.00", "0.00", "0.000", "0.000", "0.000", "0", null],
    });
  }
  return out;
}

/** The Mooney slip table of the run (null when slip was not asked for). */
function slipBlock(result: ReductionResult): Omit<CellBlock, "row" | "col"> | null {
  if (!result.slip) return null;
  return {
    id: "slip",
    role: "table",
    title: "Wall slip (Mooney)",
    header: [`temperature [°C]`, `wall shear stress [${U.stress}]`, "slip velocity [mm/s]", "std. error of slip velocity [mm/s]", `shear rate app. slip-corrected [${U.rate}]`, "n' [-]", `shear rate wall [${U.rate}]`, `viscosity [${U.viscosity}]`, "R² [-]"],
    rows: result.slip.map((s) => [s.temperature === null ? null : fromSI(s.temperature, U.temperature, "temperature"), kPa(s.wallShearStress), s.slipVelocity * 1e3, s.slipVelocityStandardError * 1e3, s.shearRateApparentCorrected, s.nPrime, s.shearRateWall, s.viscosity, s.r2]),
    numberFormats: ["0.0", "0.000", "0.0000", "0.0000", "0.00", "0.000", "0.00", "0.0", "0.0000"],
  };
}

/** The temperature-shift blocks: the law's constants, and aT per temperature. */
function shiftBlocks(shift: ShiftOutput): Omit<CellBlock, "row" | "col">[] {
  const f = shift.fit;
  const tC = (k: number) => fromSI(k, U.temperature, "temperature");
  const constants: CellValue[][] =
    f.law === "arrhenius"
      ? [
          ["law", "Arrhenius: aT = exp[(Ea/R)(1/T − 1/Tref)]"],
          ["reference temperature [°C]", tC(f.referenceTemperature)],
          ["activation energy Ea [kJ/mol]", f.activationEnergy / 1e3],
          ["std. error of Ea [kJ/mol]", f.activationEnergyStandardError / 1e3],
          ["RMSE of the fit (ln η) [-]", f.rmse],
          ["converged", f.converged ? "yes" : "no"],
        ]
      : [
          ["law", "WLF: log10 aT = −C1(T − Tref)/(C2 + T − Tref)"],
          ["reference temperature [°C]", tC(f.referenceTemperature)],
          ["C1 [-]", f.C1],
          ["std. error of C1 [-]", Number.isNaN(f.C1StandardError) ? "held" : f.C1StandardError],
          ["C2 [K]", f.C2],
          ["std. error of C2 [K]", Number.isNaN(f.C2StandardError) ? "held" : f.C2StandardError],
          ["RMSE of the fit (ln η) [-]", f.rmse],
          ["converged", f.converged ? "yes" : "no"],
        ];
  return [
    { id: "shift", role: "list", title: `Temperature shift (${f.law === "arrhenius" ? "Arrhenius" : "WLF"})`, header: ["quantity", "value"], rows: constants, numberFormats: [null, "0.000"] },
    {
      id: "shift-factors",
      role: "table",
      title: "Shift factors",
      header: ["temperature [°C]", "aT [-]", "log10 aT [-]"],
      rows: f.factors.map((x) => [tC(x.temperature), x.aT, Math.log10(x.aT)]),
      numberFormats: ["0.0", "0.0000", "0.0000"],
    },
  ];
}

function fitBlocks(fits: GroupFits, n: number): Omit<CellBlock, "row" | "col">[] {
  const c = fits.compare;
  if (!c || c.ranked.length === 0) return [];
  const ranking: Omit<CellBlock, "row" | "col"> = {
    id: `ranking-${n}`,
    role: "table",
    title: "Model ranking (AIC, lower is better)",
    header: ["model", "ΔAIC [-]", "Akaike weight [-]", "R² (ln η) [-]", "RMSE (ln η) [-]", "points", "iterations"],
    rows: c.ranked.map((r) => [r.model, r.deltaAic, r.akaikeWeight, r.result.r2, r.result.rmse, r.result.pointCount, r.result.iterations]),
    numberFormats: [null, "0.00", "0.000", "0.0000", "0.0000", "0", "0"],
  };
  const rows: CellValue[][] = [];
  for (const r of c.ranked) {
    for (const spec of getModel(r.model).parameters) {
      const ci = r.result.confidenceIntervals[spec.name];
      const fixed = r.result.fixed.includes(spec.name);
      rows.push([r.model, spec.name, r.result.parameters[spec.name] ?? null, fixed ? "fixed" : (r.result.standardErrors[spec.name] ?? null), ci?.[0] ?? null, ci?.[1] ?? null, spec.unit]);
    }
  }
  const parameters: Omit<CellBlock, "row" | "col"> = {
    id: `parameters-${n}`,
    role: "table",
    title: "Fitted parameters (SI; 95 % intervals)",
    header: ["model", "parameter", "value", "std. error", "95 % low", "95 % high", "unit"],
    rows,
    numberFormats: [null, null, "0.0000E+00", "0.000E+00", "0.000E+00", "0.000E+00", null],
  };
  return [ranking, parameters];
}

function bagleyChartData(g: ReductionGroup, n: number): { block: Omit<CellBlock, "row" | "col">; series: Omit<SeriesSpec, "blockId">[] } {
  const rows: CellValue[][] = [];
  const series: Omit<SeriesSpec, "blockId">[] = [];
  const maxLR = Math.max(...g.dies.map((d) => d.lengthOverRadius));
  g.bagley.forEach((b, i) => {
    const colour = rampColour(i, g.bagley.length);
    const name = `${fmt(b.shearRateApparent)} 1/s`;
    series.push({ name, xColumn: 1, yColumn: 2, firstRow: rows.length, rowCount: b.points.length, style: "markers", colour });
    for (const p of b.points) rows.push([name, p.lengthOverRadius, bar(p.pressure)]);
    series.push({ name: `${name} line`, xColumn: 1, yColumn: 2, firstRow: rows.length, rowCount: 2, style: "line", colour });
    rows.push([`${name} line`, -b.endCorrection, 0]);
    rows.push([`${name} line`, maxLR, bar(b.slope * maxLR + b.entrancePressure)]);
  });
  return { block: { id: `bagleydata-${n}`, role: "chartData", title: `Bagley plot data, ${groupLabel(g)}`, header: ["series", "L/R [-]", `pressure drop [${U.pressure}]`], rows, numberFormats: [null, "0.000", "0.000"] }, series };
}

function modelChartData(fits: GroupFits, label: string, n: number): { block: Omit<CellBlock, "row" | "col">; runs: { model: string; firstRow: number; rowCount: number }[] } | null {
  if (fits.curves.length === 0) return null;
  const rows: CellValue[][] = [];
  const runs: { model: string; firstRow: number; rowCount: number }[] = [];
  for (const c of fits.curves) {
    runs.push({ model: c.model, firstRow: rows.length, rowCount: c.shearRate.length });
    c.shearRate.forEach((rate, i) => rows.push([c.model, rate, c.viscosity[i] ?? null]));
  }
  return { block: { id: `modeldata-${n}`, role: "chartData", title: `Model curves, ${label}`, header: ["model", `shear rate wall [${U.rate}]`, `viscosity [${U.viscosity}]`], rows, numberFormats: [null, "0.000", "0.00"] }, runs };
}

/**
 * The results sheet of a run (see the module comment). Group n (1-based) owns blocks
 * `section-n`, `bagley-n` (Bagley only), `flow-n`, `ranking-n` and `parameters-n` (when models
 * were fitted), `bagleydata-n`, `modeldata-n`; charts `flowcurve`, `viscosity`, `nprime`, `bagley-n`.
 */
export function buildResultsPlan(run: RunOutput, meta: PlanMeta): SheetPlan {
  const L = RESULTS_LAYOUT;
  const left = new Stack(L.tableCol, 0);
  left.add({ id: "title", role: "heading", title: "Rheoledger results", rows: [] }, 0);
  left.add({ id: "stamp", role: "text", rows: [[`Data ${run.input.sourceLabel}; method record on sheet "${meta.names.method}"; ${meta.date}; Rheoledger ${meta.version}`]] });
  const warnings = run.warnings.length > 0 ? run.warnings.map((w): CellValue[] => [w.code, w.message]) : [["NONE", "No warnings."]];
  left.add({ id: "warnings", role: "list", title: `Warnings (${run.warnings.length})`, header: ["code", "message"], rows: warnings });

  const right = new Stack(L.dataCol, 0); // moved right of the charts at the end
  right.add({ id: "chartdata-title", role: "heading", title: "Chart data (read by the charts)", rows: [] }, 0);
  const charts: ChartSpec[] = [];
  const flowSeries: SeriesSpec[] = [];
  const viscositySeries: SeriesSpec[] = [];
  const nPrimeSeries: SeriesSpec[] = [];
  const bagleyCharts: ChartSpec[] = [];
  const dashed: SeriesSpec["style"][] = ["line", "dashed"];

  run.result.groups.forEach((g, i) => {
    const n = i + 1;
    const label = groupLabel(g);
    const colour = GROUP_COLOURS[i % GROUP_COLOURS.length] as string;
    const dies = g.dies.map((d) => fmt(d.dieLength / g.dieDiameter)).join(", ");
    left.add({ id: `section-${n}`, role: "heading", title: `${label}; dies L/D ${dies}`, rows: [] }, 0);
    if (g.bagley.length > 0) left.add(bagleyBlock(g, n));
    const flow = left.add(flowBlock(g, n));
    for (const b of methodBlocks(g, n)) left.add(b);
    const fits = run.fits[i] ?? { compare: null, curves: [] };
    for (const b of fitBlocks(fits, n)) left.add(b);
    left.row += 1;

    const count = flow.rows.length;
    flowSeries.push({ name: label, blockId: flow.id, xColumn: 4, yColumn: 1, firstRow: 0, rowCount: count, style: "markers", colour });
    viscositySeries.push({ name: label, blockId: flow.id, xColumn: 4, yColumn: 5, firstRow: 0, rowCount: count, style: "markers", colour });
    nPrimeSeries.push({ name: label, blockId: flow.id, xColumn: 0, yColumn: 3, firstRow: 0, rowCount: count, style: "markers", colour });
    const models = modelChartData(fits, label, n);
    if (models) {
      const block = right.add(models.block);
      // curves are in AIC order: the first is the group's best model
      models.runs.forEach((r, k) => {
        if (k > 0 && !run.settings.chartAllModels) return;
        const name = run.settings.chartAllModels ? `${label}, ${r.model}` : `${label}, ${r.model} (best)`;
        viscositySeries.push({ name, blockId: block.id, xColumn: 1, yColumn: 2, firstRow: r.firstRow, rowCount: r.rowCount, style: dashed[k % 2] as SeriesSpec["style"], colour });
      });
    }
    if (g.bagley.length > 0) {
      const data = bagleyChartData(g, n);
      const block = right.add(data.block);
      bagleyCharts.push({
        id: `bagley-${n}`,
        title: `Bagley plot, ${label}`,
        xTitle: "L/R [-]",
        yTitle: `pressure drop [${U.pressure}]`,
        xLog: false,
        yLog: false,
        xMin: Math.min(0, ...g.bagley.map((b) => -b.endCorrection)),
        yMin: 0,
        series: data.series.map((s) => ({ ...s, blockId: block.id })),
        anchor: { row: 0, col: 0, rows: 0, cols: 0 },
      });
    }
  });

  const slip = slipBlock(run.result);
  if (slip) left.add(slip);
  const masterSeries: SeriesSpec[] = [];
  if (run.shift) {
    left.add({ id: "section-shift", role: "heading", title: `Temperature shift to ${fmt(fromSI(run.shift.law.referenceTemperature, U.temperature, "temperature"))} °C`, rows: [] }, 0);
    for (const b of shiftBlocks(run.shift)) left.add(b);
    const m = run.shift.master;
    const temps = [...new Set(m.temperature)].sort((a, b) => a - b);
    const rows: CellValue[][] = [];
    const runs: { name: string; firstRow: number; rowCount: number }[] = [];
    for (const t of temps) {
      const name = `${fmt(fromSI(t, U.temperature, "temperature"))} °C`;
      const idx = m.temperature.map((x, k) => (x === t ? k : -1)).filter((k) => k >= 0);
      runs.push({ name, firstRow: rows.length, rowCount: idx.length });
      for (const k of idx) rows.push([name, m.shearRate[k] as number, m.viscosity[k] as number]);
    }
    const block = right.add({ id: "masterdata", role: "chartData", title: "Master curve data (reduced to the reference temperature)", header: ["measured at", `aT·shear rate [${U.rate}]`, `viscosity/aT [${U.viscosity}]`], rows, numberFormats: [null, "0.000", "0.00"] });
    runs.forEach((r, k) => masterSeries.push({ name: r.name, blockId: block.id, xColumn: 1, yColumn: 2, firstRow: r.firstRow, rowCount: r.rowCount, style: "markers", colour: GROUP_COLOURS[k % GROUP_COLOURS.length] as string }));
  }

  const axis = { xLog: true, yLog: true };
  charts.push({ id: "flowcurve", title: "Flow curve", xTitle: `shear rate wall [${U.rate}]`, yTitle: `wall shear stress [${U.stress}]`, ...axis, series: flowSeries, anchor: { row: 0, col: 0, rows: 0, cols: 0 } });
  charts.push({ id: "viscosity", title: "Viscosity and fitted models", xTitle: `shear rate wall [${U.rate}]`, yTitle: `viscosity [${U.viscosity}]`, ...axis, series: viscositySeries, anchor: { row: 0, col: 0, rows: 0, cols: 0 } });
  charts.push({ id: "nprime", title: "n' against apparent shear rate", xTitle: `shear rate app. [${U.rate}]`, yTitle: "n' [-]", xLog: true, yLog: false, series: nPrimeSeries, anchor: { row: 0, col: 0, rows: 0, cols: 0 } });
  if (run.shift) {
    const ref = fmt(fromSI(run.shift.law.referenceTemperature, U.temperature, "temperature"));
    charts.push({ id: "master", title: `Master curve at ${ref} °C`, xTitle: `aT·shear rate [${U.rate}]`, yTitle: `viscosity/aT [${U.viscosity}]`, ...axis, series: masterSeries, anchor: { row: 0, col: 0, rows: 0, cols: 0 } });
  }
  charts.push(...bagleyCharts);
  const tableRight = Math.max(...left.blocks.map((b) => b.col + blockLayout(b).width));
  const chartCol = Math.max(L.chartCol, tableRight + 1);
  const dataCol = chartCol + L.chartCols + 2;
  for (const b of right.blocks) b.col = dataCol;
  charts.forEach((c, k) => (c.anchor = { row: 3 + k * (L.chartRows + 1), col: chartCol, rows: L.chartRows, cols: L.chartCols }));

  const tableWidths = [16, 16, 16, 16, 14, 14, 14, ...new Array<number>(Math.max(0, chartCol - 7)).fill(13)].slice(0, chartCol);
  tableWidths[chartCol - 1] = 2;
  const widths = [...tableWidths, ...new Array<number>(dataCol - chartCol).fill(9), 22, 12, 14];
  return { name: meta.names.results, blocks: [...left.blocks, ...right.blocks], charts, columnWidths: widths };
}
