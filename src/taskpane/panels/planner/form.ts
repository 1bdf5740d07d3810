/**
 * Fills the Planner panel from a settings object as `rheoledger plan` reads it (e.g.
 * workbooks/demo-plan.json): each value read by the shared reader into SI, then shown in the
 * panel's units. Pure.
 */
import { readPlanValue, PLAN_SETTING_KEYS, PLAN_DIE_KEYS, PLAN_TRANSDUCER_KEYS } from "../../../io/planOptions";
import { fromSI, type Quantity } from "../../../core/units";
import type { PlannerForm } from "./plan";

type Kind = Parameters<typeof readPlanValue>[1];

const show = (v: number) => String(Number(v.toPrecision(6)));

function value(raw: unknown, kind: Kind, field: string, unit: string | null, quantity: Quantity | null): string {
  if (raw === undefined || raw === null || raw === "") return "";
  const si = readPlanValue(raw, kind, field) as number;
  return show(unit === null || quantity === null ? si : fromSI(si, unit, quantity));
}

/** The form for a settings object (throws the reader's RheoError for a bad value). */
export function plannerFormFromSettings(s: Record<string, unknown>): PlannerForm {
  const k = PLAN_SETTING_KEYS;
  const dies = (Array.isArray(s.dies) ? s.dies : []).map((d: Record<string, unknown>, i: number) => {
    const mm = (key: "diameter" | "length" | "width" | "height") => value(d[key], PLAN_DIE_KEYS[key], `dies[${i + 1}].${key}`, "mm", "length");
    const type = String(d.type ?? "capillary");
    const sizes = type === "slit" ? [mm("width"), mm("height"), mm("length")] : [mm("diameter"), mm("length")].filter((x, j) => j === 0 || x !== "");
    return [String(d.name ?? `die ${i + 1}`), type, ...sizes].join(", ");
  });
  const transducers = (Array.isArray(s.transducers) ? s.transducers : []).map((t: Record<string, unknown>, i: number) => {
    const fs = value(t.fullScale, PLAN_TRANSDUCER_KEYS.fullScale, `transducers[${i + 1}].fullScale`, "bar", "pressure");
    const acc = t.accuracy === undefined ? "" : show((readPlanValue(t.accuracy, "fraction", `transducers[${i + 1}].accuracy`) as number) * 100);
    return [String(t.name ?? `transducer ${i + 1}`), fs, ...(acc === "" ? [] : [acc])].join(", ");
  });
  const params = s.priorParameters;
  const isPowerLaw = s.priorModel === "power-law";
  const p = typeof params === "object" && params !== null ? (params as Record<string, number>) : {};
  return {
    barrelDiameter: value(s.barrelDiameter, k.barrelDiameter, "barrelDiameter", "mm", "length"),
    usableLength: value(s.usableLength, k.usableLength, "usableLength", "mm", "length"),
    dies: dies.join("\n"),
    transducers: transducers.join("\n"),
    shearRateMin: value(s.shearRateMin, k.shearRateMin, "shearRateMin", null, null),
    shearRateMax: value(s.shearRateMax, k.shearRateMax, "shearRateMax", null, null),
    points: s.points === undefined ? "" : String(s.points),
    prior: s.priorModel !== undefined ? (isPowerLaw ? "power-law" : "model") : "mfr",
    powerLawK: isPowerLaw && p.K !== undefined ? String(p.K) : "",
    powerLawN: isPowerLaw && p.n !== undefined ? String(p.n) : "",
    priorModel: !isPowerLaw && typeof s.priorModel === "string" ? s.priorModel : "",
    priorParameters: !isPowerLaw ? Object.entries(p).map(([name, v]) => `${name}=${v}`).join(", ") : "",
    mfr: value(s.mfr, k.mfr, "mfr", "g/10min", "massRate"),
    mfrLoad: value(s.mfrLoad, k.mfrLoad, "mfrLoad", "kg", "mass"),
    dwellTime: value(s.dwellTime, k.dwellTime, "dwellTime", "s", "time"),
    density: value(s.density, k.density, "density", "g/cm3", "density"),
    compressibility: value(s.compressibility, k.compressibility, "compressibility", "1/GPa", "inverseStress"),
    timePerLoad: value(s.timePerLoad, k.timePerLoad, "timePerLoad", "min", "time"),
  };
}
