/**
 * The core tables of the results sheet, per group: the Bagley table, the flow curve (with the
 * standard error of the wall stress and, when asked for, the ± columns of the transducer
 * uncertainty and the Schümmer cross-check), the model ranking and the fitted parameters. Values
 * are SI from the core converted once here to the display units {@link DEFAULT_OUTPUT_UNITS}.
 * The optional method tables: resultsMethodBlocks.ts; the chart data: resultsCharts.ts.
 */
import { getModel } from "../core/models";
import type { ReductionGroup } from "../core/reduce";
import { fromSI } from "../core/units";
import type { GroupFits } from "./runReduction";
import type { CellBlock, CellValue } from "./sheetPlan";

/** Units of the results sheet (one place; headers and conversions read it). */
export const DEFAULT_OUTPUT_UNITS = Object.freeze({
  rate: "1/s",
  stress: "kPa",
  pressure: "bar",
  viscosity: "Pa.s",
  temperature: "C",
  length: "mm",
});

const U = DEFAULT_OUTPUT_UNITS;

/** A block before the results stack gives it a place on the sheet. */
export type BlockDraft = Omit<CellBlock, "row" | "col">;

/** Stress in the display unit ({@link DEFAULT_OUTPUT_UNITS}.stress) from Pa. */
export const kPa = (pa: number) => fromSI(pa, U.stress, "pressure");
/** Pressure in the display unit ({@link DEFAULT_OUTPUT_UNITS}.pressure) from Pa. */
export const bar = (pa: number) => fromSI(pa, U.pressure, "pressure");
/** A number in titles and labels: 4 significant digits, no trailing zeros. */
export const fmt = (x: number) => Number(x.toPrecision(4)).toString();

/** The Bagley table of group `n`. */
export function bagleyBlock(g: ReductionGroup, n: number): BlockDraft {
  return {
    id: `bagley-${n}`,
    role: "table",
    title: "Bagley end correction",
    header: [`shear rate app. [${U.rate}]`, `wall shear stress [${U.stress}]`, `std. error of stress [${U.stress}]`, `entrance pressure [${U.pressure}]`, "end correction e [-]", "R² [-]", "dies"],
    rows: g.bagley.map((b) => [b.shearRateApparent, kPa(b.wallShearStress), b.diesUsed > 2 ? kPa(b.slopeStandardError / 2) : null, bar(b.entrancePressure), b.endCorrection, b.r2, b.diesUsed]),
    numberFormats: ["0.00", "0.000", "0.000", "0.000", "0.000", "0.0000", "0"],
    keyColumns: [0, 1, 3, 4],
  };
}

/** The flow-curve table of group `n`. */
export function flowBlock(g: ReductionGroup, n: number): BlockDraft {
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
  return { id: `flow-${n}`, role: "table", title, header, rows, numberFormats: formats, keyColumns: [0, 1, 4, 5] };
}

/** The model ranking and fitted-parameter tables of group `n` (none when no model was fitted). */
export function fitBlocks(fits: GroupFits, n: number): BlockDraft[] {
  const c = fits.compare;
  if (!c || c.ranked.length === 0) return [];
  const ranking: BlockDraft = {
    id: `ranking-${n}`,
    role: "table",
    title: "Model ranking (AIC, lower is better)",
    header: ["model", "ΔAIC [-]", "Akaike weight [-]", "R² (ln η) [-]", "RMSE (ln η) [-]", "points", "iterations"],
    rows: c.ranked.map((r) => [r.model, r.deltaAic, r.akaikeWeight, r.result.r2, r.result.rmse, r.result.pointCount, r.result.iterations]),
    numberFormats: [null, "0.00", "0.000", "0.0000", "0.0000", "0", "0"],
    keyColumns: [0, 1, 2, 3],
  };
  const rows: CellValue[][] = [];
  for (const r of c.ranked) {
    for (const spec of getModel(r.model).parameters) {
      const ci = r.result.confidenceIntervals[spec.name];
      const fixed = r.result.fixed.includes(spec.name);
      rows.push([r.model, spec.name, r.result.parameters[spec.name] ?? null, fixed ? "fixed" : (r.result.standardErrors[spec.name] ?? null), ci?.[0] ?? null, ci?.[1] ?? null, spec.unit]);
    }
  }
  const parameters: BlockDraft = {
    id: `parameters-${n}`,
    role: "table",
    title: "Fitted parameters (SI; 95 % intervals)",
    header: ["model", "parameter", "value", "std. error", "95 % low", "95 % high", "unit"],
    rows,
    numberFormats: [null, null, "0.0000E+00", "0.000E+00", "0.000E+00", "0.000E+00", null],
    keyColumns: [0, 1, 2, 6],
  };
  return [ranking, parameters];
}

