/**
 * The items a capillary-rheometry test report should state, after the test-report clauses of
 * ISO 11443 (clause "Test report") and ASTM D3835 ("Report"); item list from memory of those
 * clauses, to be checked against the standards' text. Each item is filled from the data or the
 * settings where they say it, from the user's metadata file (`--meta FILE.json`, keys = item ids)
 * where not, and otherwise left empty for the user to fill in.
 */
import { RheoError } from "../core/errors";
import { xmlSafeText } from "./cellText";

/** One report item: its key in the metadata file and its plain label. */
export interface ReportItemSpec {
  id: string;
  label: string;
  /** an example value, shown in the help and the docs */
  example: string;
}

/** Every report item, in report order (the keys `--meta` accepts). */
export const REPORT_ITEMS: readonly ReportItemSpec[] = Object.freeze([
  { id: "standard", label: "Standard and method followed", example: "ISO 11443:2014, method A2 (capillary, piston-driven)" },
  { id: "laboratory", label: "Laboratory and operator", example: "Polymer lab, bench 2; J. Doe" },
  { id: "testDate", label: "Date of test", example: "2024-03-14" },
  { id: "instrument", label: "Rheometer (type and identification)", example: "twin-bore capillary rheometer, asset no. 1234" },
  { id: "material", label: "Material: designation, grade and lot", example: "invented LDPE film grade, lot 24-017" },
  { id: "conditioning", label: "Sample preparation, conditioning and drying", example: "pellets dried 4 h at 80 °C; moisture 0.02 %" },
  { id: "preheatTime", label: "Preheat (melting) time before the first reading", example: "6 min" },
  { id: "testTemperatures", label: "Test temperature(s)", example: "190, 210, 230 °C" },
  { id: "dieGeometry", label: "Dies: bore, land length, L/D", example: "D 1 mm; L 10, 20, 30 mm" },
  { id: "dieEntryAngle", label: "Die entry angle", example: "180° (flat entry)" },
  { id: "barrelDiameter", label: "Barrel bore", example: "15 mm" },
  { id: "transducer", label: "Pressure transducer: range and accuracy", example: "700 bar, ±0.25 % of full scale" },
  { id: "transducerCalibration", label: "Transducer calibration (date, reference)", example: "calibrated 2024-01-10 against a dead-weight tester" },
  { id: "corrections", label: "Corrections applied (end, Rabinowitsch, slip)", example: "Bagley; Rabinowitsch (transition method)" },
  { id: "extrudateObservations", label: "Extrudate appearance (melt fracture, bubbles, discolouration, swell)", example: "smooth up to 1000 1/s; sharkskin above" },
  { id: "remarks", label: "Deviations from the standard, remarks", example: "none" },
]);

/** The text of each item as given by the user (metadata file), by item id. */
export type ReportMeta = Readonly<Record<string, string>>;

/** Longest text accepted for one item. */
export const MAX_META_TEXT = 2000;

/**
 * Reads the user's report metadata (a parsed JSON object: item id → text or number).
 * @param argument names the source in errors, e.g. "--meta meta.json"
 * @throws RheoError("value", argument) naming the key: not an object, an unknown key (the accepted
 *   ones listed), a value that is not text or a number, or text longer than {@link MAX_META_TEXT}.
 */
export function readReportMeta(raw: unknown, argument: string): ReportMeta {
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) throw new RheoError("value", argument, `expected a JSON object of report items, e.g. {"material": "…", "preheatTime": "6 min"}`);
  const out: Record<string, string> = {};
  for (const [key, value] of Object.entries(raw as Record<string, unknown>)) {
    if (!REPORT_ITEMS.some((i) => i.id === key)) throw new RheoError("value", argument, `unknown key "${xmlSafeText(key).slice(0, 40)}"; accepted: ${REPORT_ITEMS.map((i) => i.id).join(", ")}`);
    if (typeof value !== "string" && !(typeof value === "number" && Number.isFinite(value))) throw new RheoError("value", argument, `"${key}" must be text or a number, got ${value === null ? "null" : Array.isArray(value) ? "a list" : typeof value}`);
    const text = xmlSafeText(String(value));
    if (text.length > MAX_META_TEXT) throw new RheoError("value", argument, `"${key}" is ${text.length} characters long; at most ${MAX_META_TEXT} are accepted`);
    if (text.trim() !== "") out[key] = text;
  }
  return out;
}

/** One filled item: its value (null: left for the user) and where it came from. */
export interface ReportItemRow {
  id: string;
  label: string;
  value: string | null;
  source: "data" | "settings" | "metadata" | "to be filled in";
}

/**
 * The report items filled from `facts` (what the data and settings say, by item id) and `meta`
 * (what the user wrote). When both say something, the data's value is shown and the user's text
 * added after it, so neither is lost.
 */
export function reportItems(facts: Readonly<Record<string, { value: string; source: "data" | "settings" }>>, meta: ReportMeta): ReportItemRow[] {
  return REPORT_ITEMS.map((item) => {
    const fact = facts[item.id];
    const given = meta[item.id];
    if (fact && given !== undefined && given !== fact.value) return { id: item.id, label: item.label, value: `${fact.value} (metadata: ${given})`, source: fact.source };
    if (fact) return { id: item.id, label: item.label, value: fact.value, source: fact.source };
    if (given !== undefined) return { id: item.id, label: item.label, value: given, source: "metadata" };
    return { id: item.id, label: item.label, value: null, source: "to be filled in" };
  });
}
