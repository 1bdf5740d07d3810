/**
 * The recording panel's settings: the barrel bore (for a recording of force without a
 * barrel_diameter column) and every step-detection setting of the shared reduce-settings table
 * (src/io/reduceOptions.ts, section "steps"), with their labels and help from
 * src/io/reduceSettingWords.ts. The form's text goes through the one reader of reduce settings
 * under the same keys as the command line and RHEO.REDUCE; a bare number is read in the setting's
 * display unit (shown in the label). Pure: no DOM.
 */
import { KEYED_SETTINGS_SOURCE, REDUCE_SETTINGS, STEP_SETTING_KEYS, collectReduceSettings, type ReduceRequest } from "../../../io/reduceOptions";
import { REDUCE_SETTING_WORDS } from "../../../io/reduceSettingWords";
import { detailOf, sentence, type FieldProblem } from "../../panelContract";

/** One field of the recording panel's settings. */
export interface TraceSettingField {
  /** the reduce setting key */
  key: string;
  /** control id (and field id: its error box is `${control}-error`) */
  control: string;
  /** the label as shown, with the unit a bare number is read in */
  label: string;
  help: string;
  /** a list of choices (first: the default), or null for a text field */
  choices: readonly { value: string; label: string }[] | null;
}

/** The keys the panel offers, in order: the barrel bore, then the step detection's settings. */
export const TRACE_SETTING_KEYS: readonly string[] = Object.freeze(["barrelDiameter", ...STEP_SETTING_KEYS]);

/** The control id of a setting. */
export const traceControlOf = (key: string) => `trace-${key}`;

const CHOICE_WORDS: Readonly<Record<string, string>> = Object.freeze({ exclude: "Leave them out (default)", keep: "Keep them, flagged" });

/** The panel's setting fields, built from the shared settings table and its words. */
export const TRACE_SETTING_FIELDS: readonly TraceSettingField[] = Object.freeze(
  TRACE_SETTING_KEYS.map((key): TraceSettingField => {
    const spec = REDUCE_SETTINGS.find((s) => s.key === key);
    const words = REDUCE_SETTING_WORDS[key];
    if (!spec || !words) throw new Error(`recording panel: no reduce setting "${key}"`);
    const unit = spec.kind.type === "quantity" ? spec.unit : undefined;
    const choices = spec.kind.type === "choice" ? spec.kind.choices.map((c) => ({ value: c, label: CHOICE_WORDS[c] ?? c })) : null;
    // the table's help speaks to every surface ("pressure recordings: …"); this panel is all about recordings
    const help = sentence(words.help.replace(/^pressure recordings: /, ""));
    return { key, control: traceControlOf(key), label: unit ? `${words.label} [${unit}]` : words.label, help, choices };
  }),
);

/**
 * Reads the form's values (by setting key, as typed; "" for a blank field) through the shared
 * reader, and returns the request with every problem, each for its field, all at once.
 * @example readTraceSettings({ minWindowTime: "8", unsteady: "keep" }).request.steps // { minWindowTime: 8, unsteady: "keep" }
 */
export function readTraceSettings(values: Readonly<Record<string, string>>): { request: ReduceRequest; problems: FieldProblem[] } {
  const record: Record<string, unknown> = {};
  for (const key of TRACE_SETTING_KEYS) {
    const v = values[key];
    if (v !== undefined && v.trim() !== "") record[key] = v.trim();
  }
  const { request, errors } = collectReduceSettings(record, KEYED_SETTINGS_SOURCE);
  const problems = errors.map((e): FieldProblem => (TRACE_SETTING_KEYS.includes(e.argument) ? { field: traceControlOf(e.argument), message: detailOf(e) } : { field: "traceRun", message: sentence(e.message) }));
  return { request, problems };
}
