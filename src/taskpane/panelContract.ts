/**
 * The panel contract: what every panel of the task pane exports (src/taskpane/panels/<name>/),
 * and the one field-error type all panels throw. The registry (panels/index.ts) lists the panels;
 * the shell (taskpane.ts), the shared state (paneState.ts), the run-to-sheet flow (runToSheet.ts)
 * and preview mode read everything about a panel from its entry, so a new panel is a new folder
 * plus one line in the registry.
 */
import type { HostMode } from "./officeHost";

/** One field of a panel: the control an error marks, its label as shown, and its help line. */
export interface PanelField {
  /** id of the control marked invalid and focused (an input, a select, the first radio ...) */
  control: string;
  /** the words of the field's label, as the user sees them (messages speak of the field by it) */
  label: string;
  /** one line of help under the control ("" when the markup carries none) */
  help?: string;
}

/** What every panel exports. */
export interface PanePanel {
  /** stable id: the section's element id is `${id}-section` */
  readonly id: string;
  /** the section heading */
  readonly title: string;
  /** base names of the sheets one run writes, in order (the writer numbers them together) */
  readonly sheets: readonly string[];
  /** the fields a message can be shown next to; each has an error box `${fieldId}-error` */
  readonly fields: Readonly<Record<string, PanelField>>;
  /** the id of the panel's run button (its action bar); null for a panel without one */
  readonly runButton: string | null;
  /** attaches the panel's controls; called once */
  wire(): void;
  /**
   * Sets the panel up for the host: preview mode (bundled demo data, nothing written) or Excel.
   * Called once the host is known, and again when Excel answers after preview mode began.
   */
  applyMode(mode: HostMode): void;
}

/** One problem for one field. */
export interface FieldProblem {
  /** a field id of some panel's {@link PanePanel.fields} */
  field: string;
  message: string;
}

/**
 * The pane's one field-error type: one or several problems, each meant for one field, all shown
 * at once next to their fields. Panels throw it; the shell shows it (paneState.fail).
 */
export class PaneFieldError extends Error {
  readonly problems: readonly FieldProblem[];
  constructor(problems: FieldProblem | readonly FieldProblem[]) {
    const list = Array.isArray(problems) ? [...(problems as readonly FieldProblem[])] : [problems as FieldProblem];
    if (list.length === 0) throw new Error("PaneFieldError needs at least one problem");
    super(list.map((p) => p.message).join(" "));
    this.name = "PaneFieldError";
    this.problems = list;
  }

  /** The first problem's field (the one focused). */
  get field(): string {
    return (this.problems[0] as FieldProblem).field;
  }
}

/** A message as a sentence: capital first letter, full stop at the end. */
export function sentence(text: string): string {
  const t = text.trim();
  // a leading symbol ("b = …", "n′ …") keeps its case
  const first = /^\p{L}[\s=′']/u.test(t) ? t.charAt(0) : t.charAt(0).toUpperCase();
  return (first + t.slice(1)).replace(/([^.!?])$/, "$1.");
}

/**
 * What a core or reader error says, for the field it is shown next to: its detail (without the
 * argument name, which the field's label already gives) and its row, as a sentence.
 */
export function detailOf(error: { detail: string; row?: number | undefined }): string {
  return sentence(error.row !== undefined ? `Row ${error.row}: ${error.detail}` : error.detail);
}
