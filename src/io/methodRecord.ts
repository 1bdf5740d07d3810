/**
 * The method record of a run as result tables (resultTables.ts), so that every writer renders it
 * like any other table: the results workbook's Method sheet and the HTML report's last section.
 * It says what was read (file name, size, SHA-256), by which program and version, when, with
 * which settings, through which equations (methodEquations.ts), with which warnings (severity
 * from the registry), and what a test report must state (reportItems.ts) with the fields the
 * data do not fill left empty for the user.
 */
import type { Warning } from "../core/errors";
import { SEVERITY_ORDER } from "../core/warningCodes";
import type { EquationLine } from "./methodEquations";
import type { ReportItemRow } from "./reportItems";
import type { ResultCell, ResultColumn, ResultTable } from "./resultTables";
import { describeWarning } from "./warningCatalog";

/** Everything the method record states. */
export interface MethodRecordInput {
  /** every input file: name as given, size in bytes and SHA-256 (hex) of its bytes */
  sources: { name: string; bytes: number; sha256: string }[];
  /** program name, version and the surface that ran it, e.g. "command line" */
  program: { name: string; version: string; surface: string };
  /** the command as typed (arguments), when run from the command line */
  command?: string;
  date: Date;
  /** counts of the run: rows read, used, groups, ... (label → number) */
  counts: readonly [label: string, value: number][];
  /** settings as label, value, and how it was set (the flag or field that gave it, or "default") */
  settings: readonly [label: string, value: ResultCell, given: string][];
  equations: readonly EquationLine[];
  reportItems: readonly ReportItemRow[];
  warnings: readonly Warning[];
  /** how the steps of a pressure recording were found, one line each (src/io/stepRecord.ts), when read from a recording */
  steps?: readonly string[];
}

const text = (key: string, header: string): ResultColumn => ({ key, header, unit: "", kind: "text" });

/** The method record's tables: run, settings, equations, report items, warnings. */
export function methodRecordTables(m: MethodRecordInput): ResultTable[] {
  const run: ResultCell[][] = [
    ["Program", `${m.program.name} ${m.program.version} (${m.program.surface})`],
    ["Date and time (UTC)", m.date.toISOString().replace("T", " ").replace(/\.\d+Z$/, " UTC")],
  ];
  if (m.command !== undefined) run.push(["Command", m.command]);
  for (const source of m.sources) {
    run.push(["Input file", source.name], ["Input file size", `${source.bytes} bytes`], ["Input file SHA-256", source.sha256]);
  }
  for (const [label, value] of m.counts) run.push([label, String(value)]);
  const sorted = [...m.warnings].sort((a, b) => SEVERITY_ORDER.indexOf(a.severity) - SEVERITY_ORDER.indexOf(b.severity));
  return [
    {
      id: "methodRun",
      title: "Method record",
      columns: [text("item", "Item"), text("value", "Value")],
      rows: run,
      notes: ["Written with the results; the SHA-256 identifies the exact input file (any change to the file changes it)."],
    },
    {
      id: "settings",
      title: "Settings",
      columns: [text("setting", "Setting"), text("value", "Value"), text("given", "Given by")],
      rows: m.settings.map(([label, value, given]) => [label, value === null ? "—" : typeof value === "number" ? String(Number(value.toPrecision(6))) : String(value), given]),
    },
    {
      id: "equations",
      title: "Equations and references of the steps used",
      columns: [text("step", "Step"), text("formula", "Formula"), text("reference", "Reference")],
      rows: m.equations.map((e) => [...e]),
    },
    ...(m.steps && m.steps.length > 0
      ? [
          {
            id: "stepMethod",
            title: "Steps of the pressure recording: how they were found",
            columns: [text("line", "Criterion or window")],
            rows: m.steps.map((l) => [l]),
            notes: ["Hand-set windows are listed beside the detected ones."],
          },
        ]
      : []),
    {
      id: "reportItems",
      title: "Test report items (ISO 11443, ASTM D3835)",
      columns: [text("item", "Item"), text("value", "Value"), text("source", "Source"), text("key", "Metadata key")],
      rows: m.reportItems.map((r) => [r.label, r.value, r.source, r.id]),
      notes: ["Empty values are left for the user: fill them in here, or give them in a JSON file with --meta (keys in the last column) and run again. Item list after the test-report clauses of ISO 11443 and ASTM D3835 (from memory; check against the standards)."],
    },
    {
      id: "methodWarnings",
      title: `Warnings (${m.warnings.length})`,
      columns: [text("severity", "Severity"), text("code", "Code"), text("title", "Title"), text("message", "Message")],
      rows: sorted.length > 0 ? sorted.map((w) => [w.severity, w.code, describeWarning(w.code).title, w.message]) : [["—", "NONE", "No warnings", "No warnings."]],
    },
  ];
}
