/**
 * The analysis blocks of the demo workbooks: what each scenario is for, written after the
 * reduction blocks of the Formulas sheet (scripts/make-workbooks.ts).
 *
 *   paste-slip   RHEO.SLIPVELOCITY (Mooney, with its warnings) over the REDUCE flow curves of
 *                the three bores, beside the generating slip law and bulk viscosity
 *   cream-yield  RHEO.FIT herschel-bulkley, RHEO.COMPAREFITS, RHEO.MODEL at the data rates
 *   film-grade   RHEO.SHIFTFIT (Arrhenius), RHEO.FIT cross at the reference temperature,
 *                RHEO.COGSWELL from the Bagley entrance pressure
 *
 * Each RHEO formula is an array formula over exactly the cells its result fills, with the values
 * the add-in's implementation returns cached (sheetCall.ts). Columns that restate the generating
 * law are plain Excel formulas, so a reader can change the constants and compare.
 */
import ExcelJS from "exceljs";
import { Grid, RangeArg, SheetCall, rheo } from "./sheetCall";
import { header, label, placeArray, rangeRef, referenceCell } from "./sheetLayout";

/** Where the reduction blocks sit on the Formulas sheet (rows and columns 1-based) and what they hold. */
export interface AnalysisContext {
  ws: ExcelJS.Worksheet;
  /** first free row below the RHEO.REDUCE spill */
  row: number;
  /** number of the first analysis block */
  block: number;
  stressUnit: string;
  pressureUnit: string;
  /** the RHEO.REDUCE spill: top-left cell (its header row) at (top, 1) */
  reduce: { top: number; result: Grid };
  /** the RHEO.BAGLEY spill (with header) at (top, 1) */
  bagley: { top: number; result: Grid };
  /** the corrected flow curve of block 3: `lines` rows from `top`; n' in column 3, wall rate 4, viscosity 5 */
  curve: { top: number; lines: number; nPrime: Grid; shearRateWall: Grid; viscosity: Grid };
}

/** Writes the analysis blocks; returns the next free row. */
export type AnalysisBlocks = (ctx: AnalysisContext) => number;

/** A column of the RHEO.REDUCE spill (by its header's quantity) over its flow-curve rows, optionally only rows [from, from+count). */
export function reduceColumn(ctx: AnalysisContext, quantity: string, from = 0, count?: number): RangeArg {
  const grid = ctx.reduce.result;
  const heading = grid[0] as unknown[];
  const col = heading.findIndex((h) => typeof h === "string" && h.startsWith(quantity + " "));
  if (col < 0) throw new Error(`RHEO.REDUCE spill has no ${quantity} column`);
  const curveRows = grid.slice(1).findIndex((r) => typeof r[0] !== "number");
  const n = count ?? (curveRows < 0 ? grid.length - 1 : curveRows) - from;
  const first = ctx.reduce.top + 1 + from;
  return { ref: rangeRef(null, first, col + 1, first + n - 1, col + 1), values: grid.slice(1 + from, 1 + from + n).map((r) => [r[col]]) };
}

/** A one-column slice of a spill placed at (top, col): its rows [from, from+count) of grid column gridCol. */
function spillColumn(grid: Grid, top: number, col: number, gridCol: number, from: number, count: number): RangeArg {
  return { ref: rangeRef(null, top + from, col, top + from + count - 1, col), values: grid.slice(from, from + count).map((r) => [r[gridCol]]) };
}

/** Places a call, returns its size. */
function place(ws: ExcelJS.Worksheet, row: number, col: number, call: SheetCall): { rows: number; cols: number; result: Grid } {
  return { ...placeArray(ws, row, col, call), result: call.result };
}

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

// ---------- paste-slip ----------

/** The generating laws of the paste scenario, in the units the sheet shows. */
export interface SlipLaw {
  /** v_s = velocity·(τ/stress)^exponent: velocity in mm/s at `stress` in the sheet's stress unit */
  velocityMmS: number;
  stress: number;
  exponent: number;
  /** bulk power law η = K·γ̇^(n−1), K in Pa·s^n */
  K: number;
  n: number;
}

/** Mooney slip table from the REDUCE flow curves, with the generating slip law and bulk viscosity beside it. */
export function slipBlocks(law: SlipLaw): AnalysisBlocks {
  return (ctx) => {
    const { ws } = ctx;
    const S = ctx.stressUnit;
    label(ws, ctx.row, `${ctx.block}. Mooney wall-slip analysis of the three bores (RHEO.SLIPVELOCITY over the RHEO.REDUCE columns die_diameter, shear_rate_apparent, wall_shear_stress; its warnings below)`);
    const top = ctx.row + 1;
    const slip = place(ws, top, 1, rheo("slipVelocity", [reduceColumn(ctx, "die_diameter"), reduceColumn(ctx, "shear_rate_apparent"), reduceColumn(ctx, "wall_shear_stress"), "mm", S, true, true]));
    header(ws, top, slip.cols + 1, ["slip_velocity generating law [mm/s]", "viscosity generating bulk law [Pa.s]"]);
    slip.result.slice(1).forEach((r, i) => {
      const at = top + 1 + i;
      const tau = num(r[0]);
      const rate = num(r[3]);
      if (tau !== null) {
        referenceCell(ws, at, slip.cols + 1, `${law.velocityMmS}*(${rangeRef(null, at, 1)}/${law.stress})^${law.exponent}`, law.velocityMmS * Math.pow(tau / law.stress, law.exponent));
      }
      if (rate !== null) referenceCell(ws, at, slip.cols + 2, `${law.K}*${rangeRef(null, at, 4)}^(${law.n}-1)`, law.K * Math.pow(rate, law.n - 1));
    });
    return top + slip.rows + 1;
  };
}

// ---------- cream-yield ----------

/** The generating Herschel–Bulkley law, SI. */
export interface YieldLaw {
  tauY: number;
  K: number;
  n: number;
}

export const YIELD_MODELS = "herschel-bulkley, bingham, casson, power-law";

/** Herschel–Bulkley fit of the REDUCE flow curve, a model comparison and the fitted model at the data rates. */
export function yieldBlocks(law: YieldLaw): AnalysisBlocks {
  return (ctx) => {
    const { ws } = ctx;
    const rate = reduceColumn(ctx, "shear_rate_wall");
    const eta = reduceColumn(ctx, "viscosity");
    let row = ctx.row;
    label(ws, row, `${ctx.block}. Herschel-Bulkley fit of the corrected flow curve (RHEO.FIT over the RHEO.REDUCE columns shear_rate_wall, viscosity)`);
    const fitTop = row + 1;
    const fit = place(ws, fitTop, 1, rheo("fit", [rate, eta, "herschel-bulkley", null, null, null, null, null, null, true]));
    header(ws, fitTop, fit.cols + 1, ["generating value"]);
    (["tauY", "K", "n"] as const).forEach((name) => {
      const i = fit.result.findIndex((r) => r[0] === name);
      if (i > 0) ws.getCell(fitTop + i, fit.cols + 1).value = law[name];
    });
    row = fitTop + fit.rows + 1;

    label(ws, row, `${ctx.block + 1}. Model comparison by AIC (RHEO.COMPAREFITS)`);
    const compare = place(ws, row + 1, 1, rheo("compareFits", [rate, eta, YIELD_MODELS, null, null, null, true, "paste"]));
    row = row + 1 + compare.rows + 1;

    label(ws, row, `${ctx.block + 2}. The fitted Herschel-Bulkley model at the data rates (RHEO.MODEL with the fit of block ${ctx.block})`);
    header(ws, row + 1, 1, ["shear_rate_wall [1/s]", "viscosity [Pa.s]", "viscosity HB fit [Pa.s]", "deviation [%]", "viscosity generating law [Pa.s]"]);
    const top = row + 2;
    const n = rate.values.length;
    const rateFirst = /^([A-Z]+)(\d+)/.exec(rate.ref) as RegExpExecArray;
    const etaFirst = /^([A-Z]+)(\d+)/.exec(eta.ref) as RegExpExecArray;
    for (let i = 0; i < n; i++) {
      referenceCell(ws, top + i, 1, `${rateFirst[1]}${Number(rateFirst[2]) + i}`, rate.values[i]?.[0]);
      referenceCell(ws, top + i, 2, `${etaFirst[1]}${Number(etaFirst[2]) + i}`, eta.values[i]?.[0]);
    }
    const parameters = { ref: rangeRef(null, fitTop, 1, fitTop + fit.rows - 1, 2), values: fit.result.map((r) => [r[0], r[1]]) };
    const model = place(ws, top, 3, rheo("modelViscosity", ["herschel-bulkley", parameters, spillColumn(rate.values, top, 1, 0, 0, n)]));
    for (let i = 0; i < n; i++) {
      const g = num(rate.values[i]?.[0]);
      const measured = num(eta.values[i]?.[0]);
      const fitted = num(model.result[i]?.[0]);
      if (measured !== null && fitted !== null) referenceCell(ws, top + i, 4, `100*(${rangeRef(null, top + i, 3)}/${rangeRef(null, top + i, 2)}-1)`, 100 * (fitted / measured - 1));
      if (g !== null) referenceCell(ws, top + i, 5, `${law.tauY}/${rangeRef(null, top + i, 1)}+${law.K}*${rangeRef(null, top + i, 1)}^(${law.n}-1)`, law.tauY / g + law.K * Math.pow(g, law.n - 1));
    }
    return top + n + 1;
  };
}

// ---------- film-grade ----------

/** Reference temperature (°C) and generating activation energy (J/mol) of the film scenario. */
export interface ShiftSetup {
  referenceTemperatureC: number;
  activationEnergy: number;
}

export const FILM_FIT_MODEL = "cross";
export const FILM_FIT_FIXED = "etaInf=0";

/** Arrhenius shift over every temperature, a Cross fit at the reference temperature, Cogswell from the entrance pressure. */
export function shiftBlocks(setup: ShiftSetup): AnalysisBlocks {
  return (ctx) => {
    const { ws } = ctx;
    let row = ctx.row;
    label(ws, row, `${ctx.block}. Arrhenius temperature shift, Tref = ${setup.referenceTemperatureC} °C (RHEO.SHIFTFIT over the RHEO.REDUCE columns temperature, shear_rate_wall, viscosity)`);
    const shiftTop = row + 1;
    const shift = place(ws, shiftTop, 1, rheo("shiftFit", [reduceColumn(ctx, "temperature"), reduceColumn(ctx, "shear_rate_wall"), reduceColumn(ctx, "viscosity"), setup.referenceTemperatureC, "arrhenius"]));
    const ea = shift.result.findIndex((r) => r[0] === "Ea");
    header(ws, shiftTop + ea, shift.cols + 1, ["Ea [kJ/mol]"]);
    referenceCell(ws, shiftTop + ea, shift.cols + 2, `${rangeRef(null, shiftTop + ea, 2)}/1000`, (shift.result[ea]?.[1] as number) / 1000);
    header(ws, shiftTop + ea + 1, shift.cols + 1, ["generating Ea [kJ/mol]"]);
    ws.getCell(shiftTop + ea + 1, shift.cols + 2).value = setup.activationEnergy / 1000;
    row = shiftTop + shift.rows + 1;

    const c = ctx.curve;
    label(ws, row, `${ctx.block + 1}. Cross fit at ${setup.referenceTemperatureC} °C with its uncertainties (RHEO.FIT over the corrected flow curve of block 3, etaInf held at 0)`);
    const fit = place(ws, row + 1, 1, rheo("fit", [spillColumn(c.shearRateWall, c.top, 4, 0, 0, c.lines), spillColumn(c.viscosity, c.top, 5, 0, 0, c.lines), FILM_FIT_MODEL, FILM_FIT_FIXED, null, null, null, null, null, true]));
    row = row + 1 + fit.rows + 1;

    label(ws, row, `${ctx.block + 2}. Cogswell converging flow from the Bagley entrance pressure (RHEO.COGSWELL; entrance pressure from block 2, wall rate, viscosity and n' from block 3)`);
    header(ws, row + 1, 1, ["shear_rate_wall [1/s]", "tensile_stress [Pa]", "extension_rate [1/s]", "extensional_viscosity [Pa.s]", "Trouton_ratio [-]"]);
    const top = row + 2;
    for (let i = 0; i < c.lines; i++) referenceCell(ws, top + i, 1, rangeRef(null, c.top + i, 4), c.shearRateWall[i]?.[0]);
    const entrance = spillColumn(ctx.bagley.result, ctx.bagley.top, 3, 2, 1, c.lines);
    const cogswell = place(ws, top, 2, rheo("cogswellFlow", [entrance, spillColumn(c.shearRateWall, c.top, 4, 0, 0, c.lines), spillColumn(c.viscosity, c.top, 5, 0, 0, c.lines), spillColumn(c.nPrime, c.top, 3, 0, 0, c.lines), ctx.pressureUnit, "Pa.s"]));
    return top + cogswell.rows + 1;
  };
}
