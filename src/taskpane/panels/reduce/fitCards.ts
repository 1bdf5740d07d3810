/**
 * The summary cards of the fit across temperatures and of the rotational join, shown after the
 * group cards: the model and its law, each parameter with its unit and standard error, the
 * parameters the data do not determine with the bound they support, and (join) the overlap ratio,
 * whether it is within the tolerance, and the verdict on the joined curve. The numbers are the
 * core's (the run's master fit and joined fit); the words for an undetermined value are the shared
 * ones (src/io/fitFormat.ts). Pure: returns markup with every text escaped.
 */
import { getModel, type ParameterSpec } from "../../../core/models";
import type { Undetermined } from "../../../core/fit/determination";
import { DEFAULT_JOIN_OPTIONS } from "../../../core/rotationalJoin";
import { CROSS_WLF_LITERATURE } from "../../../core/temperature/masterFit";
import { modelName, modelNamesIn, parameterSymbol, unitLabel } from "../../../io/displayNames";
import { undeterminedText } from "../../../io/fitFormat";
import type { RunOutput } from "../../runReduction";
import { escapeXml } from "../../svgChart";
import { shownNumber } from "./shownNumber";

type Row = [term: string, text: string];

/** One parameter's line: "value unit ± SE", "held at value unit", or the bound the data support (`scale` converts SI to the unit shown). */
function parameterText(
  fit: { standardErrors: Record<string, number>; undetermined: Record<string, Undetermined>; fixed: string[] },
  name: string,
  value: number | undefined,
  unit: string,
  scale = 1,
): string {
  const shown = unitLabel(unit);
  const withUnit = (x: number) => `${shownNumber(x * scale)}${shown === "–" || shown === "" ? "" : ` ${shown}`}`;
  const u = fit.undetermined[name];
  if (fit.fixed.includes(name)) return value === undefined ? "held" : `held at ${withUnit(value)}`;
  if (u?.outsideData) return undeterminedText(u.bound ? { ...u, bound: { ...u.bound, value: u.bound.value * scale } } : u, shown === "–" ? "1" : shown);
  if (value === undefined || !Number.isFinite(value)) return "not fitted";
  const se = fit.standardErrors[name];
  const spread = se !== undefined && Number.isFinite(se) ? ` ± ${shownNumber(se * scale)}` : " (no standard error: the data cannot separate it)";
  return `${withUnit(value)}${spread}${u ? ` (not determined: ${u.reason})` : ""}`;
}

function card(kind: string, title: string, rows: readonly Row[]): string {
  return `<article class="group-card fit-card" data-card="${kind}"><h4>${escapeXml(title)}</h4><dl>${rows.map(([k, v]) => `<div><dt>${escapeXml(k)}</dt><dd>${escapeXml(v)}</dd></div>`).join("")}</dl></article>`;
}

const celsius = (k: number) => `${shownNumber(k - 273.15)} °C`;

/** The card of the fit across temperatures, or "" when it was not asked for. */
export function masterFitCard(run: Pick<RunOutput, "master">): string {
  const m = run.master;
  if (!m) return "";
  const crossWlf = m.model === "cross-wlf";
  const specs: readonly ParameterSpec[] = crossWlf ? CROSS_WLF_LITERATURE : getModel(m.model).parameters;
  const rows: Row[] = [
    ["Model", crossWlf ? "Cross-WLF (its own WLF law)" : `${modelName(m.model)} × ${m.law === "arrhenius" ? "Arrhenius" : "WLF"}`],
    [crossWlf ? "D2 (T*)" : "Reference temperature", `${celsius(m.referenceTemperature)}${crossWlf && m.fixed.includes("D2") ? " (held)" : ""}; measured at ${m.temperatures.map((t) => shownNumber(t - 273.15)).join(", ")} °C`],
  ];
  for (const p of specs) {
    if (crossWlf && p.name === "D2") continue; // on the line above
    const unit = unitLabel(p.unit);
    rows.push([`${parameterSymbol(p.name)}${unit === "–" ? "" : ` [${unit}]`}`, parameterText(m, p.name, m.parameters[p.name], "1")]);
  }
  if (m.law === "arrhenius" && !crossWlf) rows.push(["Ea [kJ/mol]", parameterText(m, "activationEnergy", m.activationEnergy, "1", 1e-3)]);
  else if (!crossWlf) rows.push(["c1 [–]", parameterText(m, "c1", m.c1, "1")], ["c2 [K]", parameterText(m, "c2", m.c2, "1")]);
  const undetermined = Object.entries(m.undetermined).filter(([name]) => !m.fixed.includes(name));
  rows.push([
    "Not determined by the data",
    undetermined.length === 0
      ? "none: every fitted parameter is determined"
      : undetermined.map(([name, u]) => `${parameterSymbol(name)}: ${undeterminedText(u, unitOf(specs, name))}`).join("; "),
  ]);
  rows.push(["Fit", `${m.converged ? "converged" : `did not converge (${m.stopReason})`}; ${m.pointCount} points; RMS error of ln η ${shownNumber(m.rmse)}`]);
  return card("masterfit", "Fit across temperatures", rows);
}

function unitOf(specs: readonly ParameterSpec[], name: string): string {
  const u = specs.find((p) => p.name === name)?.unit ?? (name === "activationEnergy" ? "J/mol" : name === "c2" ? "K" : "1");
  return u === "1" ? "1" : unitLabel(u);
}

/** The card of the rotational join, or "" without a rotational curve. */
export function joinedCard(run: Pick<RunOutput, "joined"> & { input: Pick<RunOutput["input"], "rotational"> }): string {
  const j = run.joined;
  if (!j) return "";
  const o = j.join.overlap;
  const rotationalPoints = j.join.source.filter((s) => s === "rotational").length;
  const rows: Row[] = [
    ["Rotational curve", `${run.input.rotational?.label ?? "rotational data"}: ${rotationalPoints} points, ${shownNumber(j.join.rotationalRange[0])} to ${shownNumber(j.join.rotationalRange[1])} 1/s`],
    ["Joined with", j.groups.join(", ")],
    [
      "Overlap ratio",
      o
        ? `rotational/capillary ${shownNumber(o.ratio)} over ${shownNumber(o.shearRateMin)} to ${shownNumber(o.shearRateMax)} 1/s (largest deviation ${shownNumber(100 * o.maxDeviation)} %)`
        : "no common rate range: the agreement of the two curves is not checked",
    ],
  ];
  if (o) rows.push(["Within tolerance", o.withinTolerance ? `yes (± ${shownNumber(100 * DEFAULT_JOIN_OPTIONS.tolerance)} %)` : `NO: beyond ± ${shownNumber(100 * DEFAULT_JOIN_OPTIONS.tolerance)} %; check the temperature, the Cox–Merz rule or slip`]);
  const v = j.fits.verdict;
  const fit = v.fit;
  if (v.recommended && fit) {
    const specs = getModel(fit.model).parameters.filter((p) => !fit.fixed.includes(p.name));
    const params = specs.map((p) => `${parameterSymbol(p.name)} = ${parameterText(fit, p.name, fit.parameters[p.name], p.unit)}`).join("; ");
    rows.push(["Joined curve's verdict", `${modelName(v.recommended)} (${v.status === "well-determined" ? "well determined" : "no model well determined"}): ${params}`]);
  } else rows.push(["Joined curve's verdict", "no model fitted"]);
  rows.push(["Why", modelNamesIn(v.reason)]);
  return card("rotational", "Rotational data joined", rows);
}
