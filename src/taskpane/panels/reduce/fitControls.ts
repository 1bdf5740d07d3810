/**
 * The reduction panel's fit settings beyond the models: the material class (the default model list
 * follows it), the fit across temperatures (with the temperature shift's law and reference
 * temperature; Cross-WLF's optional D2), the rotational curve to join (a range or table in Excel,
 * the invented demo curve in preview mode), WLF's glass transition temperature, the vertical shift,
 * the slit edge correction and the repeat stability limit. Labels and help are the shared words of each setting
 * (src/io/reduceSettingWords.ts via settings.ts); a field that cannot apply is disabled with its
 * reason, as applicability.ts decides for the data and the other settings decide here.
 */
import type { MaterialClass } from "../../../core/flowCurveFits";
import type { MasterModel } from "../../../core/temperature/masterFit";
import { modelName } from "../../../io/displayNames";
import { excelBatch, readSource, type HostMode } from "../../officeHost";
import { PaneFieldError } from "../../panelContract";
import { byId } from "../../paneDom";
import { state } from "../../paneState";
import type { RunInput } from "../../runReduction";
import { PANE_MASTER_MODELS, SETTING_HELP, parseNumberField, settingLabel, type PaneSettings } from "../../settings";
import type { Applicability } from "./applicability";
import { DEMO_ROTATIONAL_LABEL, demoRotationalCells } from "./demoRotational";

/** The settings this module reads and writes. */
export type FitSettings = Pick<PaneSettings, "material" | "masterModel" | "crossWlfD2C" | "rotational" | "glassTransitionTemperatureC" | "verticalShiftPerK" | "slitEdgeCorrection" | "stabilityThresholdPercent">;

/** Fields whose label is the shared label of their setting (with its unit). */
const LABELLED = ["glassTransitionTemperatureC", "verticalShiftPerK", "masterModel", "crossWlfD2C", "rotational", "slitEdgeCorrection", "material", "stabilityThresholdPercent"] as const;

/** What the data allow, kept so that a change of another setting re-applies it. */
let allowed: Applicability | null = null;

const checked = (id: string) => byId<HTMLInputElement>(id).checked;
const numberText = (v: number | null) => (v === null ? "" : String(v));

/** Disables or enables a control and shows or hides its reason ("" when it applies). */
function setApplies(control: HTMLInputElement | HTMLSelectElement, reasonId: string, reason: string): void {
  control.disabled = reason !== "";
  const box = byId(reasonId);
  box.textContent = reason === "" ? "" : `Not available: ${reason}.`;
  box.hidden = reason === "";
}

/**
 * Switches the fit fields on or off from the data (`a`, null before data are read) and the other
 * settings: the glass transition temperature with the WLF shift only, the vertical shift with a
 * shift, D2 with Cross-WLF only, the fit across temperatures with two or more temperatures
 * (Cross-WLF three), the slit edge correction with a slit die.
 */
export function updateFitApplicability(a: Applicability | null = allowed): void {
  allowed = a;
  const shift = byId<HTMLSelectElement>("temperatureShift").value as PaneSettings["temperatureShift"];
  const master = byId<HTMLSelectElement>("masterModel");
  setApplies(master, "masterModel-reason", a && !a.master.ok ? a.master.reason : "");
  const crossWlf = master.querySelector<HTMLOptionElement>('option[value="cross-wlf"]');
  if (crossWlf) crossWlf.disabled = a !== null && !a.crossWlf.ok;
  if (master.disabled || (crossWlf?.disabled && master.value === "cross-wlf")) master.value = "none";
  const model = master.value as PaneSettings["masterModel"];
  const needsLaw = model !== "none" && model !== "cross-wlf" && shift === "none";
  byId("masterModel-help").textContent =
    SETTING_HELP.masterModel[model] + (needsLaw ? " Choose its temperature law (Arrhenius or WLF) under Temperature shift." : "") + (crossWlf?.disabled ? ` (${a?.crossWlf.reason}.)` : "");
  setApplies(byId<HTMLInputElement>("crossWlfD2C"), "crossWlfD2C-reason", model === "cross-wlf" ? "" : "Cross-WLF's own constant; choose Cross-WLF under Fit across temperatures");
  setApplies(byId<HTMLInputElement>("glassTransitionTemperatureC"), "glassTransitionTemperatureC-reason", shift === "wlf" ? "" : "used by the WLF shift only; choose WLF under Temperature shift");
  setApplies(byId<HTMLInputElement>("verticalShiftPerK"), "verticalShiftPerK-reason", shift !== "none" ? "" : "applies with a temperature shift; choose Arrhenius or WLF under Temperature shift");
  const slit = byId<HTMLInputElement>("slitEdgeCorrection");
  setApplies(slit, "slitEdgeCorrection-reason", a && !a.slitEdgeCorrection.ok ? a.slitEdgeCorrection.reason : "");
  if (slit.disabled) slit.checked = false;
}

/** The fit settings as the form holds them (a disabled field is not used). */
export function readFitSettings(): FitSettings {
  const material = (document.querySelector<HTMLInputElement>("input[name=material]:checked")?.value ?? "melt") as MaterialClass;
  const master = byId<HTMLSelectElement>("masterModel");
  const rotational = state.mode.kind === "preview" ? (checked("rotational-demo") ? DEMO_ROTATIONAL_LABEL : null) : byId<HTMLInputElement>("rotational").value.trim() || null;
  const live = (id: string) => (byId<HTMLInputElement>(id).disabled ? null : parseNumberField(byId<HTMLInputElement>(id).value));
  return {
    material,
    masterModel: master.disabled ? "none" : (master.value as PaneSettings["masterModel"]),
    crossWlfD2C: live("crossWlfD2C"),
    rotational,
    glassTransitionTemperatureC: live("glassTransitionTemperatureC"),
    verticalShiftPerK: live("verticalShiftPerK"),
    slitEdgeCorrection: checked("slitEdgeCorrection") && !byId<HTMLInputElement>("slitEdgeCorrection").disabled,
    stabilityThresholdPercent: live("stabilityThresholdPercent"),
  };
}

/** Puts the fit settings into the form. */
export function writeFitSettings(s: FitSettings): void {
  byId<HTMLInputElement>(`material-${s.material}`).checked = true;
  byId<HTMLSelectElement>("masterModel").value = s.masterModel;
  byId<HTMLInputElement>("crossWlfD2C").value = numberText(s.crossWlfD2C);
  byId<HTMLInputElement>("glassTransitionTemperatureC").value = numberText(s.glassTransitionTemperatureC);
  byId<HTMLInputElement>("verticalShiftPerK").value = numberText(s.verticalShiftPerK);
  byId<HTMLInputElement>("slitEdgeCorrection").checked = s.slitEdgeCorrection;
  byId<HTMLInputElement>("stabilityThresholdPercent").value = numberText(s.stabilityThresholdPercent);
  byId<HTMLInputElement>("rotational-demo").checked = s.rotational === DEMO_ROTATIONAL_LABEL;
  if (s.rotational !== DEMO_ROTATIONAL_LABEL) byId<HTMLInputElement>("rotational").value = s.rotational ?? "";
  updateFitApplicability();
}

/**
 * Fills the labels, help and choices of the fit fields and attaches their listeners.
 * `onMaterial` is told when the material class changes (the model list follows it).
 */
export function wireFitSettings(onMaterial: (from: MaterialClass, to: MaterialClass) => void): void {
  for (const f of LABELLED) byId(`${f}-label`).textContent = settingLabel(f);
  byId("material-melt-help").textContent = SETTING_HELP.material.melt;
  byId("material-paste-help").textContent = SETTING_HELP.material.paste;
  for (const f of ["crossWlfD2C", "glassTransitionTemperatureC", "verticalShiftPerK", "slitEdgeCorrection", "rotational", "stabilityThresholdPercent"] as const) byId(`${f}-help`).textContent = SETTING_HELP[f];
  byId("rotational-demo-help").textContent = "An oscillatory test of the demo grade at 210 °C (complex viscosity against angular frequency, 0.01 to 30 rad/s), invented like the demo data.";
  byId<HTMLSelectElement>("masterModel").replaceChildren(...PANE_MASTER_MODELS.map((m) => new Option(m === "none" ? "None" : modelName(m as MasterModel), m)));
  let material = (document.querySelector<HTMLInputElement>("input[name=material]:checked")?.value ?? "melt") as MaterialClass;
  for (const id of ["material-melt", "material-paste"]) {
    byId(id).addEventListener("change", () => {
      const next = readFitSettings().material;
      if (next !== material) onMaterial(material, next);
      material = next;
    });
  }
  byId("masterModel").addEventListener("change", () => updateFitApplicability());
}

/** Preview mode: no workbook to read a range from, so the demo curve is offered instead. */
export function fitSettingsMode(mode: HostMode): void {
  const preview = mode.kind === "preview";
  byId("rotational-demo-choice").hidden = !preview;
  setApplies(byId<HTMLInputElement>("rotational"), "rotational-reason", preview ? "preview mode has no workbook to read a range from; tick the demo curve below" : "");
  if (!preview) byId<HTMLInputElement>("rotational-demo").checked = false;
}

/**
 * The rotational curve's cells for a run: the demo curve in preview mode, the range or table named
 * in Excel (read now), or undefined when none is asked for.
 * @throws PaneFieldError at the rotational field when Excel cannot read the range
 */
export async function readRotationalInput(s: FitSettings): Promise<RunInput["rotational"]> {
  if (s.rotational === null) return undefined;
  if (state.mode.kind === "preview") return { cells: demoRotationalCells(), label: DEMO_ROTATIONAL_LABEL };
  try {
    const read = await readSource(excelBatch, s.rotational);
    return { cells: read.values, label: read.address };
  } catch (e) {
    throw new PaneFieldError({ field: "rotational", message: `Excel could not read “${s.rotational}”: ${e instanceof Error ? e.message : String(e)}` });
  }
}
