/**
 * The files `rheoledger reduce` writes: the results workbook (`--out FILE.xlsx`) and the HTML
 * report (`--report FILE.html`), both rendered from the run's result tables and its method
 * record, both written through safeWrite.ts (never over an existing file without `--force`, never
 * onto an input or through a symlink, all or nothing). `--meta FILE.json` fills the test-report
 * items the data do not say. The writers are loaded only when a file is written (exceljs is large).
 */
import { sha256 } from "./sha256";
import { RheoError, type Warning } from "../core/errors";
import { DEFAULT_REDUCE_OPTIONS } from "../core/reduce";
import { DEFAULT_RABINOWITSCH_OPTIONS } from "../core/rabinowitsch";
import { finiteTables } from "../io/finiteTables";
import { equationsUsed } from "../io/methodEquations";
import { methodRecordTables } from "../io/methodRecord";
import { stepMethodLines } from "../io/stepRecord";
import { REDUCE_SETTINGS, REDUCE_SETTING_DEFAULTS } from "../io/reduceOptions";
import { REDUCE_SETTING_WORDS } from "../io/reduceSettingWords";
import { readReportMeta, reportItems, type ReportMeta } from "../io/reportItems";
import { resultTables, type ResultTable } from "../io/resultTables";
import pkg from "../../package.json";
import type { ParsedArgs } from "./args";
import { readInputFile, type CliIO, type OutputOptions } from "./io";
import { settingsFromFlags, type CommandOutput } from "./reduceCommand";

/** The files asked for, checked before the reduction runs. */
export interface OutputPlan {
  out?: string;
  report?: string;
  meta: ReportMeta;
  metaFile?: string;
  force: boolean;
}

/**
 * Reads and checks the output flags: names and extensions, `--meta`, and (through `io.checkOutput`)
 * that each path may be written. Nothing is written here.
 * @returns the plan, or a usage message (exit status 2) for a wrong extension or a lonely flag
 * @throws RheoError for a path that may not be written or an unreadable or invalid `--meta` file
 */
export function planOutputs(args: ParsedArgs, input: string | readonly string[], io: CliIO): OutputPlan | { usage: string } {
  const out = args.flags.get("out");
  const report = args.flags.get("report");
  const meta = args.flags.get("meta");
  const force = args.flags.has("force");
  if (typeof out === "string" && !/\.xlsx$/i.test(out)) return { usage: `--out: expected a file name ending in .xlsx, got "${out}"` };
  if (typeof report === "string" && !/\.html?$/i.test(report)) return { usage: `--report: expected a file name ending in .html, got "${report}"` };
  if (typeof out !== "string" && typeof report !== "string") {
    for (const f of ["meta", "force"]) if (args.flags.has(f)) return { usage: `--${f}: applies only with --out or --report` };
  }
  if (typeof out === "string" && typeof report === "string" && out === report) return { usage: "--out and --report name the same file" };
  const plan: OutputPlan = { meta: {}, force };
  if (typeof meta === "string") {
    let raw: unknown;
    const text = readInputFile(io, meta);
    try {
      raw = JSON.parse(text);
    } catch (e) {
      throw new RheoError("value", `--meta ${meta}`, `is not valid JSON: ${(e as Error).message}`);
    }
    plan.meta = readReportMeta(raw, `--meta ${meta}`);
    plan.metaFile = meta;
  }
  const inputs = [...(typeof input === "string" ? [input] : input), ...(plan.metaFile ? [plan.metaFile] : [])];
  if (typeof out === "string") {
    io.checkOutput?.(out, { flag: "--out", force, inputs });
    plan.out = out;
  }
  if (typeof report === "string") {
    io.checkOutput?.(report, { flag: "--report", force, inputs });
    plan.report = report;
  }
  return plan;
}

/** Facts the data and settings give for the test-report items. */
function reportFacts(out: CommandOutput, args: ParsedArgs): Record<string, { value: string; source: "data" | "settings" }> {
  const groups = out.result.groups;
  const facts: Record<string, { value: string; source: "data" | "settings" }> = {};
  const mm = (m: number) => `${Number((m * 1e3).toPrecision(6))}`;
  const temps = [...new Set(groups.map((g) => g.temperature).filter((t): t is number => t !== null).map((t) => Number((t - 273.15).toFixed(2))))].sort((a, b) => a - b);
  if (temps.length > 0) facts.testTemperatures = { value: `${temps.join(", ")} °C`, source: "data" };
  const dies = new Map<string, string>();
  for (const g of groups) {
    const bore = g.geometry === "slit" ? `slit ${mm(g.slitWidth as number)} × ${mm(g.slitHeight as number)} mm` : `D ${mm(g.dieDiameter)} mm`;
    const lengths = g.dies.map((d) => `${mm(d.dieLength)} mm (${g.geometry === "slit" ? "L/H" : "L/D"} ${Number((g.geometry === "slit" ? d.lengthOverRadius : d.lengthOverRadius / 2).toPrecision(3))}${d.orifice ? ", orifice" : ""})`);
    dies.set(bore, `${bore}: L ${lengths.join(", ")}`);
  }
  if (dies.size > 0) facts.dieGeometry = { value: [...dies.values()].join("; "), source: "data" };
  const barrel = args.flags.get("barrel-diameter");
  const barrelColumn = out.input?.columns.find((c) => c.name === "barrel_diameter");
  if (typeof barrel === "string") facts.barrelDiameter = { value: barrel, source: "settings" };
  else if (barrelColumn) facts.barrelDiameter = { value: `per row, column "${barrelColumn.header}"`, source: "data" };
  const transducer = args.flags.get("transducer");
  if (typeof transducer === "string") facts.transducer = { value: `full scale and accuracy ${transducer}`, source: "settings" };
  const end = out.options.endCorrection ?? DEFAULT_REDUCE_OPTIONS.endCorrection;
  const rab = { ...DEFAULT_RABINOWITSCH_OPTIONS, ...out.options.rabinowitsch };
  const corrections = [end === "bagley" ? "Bagley end correction" : end === "orifice" ? "orifice-die end correction" : "no end correction", `Rabinowitsch (${rab.method} slope)`];
  if (out.options.slip) corrections.push("Mooney slip analysis");
  facts.corrections = { value: corrections.join("; "), source: "settings" };
  return facts;
}

/** Every command-line reduce setting: its label, the value used, and whether it was given or is the default. */
function settingsRows(args: ParsedArgs): [string, string, string][] {
  const given = settingsFromFlags(args);
  return REDUCE_SETTINGS.filter((spec) => spec.flag !== null).map((spec) => {
    const label = REDUCE_SETTING_WORDS[spec.key]?.label ?? spec.key;
    const value = given[spec.key];
    if (value !== undefined) return [label, value === true ? "on" : String(value), `--${spec.flag}`];
    const fallback = REDUCE_SETTING_DEFAULTS[spec.key];
    return [label, fallback === undefined ? (spec.kind.type === "switch" ? "off" : "—") : String(fallback), "default"];
  });
}

/** SHA-256 and size of the input, from the file's bytes when the surroundings can hash it. */
function digestOf(io: CliIO, file: string): { sha256: string; bytes: number } {
  const d = io.fileDigest?.(file);
  if (d) return d;
  const bytes = Buffer.from(io.readFile(file), "utf8");
  return { sha256: sha256().update(bytes).digest("hex"), bytes: bytes.length };
}

/** The run's tables (src/io/resultTables.ts) and its method record, ready for any writer, and the warnings writing them raised. */
export function runDocument(out: CommandOutput, ctx: { file: string; files?: readonly string[]; args: ParsedArgs; argv: string[]; io: CliIO; plan: OutputPlan; date: Date }): { tables: ResultTable[]; method: ResultTable[]; warnings: Warning[] } {
  const { run } = out;
  const finite = finiteTables(resultTables(run));
  const warnings = [...run.warnings, ...finite.warnings];
  const rab = { ...DEFAULT_RABINOWITSCH_OPTIONS, ...out.options.rabinowitsch };
  const flowColumn = out.input?.columns.find((c) => c.name === "flow_rate" || c.name === "piston_speed" || c.name === "mass_rate")?.name as "flow_rate" | "piston_speed" | "mass_rate" | undefined;
  const fitted = new Set([...(run.modelFits ?? []).map((f) => f.model), ...(run.comparisons ?? []).flatMap((c) => c.ranked.map((r) => r.model))]);
  const method = methodRecordTables({
    sources: (ctx.files ?? [ctx.file]).map((name) => ({ name, ...digestOf(ctx.io, name) })),
    program: { name: "Rheoledger", version: pkg.version, surface: "command line" },
    command: ["rheoledger", ...ctx.argv].map((a) => (/^[\w./=:,+-]+$/.test(a) ? a : `"${a.replace(/(["\\$`])/g, "\\$1")}"`)).join(" "),
    date: ctx.date,
    counts: [
      ...(out.input
        ? ([
            ["Data rows used", out.input.measurements.length],
            ["Data rows skipped (blank)", out.input.skippedRows.length],
          ] as [string, number][])
        : ([["Die runs of the recording", out.run.steps?.runs.length ?? 0]] as [string, number][])),
      ["Groups (temperature, die)", out.result.groups.length],
      ["Flow-curve points", out.result.groups.reduce((n, g) => n + g.flowCurve.length, 0)],
    ],
    settings: settingsRows(ctx.args),
    equations: equationsUsed({ result: out.result, endCorrection: out.options.endCorrection ?? DEFAULT_REDUCE_OPTIONS.endCorrection, rabinowitschMethod: rab.method, flowSource: flowColumn ?? null, fittedModels: [...fitted], shiftLaw: run.shift?.fit.law ?? null, shiftDetail: run.shift ? { C2Source: run.shift.fit.law === "wlf" ? run.shift.fit.C2Source : undefined, verticalShift: run.shift.fit.verticalShift } : undefined, master: run.master ? { model: run.master.model, law: run.master.law } : null, joined: run.joined ? { kind: run.joined.join.warnings.some((w) => w.code === "COX_MERZ_APPLIED") ? "oscillatory" : "steady" } : null }),
    reportItems: reportItems(reportFacts(out, ctx.args), ctx.plan.meta),
    warnings,
    ...(run.steps ? { steps: stepMethodLines(run.steps) } : {}),
  });
  return { tables: finite.tables, method, warnings: finite.warnings };
}

/**
 * Writes the planned files, then the command's standard output and where the files went.
 * Returns the exit status (1 when a file could not be written: the message names it).
 */
export async function writeReduceOutputs(out: CommandOutput, ctx: { file: string; files?: readonly string[]; args: ParsedArgs; argv: string[]; io: CliIO; plan: OutputPlan }): Promise<number> {
  const { io, plan } = ctx;
  if (!io.writeFile) {
    io.stderr("rheoledger: this surface cannot write files\n");
    return 1;
  }
  const date = new Date();
  const doc = runDocument(out, { ...ctx, date });
  const options = (flag: string): OutputOptions => ({ flag, force: plan.force, inputs: [...(ctx.files ?? [ctx.file]), ...(plan.metaFile ? [plan.metaFile] : [])] });
  const notes: string[] = [];
  try {
    if (plan.out) {
      const { resultsWorkbookBytes } = await import("../io/resultsWorkbook");
      const book = await resultsWorkbookBytes({ tables: doc.tables, method: doc.method, title: `Rheoledger results: ${ctx.file}`, created: date });
      io.writeFile(plan.out, book.bytes, options("--out"));
      notes.push(`Results workbook written to ${plan.out}`);
    }
    if (plan.report) {
      const { htmlReport } = await import("../io/htmlReport");
      const report = htmlReport({ title: `Rheoledger results: ${ctx.file}`, subtitle: `Rheoledger ${pkg.version}, command line, ${date.toISOString().slice(0, 16).replace("T", " ")} UTC`, tables: doc.tables, method: doc.method }, [...out.run.warnings, ...doc.warnings]);
      io.writeFile(plan.report, report.html, options("--report"));
      notes.push(`Report written to ${plan.report}`);
    }
  } catch (e) {
    if (!(e instanceof RheoError)) throw e;
    for (const n of notes) io.stderr(`${n}\n`);
    io.stderr(`rheoledger: ${e.message}\n`);
    return 1;
  }
  io.stdout(out.stdout);
  for (const w of doc.warnings) io.stderr(`rheoledger: warning [${w.code}] ${w.message}\n`);
  // keep standard output one JSON document: the notes go to standard error then
  for (const n of notes) {
    if (ctx.args.flags.has("json")) io.stderr(`${n}\n`);
    else io.stdout(`${n}\n`);
  }
  return 0;
}
