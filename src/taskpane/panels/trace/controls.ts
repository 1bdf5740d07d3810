/**
 * The recording panel's wiring: where the recording comes from (a range or table in Excel, the
 * invented demo recording in preview mode), the step settings (built from the shared settings
 * table, settings.ts), the run, and "move a window": a step chosen from a list, its window's start
 * and end typed, and a re-run that records the move in the method lines. Runs go through the
 * shared run-to-sheet flow. The computation: run.ts; the view: resultsView.ts; the sheets: sheets.ts.
 */
import type { WindowOverride } from "../../../core/steps/options";
import { DEMO_TRACE_LABEL, demoTraceCells } from "../../demoData";
import { excelBatch, readSelection, readSource, type HostMode } from "../../officeHost";
import { PaneFieldError, type FieldProblem } from "../../panelContract";
import { byId } from "../../paneDom";
import { fail, plainOfficeMessage, state } from "../../paneState";
import { runToSheet } from "../../runToSheet";
import { parseNumberField } from "../../settings";
import { traceResultsHtml, stepCounts } from "./resultsView";
import { runTrace, type TraceOutput } from "./run";
import { TRACE_SETTING_FIELDS } from "./settings";
import { buildCurvePlan, buildStepsPlan } from "./sheets";
import { moveWindow, resetWindow } from "./view";
import { tracePanel } from "./index";

/** The panel's session: the windows moved so far and the last run. */
const session: { windows: WindowOverride[]; last: TraceOutput | null } = { windows: [], last: null };

function el<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Record<string, string> = {}, text?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, v);
  if (text !== undefined) e.textContent = text;
  return e;
}

/** One labelled control per step setting, with its help and its error box. */
function renderSettings(container: HTMLElement): void {
  container.replaceChildren(
    ...TRACE_SETTING_FIELDS.map((f) => {
      const wrap = el("div", { class: "field" });
      wrap.append(el("label", { for: f.control }, f.label));
      const described = `${f.control}-help ${f.control}-error`;
      if (f.choices) {
        const select = el("select", { id: f.control, "aria-describedby": described });
        for (const c of f.choices) select.append(new Option(c.label, c.value));
        wrap.append(select);
      } else {
        wrap.append(el("input", { id: f.control, type: "text", inputmode: "decimal", autocomplete: "off", spellcheck: "false", placeholder: "default", "aria-describedby": described }));
      }
      const error = el("p", { class: "error", id: `${f.control}-error` });
      error.hidden = true;
      wrap.append(el("p", { class: "help", id: `${f.control}-help` }, f.help), error);
      return wrap;
    }),
  );
}

/** The form's settings by key, as typed. */
function settingsNow(): Record<string, string> {
  return Object.fromEntries(TRACE_SETTING_FIELDS.map((f) => [f.key, byId<HTMLInputElement | HTMLSelectElement>(f.control).value]));
}

/** The recording: the demo in preview mode, else the range or table named in the source field. */
async function recording(): Promise<{ cells: unknown[][]; label: string }> {
  if (state.mode.kind === "preview") return { cells: demoTraceCells(), label: DEMO_TRACE_LABEL };
  const text = byId<HTMLInputElement>("traceSource").value.trim();
  if (text === "") throw new PaneFieldError({ field: "traceSource", message: "Give the recording's range (e.g. Recording!A1:G2400) or table name, or press Use selection." });
  const read = await readSource(excelBatch, text).catch((e: unknown) => {
    throw new PaneFieldError({ field: "traceSource", message: plainOfficeMessage(e instanceof Error ? e : new Error(String(e))) });
  });
  return { cells: read.values, label: read.address };
}

/** The step chosen in the move form, as [run, step], or null. */
function chosenStep(): [number, number] | null {
  const v = byId<HTMLSelectElement>("traceStep").value;
  const m = /^(\d+):(\d+)$/.exec(v);
  return m ? [Number(m[1]), Number(m[2])] : null;
}

/** The window typed in the move form for the chosen step. @throws PaneFieldError for each bad field */
export function typedWindow(): WindowOverride {
  const step = chosenStep();
  const problems: FieldProblem[] = [];
  if (!step) problems.push({ field: "traceStep", message: "Run the detection first, then choose a step." });
  const read = (id: "traceStart" | "traceEnd", what: string) => {
    const v = parseNumberField(byId<HTMLInputElement>(id).value);
    if (v === null || Number.isNaN(v)) problems.push({ field: id, message: `Give the window's ${what} in seconds, on the die run's own clock.` });
    return v ?? NaN;
  };
  const start = read("traceStart", "start");
  const end = read("traceEnd", "end");
  if (problems.length === 0 && !(end > start)) problems.push({ field: "traceEnd", message: `The window must end after it starts (${start} s).` });
  if (problems.length > 0) throw new PaneFieldError(problems);
  const [run, s] = step as [number, number];
  return { run, step: s, start, end };
}

/** Fills the move form from the last run, keeping the chosen step. */
function offerSteps(out: TraceOutput, keep: string | null): void {
  const select = byId<HTMLSelectElement>("traceStep");
  select.replaceChildren(
    ...out.view.trace.runs.flatMap((r) =>
      r.steps.map((s) => new Option(`Die run ${r.run}, step ${s.step}: ${Number((s.pistonSpeed * 6e4).toPrecision(3))} mm/min${s.steady ? "" : " (not steady)"}${s.window === "set" ? " (moved)" : ""}`, `${r.run}:${s.step}`)),
    ),
  );
  if (keep && Array.from(select.options).some((o) => o.value === keep)) select.value = keep;
  byId("trace-move").hidden = false;
  fillWindow();
}

/** Puts the chosen step's current window into the start and end fields. */
function fillWindow(): void {
  const chosen = chosenStep();
  const step = chosen ? session.last?.view.trace.runs[chosen[0] - 1]?.steps[chosen[1] - 1] : undefined;
  if (!step) return;
  byId<HTMLInputElement>("traceStart").value = String(Number(step.start.toPrecision(5)));
  byId<HTMLInputElement>("traceEnd").value = String(Number(step.end.toPrecision(5)));
  byId<HTMLButtonElement>("traceReset").disabled = step.window !== "set";
}

/** Runs the detection (with `change` applied to the moved windows; kept only when the run succeeds). */
function run(change?: (windows: WindowOverride[]) => WindowOverride[]): Promise<void> {
  const keep = byId<HTMLSelectElement>("traceStep").value || null;
  return runToSheet({
    panel: tracePanel,
    statusId: "trace-status",
    resultsId: "trace-results",
    working: "Finding the steps…",
    compute: async () => {
      const windows = change ? change(session.windows) : session.windows;
      const { cells, label } = await recording();
      return runTrace({ cells, label, settings: settingsNow(), windows });
    },
    plans: (out, [steps, curve], meta) => {
      const m = { ...meta, names: { steps: steps as string, curve: curve as string } };
      return [buildStepsPlan(out, m), buildCurvePlan(out, m)];
    },
    render: (out, plans, written) => traceResultsHtml(out, plans, written),
    done: (out, written) => {
      const c = stepCounts(out);
      const what = `${c.runs} die run(s), ${c.steps} step(s), ${c.notSteady} not steady; ${out.reduction ? `flow curve of ${out.reduction.result.groups.length} group(s)` : "no flow curve"}; ${out.warnings.length} warning(s).`;
      return written ? `Done: wrote “${written[0]}” and “${written[1]}”: ${what}` : `Preview ready: ${what}`;
    },
    after: (out) => {
      session.windows = out.windows;
      session.last = out;
      offerSteps(out, keep);
    },
  });
}

/** Attaches the panel's controls. */
export function wireTrace(): void {
  renderSettings(byId("trace-settings"));
  byId("traceRun").addEventListener("click", () => void run());
  byId("traceStep").addEventListener("change", fillWindow);
  byId("traceMove").addEventListener("click", () => void run((windows) => moveWindow(windows, typedWindow())));
  byId("traceReset").addEventListener("click", () => {
    const chosen = chosenStep();
    if (chosen) void run((windows) => resetWindow(windows, chosen[0], chosen[1]));
  });
  byId("trace-use-selection").addEventListener("click", () => {
    readSelection(excelBatch)
      .then((read) => {
        byId<HTMLInputElement>("traceSource").value = read.address;
      })
      .catch((e: unknown) => fail(e, "traceSource"));
  });
}

/** Preview mode: the invented demo recording; in Excel, a range or table. Moved windows start afresh. */
export function traceMode(mode: HostMode): void {
  const preview = mode.kind === "preview";
  const source = byId<HTMLInputElement>("traceSource");
  source.readOnly = preview;
  source.value = preview ? DEMO_TRACE_LABEL : "";
  byId<HTMLButtonElement>("trace-use-selection").disabled = preview;
  byId("traceRun").textContent = preview ? "Find the steps of the demo recording" : "Find the steps into new sheets";
  session.windows = [];
  session.last = null;
  byId("trace-move").hidden = true;
  byId("trace-results").replaceChildren();
}
