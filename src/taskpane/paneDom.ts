/**
 * DOM pieces of the pane: the column mapping cards, the die list rows, the model check boxes,
 * inline field errors and progress. Every control gets a label; no inline handlers or styles.
 */
import { getModel } from "../core/models";
import { ColumnChoice, ColumnRole, DieEntry, roleOptions, unitOptions } from "./columns";
import { modelName } from "../io/displayNames";
import { PANE_MODELS, SETTING_HELP } from "./settings";
import { LOT_HELP } from "./panels/lot/check";
import { PLANNER_HELP } from "./panels/planner/plan";

/** The element with `id`, typed; throws when the page lacks it (a build error, not a user one). */
export function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`pane: element #${id} is missing`);
  return el as T;
}

function el<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Record<string, string> = {}, text?: string): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, v);
  if (text !== undefined) e.textContent = text;
  return e;
}

/** Clears every inline error. */
export function clearFieldErrors(scope: ParentNode = document): void {
  scope.querySelectorAll<HTMLElement>("p.error").forEach((box) => {
    box.hidden = true;
    box.textContent = "";
  });
  scope.querySelectorAll("[aria-invalid]").forEach((e) => e.removeAttribute("aria-invalid"));
}

/** Progress: a bar and a polite live status line. `fraction` null hides the bar. */
export function showProgress(text: string, fraction: number | null): void {
  const bar = byId<HTMLProgressElement>("progress");
  bar.hidden = fraction === null;
  if (fraction !== null) bar.value = fraction;
  byId("status").textContent = text;
}

/** Renders one card per column with its recognised role and unit and two lists to change them. */
export function renderColumns(container: HTMLElement, columns: readonly ColumnChoice[], onChange: (index: number, role: ColumnRole, unit: string | null, changed: "role" | "unit") => void): void {
  container.replaceChildren();
  if (columns.length === 0) {
    container.append(el("p", { class: "muted" }, "No data read yet."));
    return;
  }
  for (const c of columns) {
    const card = el("div", { class: "col-card bar-group", "data-column": String(c.index) });
    const head = el("div", { class: "col-head" });
    head.append(el("code", {}, c.header || `(column ${c.index + 1} has no header)`));
    head.append(el("span", { class: c.recognised ? "badge" : "badge todo" }, c.recognised ? "recognised" : c.problem ?? "check"));
    const selects = el("div", { class: "col-selects" });
    const roleId = `col-${c.index}-role`;
    const unitId = `col-${c.index}-unit`;
    const roleWrap = el("div");
    roleWrap.append(el("label", { for: roleId }, `Column ${c.index + 1} is`));
    const role = el("select", { id: roleId });
    for (const o of roleOptions()) {
      const opt = el("option", { value: o.role }, o.label);
      if (o.role === c.role) opt.selected = true;
      role.append(opt);
    }
    roleWrap.append(role);
    const unitWrap = el("div");
    unitWrap.append(el("label", { for: unitId }, `Unit of column ${c.index + 1}`));
    const unit = el("select", { id: unitId });
    const units = unitOptions(c.role);
    if (units.length === 0) unit.append(el("option", { value: "" }, "(none)"));
    else if (c.unit === null) unit.append(el("option", { value: "" }, "(choose)"));
    for (const u of units) {
      const opt = el("option", { value: u }, u);
      if (c.unit !== null && u.toLowerCase() === c.unit.toLowerCase()) opt.selected = true;
      unit.append(opt);
    }
    unit.disabled = units.length === 0;
    unitWrap.append(unit);
    role.addEventListener("change", () => onChange(c.index, role.value as ColumnRole, null, "role"));
    unit.addEventListener("change", () => onChange(c.index, c.role, unit.value === "" ? null : unit.value, "unit"));
    selects.append(roleWrap, unitWrap);
    card.append(head, selects);
    container.append(card);
  }
}

/** Renders the die list as rows of labelled inputs; edits call `onChange` with the new list. */
export function renderDies(container: HTMLElement, dies: readonly DieEntry[], onChange: (dies: DieEntry[]) => void): void {
  container.replaceChildren();
  dies.forEach((d, i) => {
    const row = el("div", { class: "die-row bar-group" });
    const input = (key: keyof DieEntry, label: string, value: string, mode: string) => {
      const id = `die-${i}-${key}`;
      const wrap = el("div");
      wrap.append(el("label", { for: id }, label));
      const inp = el("input", { id, type: "text", inputmode: mode, autocomplete: "off", value });
      inp.addEventListener("change", () => {
        const next = dies.map((x) => ({ ...x }));
        const target = next[i] as DieEntry;
        if (key === "label") target.label = inp.value;
        else target[key] = inp.value.trim() === "" ? NaN : Number(inp.value.replace(",", "."));
        onChange(next);
      });
      wrap.append(inp);
      return wrap;
    };
    // Remove first, then the die's label, bore and length: from any of the three inputs the run button is within three Tab presses
    const remove = el("button", { type: "button", class: "link", "aria-label": `Remove die ${i + 1}` }, "✕");
    remove.addEventListener("click", () => onChange(dies.filter((_, k) => k !== i)));
    row.append(remove, input("label", `Die ${i + 1} label`, d.label, "text"), input("diameterMm", "Bore D [mm]", Number.isFinite(d.diameterMm) ? String(d.diameterMm) : "", "decimal"), input("lengthMm", "Length L [mm]", Number.isFinite(d.lengthMm) ? String(d.lengthMm) : "", "decimal"));
    container.append(row);
  });
}

/** Renders one labelled check box per model with its one-line description. */
export function renderModels(container: HTMLElement, chosen: readonly string[], onChange: (models: string[]) => void): void {
  container.replaceChildren(el("legend", { class: "visually-hidden" }, "Models to fit"));
  // three to a group: the run button follows the group in use (never more than three Tab presses away)
  let group: HTMLElement = el("div");
  PANE_MODELS.forEach((id, k) => {
    if (k % 3 === 0) {
      group = el("div", { class: "bar-group" });
      container.append(group);
    }
    const m = getModel(id);
    const wrap = el("div", { class: "choice" });
    const boxId = `model-${id}`;
    const box = el("input", { type: "checkbox", id: boxId, value: id, "aria-describedby": `${boxId}-help` });
    box.checked = chosen.includes(id);
    box.addEventListener("change", () => {
      const boxes = Array.from(container.querySelectorAll<HTMLInputElement>("input[type=checkbox]"));
      onChange(boxes.filter((b) => b.checked).map((b) => b.value));
    });
    wrap.append(box, el("label", { for: boxId }, modelName(id)), el("p", { class: "help", id: `${boxId}-help` }, m.description));
    group.append(wrap);
  });
}

/** Fills the one-line explanations that do not change. */
export function fillStaticHelp(): void {
  byId("end-bagley-help").textContent = SETTING_HELP.endCorrection.bagley;
  byId("end-none-help").textContent = SETTING_HELP.endCorrection.none;
  byId("rabinowitschDegree-help").textContent = SETTING_HELP.rabinowitschDegree;
  byId("rabinowitschWindow-help").textContent = SETTING_HELP.rabinowitschWindow;
  byId("models-help").textContent = SETTING_HELP.models;
  byId("transducerRangeBar-help").textContent = SETTING_HELP.transducerRangeBar;
  byId("end-orifice-help").textContent = SETTING_HELP.endCorrection.orifice;
  for (const k of ["transducerAccuracyPercent", "heatingDensity", "heatingHeatCapacity", "heatingConductivity", "heatingTemperatureCoefficient", "referenceTemperatureC", "chartModel"] as const) {
    byId(`${k}-help`).textContent = SETTING_HELP[k];
  }
  for (const k of ["representativeRate", "slip", "extensional", "pressureDependence", "heating"] as const) byId(`check-${k}-help`).textContent = SETTING_HELP[k];
  byId("planDies-help").textContent = PLANNER_HELP.dies;
  byId("planTransducers-help").textContent = PLANNER_HELP.transducers;
  byId("planRates-help").textContent = PLANNER_HELP.rates;
  byId("planDwell-help").textContent = PLANNER_HELP.dwell;
  byId("lotSource-help").textContent = LOT_HELP.lotSource;
  byId("lotTolerance-help").textContent = LOT_HELP.tolerance;
}

/** Fills a model list (the pane's isothermal models), keeping `chosen` selected. */
export function fillModelSelect(select: HTMLSelectElement, chosen: string): void {
  select.replaceChildren(new Option("(choose)", ""), ...PANE_MODELS.map((id) => new Option(modelName(id), id, false, id === chosen)));
}
