/**
 * The pane's test planner: the Planner panel's fields as typed, turned into the same settings
 * object `rheoledger plan` reads (src/io/planOptions.ts, bare numbers in the worksheet's default
 * units), planned by the core (src/core/planner.ts), and laid out as a sheet plan with the shared
 * plan tables (src/io/planTables.ts) and conditional formats on the range and barrel columns.
 * Pure: no DOM, no Office.
 */
import { PaneFieldError, detailOf } from "../../panelContract";
import { RheoError, type Warning } from "../../../core/errors";
import { planTest, type Plan } from "../../../core/planner";
import { PLAN_SHEET_UNITS, readPlanOptions } from "../../../io/planOptions";
import { planStepTable, planSummaryTable, RANGE_FLAG_TEXT } from "../../../io/planTables";
import { CellBlock, CellValue, ConditionalFormatSpec, SheetPlan, blockLayout } from "../../sheetPlan";

/** The Planner panel's fields, as typed (numbers in the units the labels give). */
export interface PlannerForm {
  /** barrel bore, mm */
  barrelDiameter: string;
  /** usable barrel length (piston travel), mm */
  usableLength: string;
  /** one die a line: "name, capillary|orifice, D mm, L mm" or "name, slit, W mm, H mm, L mm" */
  dies: string;
  /** one transducer a line: "name, full scale bar, accuracy %" (accuracy optional) */
  transducers: string;
  /** target apparent shear-rate range, 1/s, and the number of steps per die */
  shearRateMin: string;
  shearRateMax: string;
  points: string;
  prior: "power-law" | "model" | "mfr";
  /** power law: K in Pa·s^n, n */
  powerLawK: string;
  powerLawN: string;
  /** a fitted model: its id and "name=value, ..." parameters in SI */
  priorModel: string;
  priorParameters: string;
  /** MFR in g/10 min and its load in kg (power law with n assumed) */
  mfr: string;
  mfrLoad: string;
  /** minimum time per step, s */
  dwellTime: string;
  /** melt density, g/cm³ */
  density: string;
  /** melt compressibility, 1/GPa (optional: "" leaves the settling criterion off) */
  compressibility: string;
  /** time per barrel load (loading, compaction, preheating), min (optional) */
  timePerLoad: string;
}

/** The Planner panel's fields a message can be shown next to. */
export type PlannerFieldId =
  | "planBarrel"
  | "planUsableLength"
  | "planDies"
  | "planTransducers"
  | "planRateMin"
  | "planRateMax"
  | "planPoints"
  | "planPrior"
  | "planK"
  | "planN"
  | "planModel"
  | "planParameters"
  | "planMfr"
  | "planMfrLoad"
  | "planDwell"
  | "planDensity"
  | "planCompressibility"
  | "planTimePerLoad"
  | "planRun";

/** One-line explanations of the Planner panel's fields. */
export const PLANNER_HELP = {
  dies: "One die a line: name, capillary or orifice, bore D [mm], length L [mm]; or name, slit, width [mm], height [mm], length [mm].",
  transducers: "One transducer a line: name, full scale [bar], accuracy [% of full scale] (optional). The planner picks one per die.",
  prior: {
    "power-law": "A power law η = K·γ̇^(n−1) from an earlier test or a data sheet.",
    model: "A fitted model with its parameters in SI units; “Use the last fit” copies the best model of the last reduction.",
    mfr: "A power law through the melt-flow-rate point (standard die) with an assumed n = 0.4: a rough first guess.",
  },
  rates: "Target apparent shear-rate range; the steps are spaced evenly on a log scale.",
  dwell: "Minimum time per step; with the melt's compressibility a longer settling time may apply.",
} as const;

/** A problem for one Planner field. */
const plannerError = (field: PlannerFieldId, message: string) => new PaneFieldError({ field, message });

const splitLines = (text: string) => text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== "" && !l.startsWith("#"));
const parts = (line: string) => line.split(/[,;]/).map((p) => p.trim());

/** Die lines as the settings reader's die entries (sizes as typed: bare numbers are mm). */
export function readDieLines(text: string): Record<string, string>[] {
  const lines = splitLines(text);
  if (lines.length === 0) throw plannerError("planDies", "List at least one die, e.g. “L20, capillary, 1, 20”.");
  return lines.map((line, i) => {
    const [name = "", type = "", ...sizes] = parts(line);
    const kind = type.toLowerCase();
    const where = `Die line ${i + 1} (“${line}”)`;
    if (name === "") throw plannerError("planDies", `${where}: start with the die's name.`);
    if (kind === "slit") {
      if (sizes.length !== 3) throw plannerError("planDies", `${where}: a slit needs width, height and length in mm.`);
      return { name, type: kind, width: sizes[0] as string, height: sizes[1] as string, length: sizes[2] as string };
    }
    if (kind === "capillary" || kind === "orifice") {
      const min = kind === "orifice" ? 1 : 2;
      if (sizes.length < min || sizes.length > 2) throw plannerError("planDies", `${where}: ${kind === "orifice" ? "an orifice die needs its bore (and optionally its land length)" : "a capillary needs bore and length"} in mm.`);
      const entry: Record<string, string> = { name, type: kind, diameter: sizes[0] as string };
      if (sizes[1] !== undefined && sizes[1] !== "") entry.length = sizes[1];
      return entry;
    }
    throw plannerError("planDies", `${where}: the second item is the die type: capillary, orifice or slit.`);
  });
}

/** Transducer lines as the settings reader's entries (full scale in bar, accuracy in %). */
export function readTransducerLines(text: string): Record<string, string>[] {
  const lines = splitLines(text);
  if (lines.length === 0) throw plannerError("planTransducers", "List at least one transducer, e.g. “P200, 200, 0.25”.");
  return lines.map((line, i) => {
    const [name = "", fullScale = "", accuracy] = parts(line);
    if (name === "" || fullScale === "") throw plannerError("planTransducers", `Transducer line ${i + 1} (“${line}”): give name, full scale [bar] and, optionally, accuracy [%].`);
    const entry: Record<string, string> = { name, fullScale };
    // a bare accuracy is a percentage here (the label says so), never a fraction
    if (accuracy !== undefined && accuracy !== "") entry.accuracy = /%\s*$/.test(accuracy) ? accuracy : `${accuracy} %`;
    return entry;
  });
}

/** The settings object of the form, as `rheoledger plan` reads it (bare numbers: PLAN_SHEET_UNITS). */
export function plannerSettings(form: PlannerForm): Record<string, unknown> {
  const s: Record<string, unknown> = {
    barrelDiameter: form.barrelDiameter,
    usableLength: form.usableLength,
    density: form.density,
    dwellTime: form.dwellTime,
    shearRateMin: form.shearRateMin,
    shearRateMax: form.shearRateMax,
    points: form.points,
    rateBasis: "apparent",
    compressibility: form.compressibility,
    // the label asks for minutes; the reader's bare-number unit for times is seconds
    timePerLoad: /^\s*[-+]?[\d.,]+(e[-+]?\d+)?\s*$/i.test(form.timePerLoad) ? `${form.timePerLoad.trim()} min` : form.timePerLoad,
    dies: readDieLines(form.dies),
    transducers: readTransducerLines(form.transducers),
  };
  if (form.prior === "power-law") {
    const K = Number(form.powerLawK.replace(",", "."));
    const n = Number(form.powerLawN.replace(",", "."));
    if (form.powerLawK.trim() === "" || !(K > 0)) throw plannerError("planK", "Give K in Pa·s^n as a number greater than zero.");
    if (form.powerLawN.trim() === "" || !(n > 0)) throw plannerError("planN", "Give n as a number greater than zero (melts: 0.2–0.8).");
    s.priorModel = "power-law";
    s.priorParameters = { K, n };
  } else if (form.prior === "model") {
    if (form.priorModel.trim() === "") throw plannerError("planModel", "Choose a model, or press “Use the last fit”.");
    s.priorModel = form.priorModel;
    s.priorParameters = form.priorParameters;
  } else {
    s.mfr = form.mfr;
    s.mfrLoad = form.mfrLoad;
  }
  // "" means "not given": the reader skips it, and its own message names what is missing
  for (const [k, v] of Object.entries(s)) if (typeof v === "string" && v.trim() === "") delete s[k];
  return s;
}

/** The Planner field a reader or planner error concerns. */
export function plannerFieldOf(error: RheoError, prior: PlannerForm["prior"]): PlannerFieldId {
  const a = error.argument;
  if (/^dies/.test(a)) return "planDies";
  if (/^transducers/.test(a)) return "planTransducers";
  const map: Record<string, PlannerFieldId> = {
    barrelDiameter: "planBarrel",
    usableLength: "planUsableLength",
    usableVolume: "planUsableLength",
    shearRateMin: "planRateMin",
    shearRateMax: "planRateMax",
    points: "planPoints",
    mfr: "planMfr",
    mvr: "planMfr",
    mfrLoad: "planMfrLoad",
    density: prior === "mfr" && /MFR|melt flow/i.test(error.message) ? "planMfr" : "planDensity",
    dwellTime: "planDwell",
    compressibility: "planCompressibility",
    timePerLoad: "planTimePerLoad",
  };
  if (map[a]) return map[a] as PlannerFieldId;
  if (/^priorParameters|^parameters/.test(a)) return prior === "power-law" ? "planK" : "planParameters";
  if (a === "priorModel" || a === "model") return prior === "model" ? "planModel" : "planPrior";
  return "planRun";
}

/** A planned test, with what the method stamp needs. */
export interface PlannerOutput {
  plan: Plan;
  priorDescription: string;
  form: PlannerForm;
}

/**
 * Reads the form and plans the test with the core.
 * @throws PaneFieldError naming the field at fault.
 */
export function runPlanner(form: PlannerForm): PlannerOutput {
  try {
    const parsed = readPlanOptions(plannerSettings(form), PLAN_SHEET_UNITS);
    return { plan: planTest(parsed.input, parsed.options), priorDescription: parsed.priorDescription, form };
  } catch (error) {
    if (error instanceof RheoError) {
      throw plannerError(plannerFieldOf(error, form.prior), detailOf(error));
    }
    throw error;
  }
}

/** Fill and font colours of the flags (our palette: amber for caution, brick red for stop, teal for pass). */
export const FLAG_COLOURS = Object.freeze({
  pass: { fill: "#DCEFEC", font: "#0B3B39" },
  caution: { fill: "#FCE9C4", font: "#6B4200" },
  fail: { fill: "#F6D4D0", font: "#8A1C14" },
});

function stack(): { add: (b: Omit<CellBlock, "row" | "col">, gap?: number) => CellBlock; blocks: CellBlock[] } {
  const blocks: CellBlock[] = [];
  let row = 0;
  return {
    blocks,
    add(b, gap = 1) {
      const block = { ...b, row, col: 0 };
      blocks.push(block);
      row += blockLayout(block).rowCount + gap;
      return block;
    },
  };
}

function warningRows(warnings: readonly Warning[]): CellValue[][] {
  return warnings.length > 0 ? warnings.map((w) => [w.code, w.message]) : [["NONE", "No warnings."]];
}

/**
 * The "Rheo plan" sheet: the inputs, the per-die summary, the speed ladder of every die with its
 * out-of-range steps and barrel overruns flagged by conditional formatting, and the warnings.
 * Blocks: plan-title, plan-stamp, plan-inputs, plan-summary, plan-steps, plan-warnings.
 */
export function buildPlannerPlan(out: PlannerOutput, meta: { name: string; version: string; date: string }): SheetPlan {
  const s = stack();
  const f = out.form;
  s.add({ id: "plan-title", role: "heading", title: "Rheoledger test plan", rows: [] }, 0);
  s.add({ id: "plan-stamp", role: "text", rows: [[`Planned ${meta.date}; Rheoledger ${meta.version}. A planning estimate: the measured pressures decide.`]] });
  const prior = f.prior === "power-law" ? "power law (K, n)" : f.prior === "model" ? "fitted model" : "melt flow rate";
  s.add({
    id: "plan-inputs",
    role: "list",
    title: "Inputs",
    header: ["input", "value"],
    rows: [
      ["Barrel bore [mm]", f.barrelDiameter],
      ["Usable barrel length [mm]", f.usableLength],
      ["Target apparent shear rates [1/s]", `${f.shearRateMin} to ${f.shearRateMax}, ${f.points} steps per die`],
      ["Dwell per step [s]", f.dwellTime],
      ["Melt density [g/cm3]", f.density],
      ["Compressibility [1/GPa]", f.compressibility.trim() === "" ? "not given (dwell time only)" : f.compressibility],
      ["Time per load [min]", f.timePerLoad.trim() === "" ? "not counted" : f.timePerLoad],
      ["Prior viscosity", `${prior}: ${out.priorDescription}`],
      ["Dies", splitLines(f.dies).join(" | ")],
      ["Transducers", splitLines(f.transducers).join(" | ")],
    ],
  });
  const summary = planSummaryTable(out.plan);
  s.add({ id: "plan-summary", role: "table", title: "Per die (one barrel load each)", header: summary.header, rows: summary.rows, numberFormats: [null, null, "0", null, "0.00", "0.00", "0.00", "0.00", "0.0", "0.0"], keyColumns: [0, 1, 5, 8] });
  const steps = planStepTable(out.plan);
  const block = s.add({
    id: "plan-steps",
    role: "table",
    title: "Speed ladder (predicted)",
    header: steps.header,
    rows: steps.rows,
    numberFormats: [null, "0", "0.00", "0.00", "0.0", "0.000", "0.000", "0.000", "0.00", null, "0.0", null, "0", "0.000", "0.000", "0.00", null],
    // die, piston speed, pressure, range flag: what the operator sets and watches
    keyColumns: [0, 6, 8, 11],
  });
  s.add({ id: "plan-warnings", role: "list", title: `Warnings (${out.plan.warnings.length})`, header: ["code", "message"], rows: warningRows(out.plan.warnings) });
  const rangeColumn = steps.header.indexOf("range");
  const barrelColumn = steps.header.indexOf("in_barrel");
  const conditionalFormats: ConditionalFormatSpec[] = [
    {
      blockId: block.id,
      column: rangeColumn,
      firstRow: 0,
      rowCount: steps.rows.length,
      rules: [
        { text: RANGE_FLAG_TEXT.over, ...FLAG_COLOURS.fail, tone: "fail" },
        { text: RANGE_FLAG_TEXT.high, ...FLAG_COLOURS.caution, tone: "caution" },
        { text: RANGE_FLAG_TEXT.low, ...FLAG_COLOURS.caution, tone: "caution" },
      ],
    },
    { blockId: block.id, column: barrelColumn, firstRow: 0, rowCount: steps.rows.length, rules: [{ text: "NO", ...FLAG_COLOURS.fail, tone: "fail" }] },
  ];
  const widths = [16, 8, 12, 12, 12, 12, 12, 12, 12, 12, 10, 16, 10, 10, 10, 12, 16];
  return { name: meta.name, blocks: s.blocks, charts: [], conditionalFormats, columnWidths: widths };
}

export { stack as stackBlocks, warningRows };
