/**
 * What the pane's panels share: the state of the session (host mode, the data read, the settings,
 * the last reduction), the busy switch over every run button, and turning a failure into an
 * inline field error. The panels' own wiring lives in reductionControls.ts, plannerControls.ts,
 * lotControls.ts and shareControls.ts.
 */
import type { ColumnChoice, DieEntry } from "./columns";
import { LotError } from "./lotPanel";
import type { HostMode } from "./officeHost";
import { byId, showFieldError } from "./paneDom";
import { PlannerError } from "./plannerPanel";
import { PaneError, RunOutput, groupLabel, toFieldError } from "./runReduction";
import { DEFAULT_PANE_SETTINGS, FieldId, PaneSettings } from "./settings";
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
};

/** Lets the browser repaint between steps of a run. */
export const pause = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

/** Version and date stamped on every sheet a run writes. */
export const panelMeta = () => ({ version: ADDIN_VERSION, date: new Date().toISOString() });

/** Shows `error` next to the control it concerns (`fallback` for an Office failure) and focuses it. */
export function fail(error: unknown, fallback: FieldId): void {
  if (error instanceof PlannerError || error instanceof LotError) {
    focusControl(showFieldError(error.field, error.message));
    return;
  }
  const f = error instanceof PaneError || !(error instanceof Error) || error.name === "RheoError" ? toFieldError(error) : { field: fallback, message: plainOfficeMessage(error) };
  focusControl(showFieldError(f.field, f.message));
}

function focusControl(control: HTMLElement): void {
  const focusable = control.matches("input, select, button, textarea") ? control : control.querySelector<HTMLElement>("input, select, button, textarea");
  focusable?.focus();
}

/** An Office failure of a panel as a message next to its run button. */
export function failPanel(error: unknown, runField: "planRun" | "lotRun"): void {
  if (error instanceof PlannerError || error instanceof LotError || !(error instanceof Error)) fail(error, "run");
  else focusControl(showFieldError(runField, plainOfficeMessage(error)));
}

/** An Office error in plain words. */
export function plainOfficeMessage(error: Error): string {
  const text = error.message || String(error);
  if (/ItemNotFound|doesn't exist|does not exist/i.test(text)) return `Excel could not find that range or table: ${text}`;
  if (/InvalidArgument|not valid/i.test(text)) return `Excel did not accept the address: ${text}`;
  return `Excel reported a problem, and nothing was written: ${text}`;
}

/** Enables or disables every run button at once (one run at a time). */
export function setBusy(busy: boolean): void {
  state.busy = busy;
  for (const id of ["run", "share", "read-columns", "use-selection"]) byId<HTMLButtonElement>(id).disabled = busy || (id !== "run" && id !== "read-columns" && state.mode.kind === "preview");
  for (const id of ["planRun", "lotRun"]) byId<HTMLButtonElement>(id).disabled = busy;
  for (const id of ["plan-use-fit", "lot-use-fit"]) byId<HTMLButtonElement>(id).disabled = busy || bestFit() === null;
  byId("run").setAttribute("aria-busy", String(busy));
}

/** The best model (lowest AIC) of the last reduction's first fitted group, or null. */
export function bestFit(): { model: string; parameters: Record<string, number>; label: string } | null {
  const run = state.lastRun;
  if (!run) return null;
  for (const [i, f] of run.fits.entries()) {
    const best = f.compare?.ranked[0];
    const g = run.result.groups[i];
    if (best && g) return { model: best.model, parameters: best.result.parameters, label: groupLabel(g) };
  }
  return null;
}

/** Model parameters as `name=value, …` (6 significant digits), the form the prior fields read. */
export const parameterText = (p: Record<string, number>) => Object.entries(p).map(([k, v]) => `${k}=${Number(v.toPrecision(6))}`).join(", ");
