/**
 * The results workbook's tables against the JSON document of the same run (`reduce --json`, SI):
 * which sheet column holds which JSON key, in which display unit. Written out here, independently
 * of the code that builds the tables, so a renamed key, a wrong unit factor or a shifted column
 * fails. Sheets are given as rows of cell values (row 1 the title, row 2 the headers), as any
 * reader returns them (exceljs, openpyxl, LibreOffice's CSV).
 */
import { expectClose } from "./expectClose";

type Doc = Record<string, unknown> & { groups: Record<string, unknown>[] };
type Row = Record<string, unknown>;

/** Display unit → SI: value_SI = factor·value + offset. */
const TO_SI: Record<string, [number, number]> = {
  "1/s": [1, 0], "Pa·s": [1, 0], kPa: [1e3, 0], bar: [1e5, 0], "°C": [1, 273.15], mm: [1e-3, 0], "mm/s": [1e-3, 0], "%": [1e-2, 0],
  "1/GPa": [1e-9, 0], "kJ/mol": [1e3, 0], "mm³/s": [1e-9, 0], K: [1, 0], "-": [1, 0],
};

/** One sheet's rows in the JSON document (in sheet order) and the JSON key of each header's quantity. */
export interface SheetSpec {
  sheet: string;
  rows(doc: Doc): Row[];
  /** header label without unit → JSON key */
  columns: Record<string, string>;
}

const groups = (doc: Doc) => doc.groups;
const each = (key: string) => (doc: Doc): Row[] => groups(doc).flatMap((g) => (g[key] as Row[] | undefined) ?? []);

export const SHEET_SPECS: SheetSpec[] = [
  {
    sheet: "Flow curve",
    rows: each("flowCurve"),
    columns: {
      "Apparent shear rate": "shearRateApparent", "Wall shear stress": "wallShearStress", "n′": "nPrime", "True wall shear rate": "shearRateWall", Viscosity: "viscosity", "Apparent viscosity": "viscosityApparent",
      "Representative rate": "shearRateRepresentative", "Representative viscosity": "viscosityRepresentative", "Representative vs Rabinowitsch": "representativeDeviation",
      "Method's own bias at n′": "representativeExpectedDeviation", "Difference beyond the bias": "representativeDeviationCorrected",
      "± wall shear stress (k = 2)": "wallShearStressUncertainty", "± true wall rate (k = 2)": "shearRateWallUncertainty", "± viscosity (k = 2)": "viscosityUncertainty",
    },
  },
  {
    sheet: "Bagley end correction",
    rows: each("bagley"),
    columns: { "Apparent shear rate": "shearRateApparent", "Wall shear stress": "wallShearStress", "Entrance pressure": "entrancePressure", "End correction e": "endCorrection", "R²": "r2", Dies: "diesUsed" },
  },
  {
    sheet: "Extensional viscosity",
    rows: each("extensional"),
    columns: {
      "Apparent shear rate": "shearRateApparent", "True wall shear rate": "shearRateWall", "Shear rate used": "shearRate", "Entrance pressure": "entrancePressure", "Tensile stress": "tensileStress",
      "Extension rate": "extensionRate", "Extensional viscosity": "extensionalViscosity", "Trouton ratio": "troutonRatio",
    },
  },
  {
    sheet: "Viscous heating",
    rows: (doc) => groups(doc).flatMap((g) => ((g.heating as { rows: Row[] } | undefined)?.rows ?? [])),
    columns: {
      "Apparent shear rate": "shearRateApparent", Pressure: "pressure", "Adiabatic rise": "adiabaticTemperatureRise", "Mean velocity": "meanVelocity",
      "Nahme–Griffith number": "nahmeGriffithNumber", "Brinkman number": "brinkmanNumber", "Graetz number": "graetzNumber",
    },
  },
  {
    sheet: "Pressure dependence",
    rows: (doc) => groups(doc).flatMap((g) => ((g.pressureDependence as { rows: Row[] } | undefined)?.rows ?? [])),
    columns: {
      "Apparent shear rate": "shearRateApparent", "β (constant stress)": "pressureCoefficientConstantStress", "± β (1 s.e.)": "pressureCoefficientConstantStressStandardError",
      "Curvature coefficient n′β": "pressureCoefficientConstantRate", "n′": "nPrime", "Wall shear stress at p = 0": "wallShearStressAtZeroPressure", "Entrance pressure": "entrancePressure",
      "ln viscosity rise": "logViscosityRise", Dies: "diesUsed",
    },
  },
  {
    sheet: "Temperature shift",
    rows: (doc) => ((doc.shift as { factors: Row[] } | undefined)?.factors ?? []),
    columns: { Temperature: "temperature", "Shift factor aT": "aT" },
  },
  {
    sheet: "Wall slip",
    rows: (doc) => (doc.slip as Row[] | undefined) ?? [],
    columns: { Temperature: "temperature", "Wall shear stress": "wallShearStress", "Slip velocity": "slipVelocity", "± slip velocity (1 s.e.)": "slipVelocityStandardError", "Slip-corrected apparent rate": "shearRateApparentCorrected", "True wall shear rate": "shearRateWall", Viscosity: "viscosity", "R²": "r2" },
  },
  {
    sheet: "Melt-flow-rate point",
    rows: (doc) => (doc.meltFlowRate ? [doc.meltFlowRate as Row] : []),
    columns: { "Flow rate": "flowRate", Pressure: "pressure", "Apparent shear rate": "shearRateApparent", "Apparent wall stress": "wallShearStressApparent", "Apparent viscosity": "viscosityApparent" },
  },
];

/** "Viscosity [Pa·s]" → ["Viscosity", "Pa·s"]; a header without a unit is dimensionless: "R²" → ["R²", "-"]. */
function splitHeader(h: unknown): [string, string] | null {
  if (h === null || h === undefined || h === "") return null;
  const m = /^(.*) \[([^\]]*)\]$/.exec(String(h));
  return m ? [m[1] as string, m[2] as string] : [String(h), "-"];
}

/** A cell as a number (LibreOffice's CSV gives text), null when empty. */
function numeric(v: unknown): number | null {
  if (v === null || v === undefined || v === "") return null;
  if (typeof v === "number") return v;
  const n = Number(v);
  if (!Number.isFinite(n)) throw new Error(`not a number: ${JSON.stringify(v)}`);
  return n;
}

/**
 * Compares a sheet (rows of cells: title, header, data) with the JSON rows of `spec`; returns the
 * number of numbers compared. Every mapped column present in the sheet is compared, row by row,
 * within `tol`; a JSON null must be an empty cell and an empty cell a JSON null.
 */
export function compareSheet(sheet: unknown[][], spec: SheetSpec, doc: Doc, tol: { rel: number; abs: number }, reader: string): number {
  const header = sheet[1] ?? [];
  const expected = spec.rows(doc);
  const data = sheet.slice(2, 2 + expected.length);
  expect(`${reader} ${spec.sheet}: ${data.length} rows`).toBe(`${reader} ${spec.sheet}: ${expected.length} rows`);
  let compared = 0;
  header.forEach((h, c) => {
    const parts = splitHeader(h);
    if (!parts) return;
    const key = spec.columns[parts[0]];
    if (!key) return;
    const [factor, offset] = TO_SI[parts[1]] ?? [NaN, NaN];
    if (!Number.isFinite(factor)) throw new Error(`${reader} ${spec.sheet}: unit "${parts[1]}" of "${String(h)}" has no SI factor in this test`);
    expected.forEach((row, r) => {
      const want = row[key] as number | null | undefined;
      const got = numeric(data[r]?.[c]);
      const where = `${reader} ${spec.sheet} row ${r + 3} "${String(h)}"`;
      if (want === null || want === undefined) {
        expect(`${where}: ${got}`).toBe(`${where}: null`);
        return;
      }
      if (got === null) throw new Error(`${where}: empty, JSON has ${want}`);
      expectClose(got * factor + offset, want, tol, where);
      compared++;
    });
  });
  return compared;
}
