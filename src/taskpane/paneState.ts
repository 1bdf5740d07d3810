/**
 * What the pane's panels share: the state of the session (host mode, the data read, the settings,
 * the last reduction), the busy switch over every run button, and turning a failure into an
 * inline field error. The panels' own wiring lives in reductionControls.ts, plannerControls.ts,
 * lotControls.ts and shareControls.ts.
 */
import type { ColumnChoice, DieEntry } from "./columns";
import type { HostMode } from "./officeHost";
import { PaneFieldError, type FieldProblem, type PanePanel } from "./panelContract";
import { byId } from "./paneDom";
import { RunOutput, groupLabel, toFieldError } from "./runReduction";
import { DEFAULT_PANE_SETTINGS, PaneSettings } from "./settings";
import { recommendedFit } from "./recommendedFit";
import { ADDIN_VERSION } from "./version";

export interface PaneState {
  mode: HostMode;
  cells: unknown[][] | null;
  sourceLabel: string;
  columns: ColumnChoice[];
  dies: DieEntry[];
  settings: PaneSettings;
  busy: boolean;
  /** the last reduction (its flow curves and best fits feed the Planner and the Lot check) */
  lastRun: RunOutput | null;
  /** the panels of the registry (panels/index.ts), handed over by the shell */
  panels: readonly PanePanel[];
}

/** The pane's one session state (a module singleton: the pane is a single page). */
export const state: PaneState = {
  mode: { kind: "preview", reason: "starting" },
  cells: null,
  sourceLabel: "",
  columns: [],
  dies: [],
  settings: { ...DEFAULT_PANE_SETTINGS, models: [...DEFAULT_PANE_SETTINGS.models] },
  busy: false,
  lastRun: null,
  panels: [],
};

/** Lets the browser repaint between steps of a run. */
export const pause = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

/** A local date and time as an engineer writes it in a log: "2025-03-14 09:26". */
export function localStamp(d: Date): string {
  const two = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())} ${two(d.getHours())}:${two(d.getMinutes())}`;
}

/** Version and local date-time stamped on every sheet a run writes. */
export const panelMeta = () => ({ version: ADDIN_VERSION, date: localStamp(new Date()) });

/** The panel owning `field` and the field's entry, from the registry. */
export function fieldEntry(field: string): { panel: PanePanel; control: string } | null {
  for (const panel of state.panels) {
    const f = panel.fields[field];
    if (f) return { panel, control: f.control };
  }
  return null;
}

/**
 * Shows every problem next to its field (the box `${field}-error`), marks each field's control
 * invalid, and focuses the first. A problem for a field no panel lists goes to `fallback`.
 */
export function showProblems(problems: readonly FieldProblem[], fallback: string): void {
  const shown = new Map<string, string[]>();
  for (const p of problems) {
    const field = fieldEntry(p.field) && document.getElementById(`${p.field}-error`) ? p.field : fallback;
    shown.set(field, [...(shown.get(field) ?? []), p.message]);
  }
  let first: HTMLElement | null = null;
  for (const [field, messages] of shown) {
    const box = byId(`${field}-error`);
    box.textContent = messages.join(" ");
    box.hidden = false;
    const entry = fieldEntry(field);
    const control = document.getElementById(entry?.control ?? field);
    if (control && control.matches("input, select, textarea")) control.setAttribute("aria-invalid", "true");
    // the first in page order gets the focus
    const earlier = first !== null && control !== null && (first.compareDocumentPosition(control) & Node.DOCUMENT_POSITION_PRECEDING) !== 0;
    if (control instanceof HTMLDetailsElement) control.open = true;
    // the field's own part of the form must be open to be seen
    const fold = control?.closest("details.form-fold");
    if (fold instanceof HTMLDetailsElement) fold.open = true;
    if (first === null || earlier) first = control;
  }
  if (first) focusControl(first);
}

/**
 * Shows `error` next to the field(s) it concerns: a {@link PaneFieldError} or a core error at its
 * fields, an Office failure next to `runField` (the panel's run button) in plain words.
 */
export function fail(error: unknown, runField: string): void {
  const fieldError =
    error instanceof PaneFieldError || !(error instanceof Error) || error.name === "RheoError"
      ? toFieldError(error)
      : new PaneFieldError({ field: runField, message: plainOfficeMessage(error) });
  showProblems(fieldError.problems.map((p) => (p.field === "run" ? { ...p, field: runField } : p)), runField);
}

function focusControl(control: HTMLElement): void {
  const focusable = control.matches("input, select, button, textarea") ? control : control.querySelector<HTMLElement>("summary, input, select, button, textarea");
  focusable?.focus();
}

/** An Office error in plain words. */
export function plainOfficeMessage(error: Error): string {
  const text = error.message || String(error);
  if (/ItemNotFound|doesn't exist|does not exist/i.test(text)) return `Excel could not find that range or table: ${text}`;
  if (/InvalidArgument|not valid/i.test(text)) return `Excel did not accept the address: ${text}`;
  return `Excel reported a problem, and nothing was written: ${text}`;
}

/**
 * Enables or disables every panel's run button at once (one run at a time), and the buttons that
 * need Excel or the last reduction.
 */
export function setBusy(busy: boolean): void {
  state.busy = busy;
  const preview = state.mode.kind === "preview";
  for (const panel of state.panels) {
    if (!panel.runButton) continue;
    const button = document.getElementById(panel.runButton) as HTMLButtonElement | null;
    if (!button) continue;
    button.disabled = busy || (preview && button.dataset.needsExcel === "true");
    button.setAttribute("aria-busy", String(busy));
  }
  for (const id of ["read-columns", "use-selection"]) {
    const b = document.getElementById(id) as HTMLButtonElement | null;
    if (b) b.disabled = busy || (preview && b.dataset.needsExcel === "true");
  }
  for (const id of ["plan-use-fit", "lot-use-fit"]) {
    const b = document.getElementById(id) as HTMLButtonElement | null;
    if (b) b.disabled = busy || bestFit() === null;
  }
}

/** The host mode, recorded where every panel and the page's styles can see it. */
export function setMode(mode: HostMode): void {
  state.mode = mode;
  document.body.dataset.mode = mode.kind;
}

/** The best model (lowest AIC) of the last reduction's first fitted group, or null. */
export function bestFit(): { model: string; parameters: Record<string, number>; label: string } | null {
  const run = state.lastRun;
  if (!run) return null;
  for (const [i, f] of run.fits.entries()) {
    const best = recommendedFit(f)?.fit;
    const g = run.result.groups[i];
    if (best && g) return { model: best.model, parameters: best.result.parameters, label: groupLabel(g) };
  }
  return null;
}

/** Model parameters as `name=value, …` (6 significant digits), the form the prior fields read. */
export const parameterText = (p: Record<string, number>) => Object.entries(p).map(([k, v]) => `${k}=${Number(v.toPrecision(6))}`).join(", ");
