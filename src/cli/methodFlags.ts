/**
 * Command-line flags of the optional reduction methods (slip, orifice, representative rate,
 * extensional viscosity, heating, pressure dependence, transducer uncertainty, melt flow rate),
 * their parsing into reduce options, and their JSON and text output. reduceCommand.ts merges them
 * into the reduce command.
 */
import { RheoError } from "../core/errors";
import { ReductionGroup, ReductionResult, ReduceOptions } from "../core/reduce";
import { Quantity, isUnitOf, quantitiesOfUnit, toSI } from "../core/units";
import { FlagSpec, ParsedArgs, splitQuantity } from "./args";
import { num, table } from "./format";

export const METHOD_FLAGS: Record<string, FlagSpec> = {
  orifice: { value: false, description: "same as --end-correction orifice: subtract an orifice die's pressure (L/D < 1) at the same rate" },
  "orifice-max-ld": { value: true, description: "dies with L/D (L/H) below this are orifice dies (default 1)" },
  slip: { value: false, description: "Mooney wall-slip analysis across two or more die diameters per temperature" },
  representative: { value: false, description: "representative-rate (Schümmer) viscosity beside the Rabinowitsch result" },
  extensional: { value: false, description: "Cogswell extensional viscosity and Trouton ratio from the entrance pressure" },
  heating: { value: true, description: 'viscous heating: "density=0.76 g/cm3, cp=2.1 kJ/(kg.K), k=0.18 W/(m.K), b=0.03 1/K" (b optional: fitted across temperatures; SI when a unit is left out)' },
  pressure: { value: false, description: "curvature of the Bagley lines and the pressure coefficient of viscosity (three or more dies)" },
  transducer: { value: true, description: 'pressure transducer "full scale, accuracy", e.g. "1000 bar, 0.25 %": low-reading flags and ± columns (k = 2)' },
  mfr: { value: true, description: 'melt-flow-rate result "value unit, load", e.g. "12 g/10min, 2.16 kg" (MFR, needs --density) or "16 cm3/10min, 2.16 kg" (MVR)' },
};

/** A "number unit" value as SI of `quantity`; a missing unit means the SI unit. */
function quantityValue(text: string, flag: string, quantity: Quantity, siUnit: string): number {
  const { value, unit } = splitQuantity(text, flag);
  return toSI(value, unit === "" ? siUnit : unit, quantity, flag);
}

const HEATING_KEYS: Record<string, { name: "density" | "heatCapacity" | "conductivity" | "temperatureCoefficient"; quantity: Quantity; si: string }> = {
  density: { name: "density", quantity: "density", si: "kg/m3" },
  cp: { name: "heatCapacity", quantity: "heatCapacity", si: "J/(kg.K)" },
  k: { name: "conductivity", quantity: "thermalConductivity", si: "W/(m.K)" },
  b: { name: "temperatureCoefficient", quantity: "inverseTemperature", si: "1/K" },
};

/** Parses --heating "density=..., cp=..., k=..., b=...". */
export function parseHeating(text: string): NonNullable<ReduceOptions["heating"]> {
  const values: Partial<Record<"density" | "heatCapacity" | "conductivity" | "temperatureCoefficient", number>> = {};
  for (const part of text.split(",").map((p) => p.trim()).filter((p) => p !== "")) {
    const m = /^([A-Za-z_]+)\s*=\s*(.+)$/.exec(part);
    const key = m?.[1]?.toLowerCase();
    const spec = key === undefined ? undefined : HEATING_KEYS[key];
    if (!m || !spec) throw new RheoError("value", "--heating", `expected key=value pairs with keys ${Object.keys(HEATING_KEYS).join(", ")}, got "${part}"`);
    values[spec.name] = quantityValue(m[2] as string, `--heating ${key}`, spec.quantity, spec.si);
  }
  for (const [key, spec] of Object.entries(HEATING_KEYS)) {
    if (key !== "b" && values[spec.name] === undefined) throw new RheoError("missing", "--heating", `needs ${key}= (${spec.name}), e.g. "density=0.76 g/cm3, cp=2.1 kJ/(kg.K), k=0.18 W/(m.K)"`);
  }
  const out: NonNullable<ReduceOptions["heating"]> = {
    density: values.density as number,
    heatCapacity: values.heatCapacity as number,
    conductivity: values.conductivity as number,
  };
  if (values.temperatureCoefficient !== undefined) out.temperatureCoefficient = values.temperatureCoefficient;
  return out;
}

/** Parses --transducer "1000 bar, 0.25 %" (accuracy as % or as a fraction). */
export function parseTransducer(text: string): NonNullable<ReduceOptions["transducer"]> {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.length !== 2) throw new RheoError("value", "--transducer", `expected "full scale, accuracy", e.g. "1000 bar, 0.25 %", got "${text}"`);
  const fs = splitQuantity(parts[0] as string, "--transducer");
  if (fs.unit === "") throw new RheoError("value", "--transducer", `the full scale needs a pressure unit, e.g. "1000 bar", got "${parts[0]}"`);
  const fullScale = toSI(fs.value, fs.unit, "pressure", "--transducer full scale");
  const acc = splitQuantity(parts[1] as string, "--transducer");
  const accuracy = toSI(acc.value, acc.unit, "ratio", "--transducer accuracy");
  return { fullScale, accuracy };
}

/** Parses --mfr "12 g/10min, 2.16 kg" (mass rate: needs density) or "16 cm3/10min, 2.16 kg". */
export function parseMeltFlow(text: string, density: number | undefined): NonNullable<ReduceOptions["meltFlowRate"]> {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.length !== 2) throw new RheoError("value", "--mfr", `expected "value unit, load", e.g. "12 g/10min, 2.16 kg", got "${text}"`);
  const rate = splitQuantity(parts[0] as string, "--mfr");
  const load = quantityValue(parts[1] as string, "--mfr load", "mass", "kg");
  if (isUnitOf("volumetricFlow", rate.unit)) return { volumeRate: toSI(rate.value, rate.unit, "volumetricFlow", "--mfr"), load };
  if (isUnitOf("massRate", rate.unit)) {
    if (density === undefined) throw new RheoError("missing", "--density", "an MFR in mass per time needs the melt density: add --density, e.g. \"0.76 g/cm3\"");
    return { massRate: toSI(rate.value, rate.unit, "massRate", "--mfr"), density, load };
  }
  const known = quantitiesOfUnit(rate.unit);
  throw new RheoError("value", "--mfr", `"${rate.unit}" is not a mass rate (g/10min) or volume rate (cm3/10min) unit${known.length ? ` (it is a ${known.join("/")} unit)` : ""}`);
}

/** Reduce options of the method flags (merged into the command's options). */
export function methodOptionsFromFlags(args: ParsedArgs, density: number | undefined): Partial<ReduceOptions> {
  const o: Partial<ReduceOptions> = {};
  const f = args.flags;
  if (f.has("orifice")) {
    const end = f.get("end-correction");
    if (typeof end === "string" && end !== "orifice") throw new RheoError("value", "--orifice", `contradicts --end-correction ${end}`);
    o.endCorrection = "orifice";
  }
  const maxLd = f.get("orifice-max-ld");
  if (typeof maxLd === "string") {
    const v = Number(maxLd);
    if (!(v > 0) || !Number.isFinite(v)) throw new RheoError("value", "--orifice-max-ld", `expected a number above zero, got "${maxLd}"`);
    o.orifice = { maxLengthOverDiameter: v };
  }
  if (f.has("slip")) o.slip = true;
  if (f.has("representative")) o.representativeRate = true;
  if (f.has("extensional")) o.extensional = true;
  if (f.has("pressure")) o.pressureDependence = true;
  const heating = f.get("heating");
  if (typeof heating === "string") o.heating = parseHeating(heating);
  const transducer = f.get("transducer");
  if (typeof transducer === "string") o.transducer = parseTransducer(transducer);
  const mfr = f.get("mfr");
  if (typeof mfr === "string") o.meltFlowRate = parseMeltFlow(mfr, density);
  return o;
}

/** Additive keys of one flow-curve row in the JSON document (present only when computed). */
export function flowCurveExtrasJson(g: ReductionGroup, i: number): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  const rep = g.representativeRate?.[i];
  if (rep) {
    out.shearRateRepresentative = rep.shearRateRepresentative;
    out.viscosityRepresentative = rep.viscosityRepresentative;
    out.representativeDeviation = rep.deviation;
  }
  const u = g.uncertainty?.[i];
  if (u) {
    out.wallShearStressUncertainty = u.wallShearStress;
    out.shearRateWallUncertainty = u.shearRateWall;
    out.viscosityUncertainty = u.viscosity;
  }
  return out;
}

/** Additive group keys of the JSON document. */
export function groupExtrasJson(g: ReductionGroup): Record<string, unknown> {
  const out: Record<string, unknown> = { geometry: g.geometry };
  if (g.geometry === "slit") {
    out.dieDiameter = null;
    out.slitWidth = g.slitWidth;
    out.slitHeight = g.slitHeight;
  }
  if (g.entrancePressures) out.entrancePressures = g.entrancePressures;
  if (g.extensional) {
    out.extensional = g.extensional.map((e) => ({
      shearRateApparent: e.shearRateApparent,
      shearRateWall: e.shearRateWall,
      entrancePressure: e.entrancePressure,
      tensileStress: e.tensileStress,
      extensionRate: e.extensionRate,
      extensionalViscosity: e.extensionalViscosity,
      troutonRatio: e.troutonRatio,
    }));
  }
  if (g.heating) out.heating = g.heating;
  if (g.pressureDependence) out.pressureDependence = g.pressureDependence;
  return out;
}

/** Additive top-level keys of the JSON document. */
export function topExtrasJson(result: ReductionResult): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (result.slip) {
    out.slip = result.slip.map((s) => ({
      temperature: s.temperature,
      wallShearStress: s.wallShearStress,
      slipVelocity: s.slipVelocity,
      shearRateApparentCorrected: s.shearRateApparentCorrected,
      slipVelocityStandardError: s.slipVelocityStandardError,
      r2: s.r2,
      nPrime: s.nPrime,
      shearRateWall: s.shearRateWall,
      viscosity: s.viscosity,
    }));
  }
  if (result.meltFlowRate) {
    const { warnings: _w, ...point } = result.meltFlowRate;
    out.meltFlowRate = point;
  }
  return out;
}

/** Text tables of a group's optional results (empty when none was asked for). */
export function groupExtrasText(g: ReductionGroup): string[] {
  const out: string[] = [];
  const fc = g.flowCurve;
  if (g.representativeRate || g.uncertainty) {
    const headers = ["shear rate app. [1/s]"];
    if (g.representativeRate) headers.push("rep. rate [1/s]", "rep. visc. [Pa.s]", "vs Rabinowitsch [%]");
    if (g.uncertainty) headers.push("± wall stress [kPa]", "± shear rate wall [1/s]", "± viscosity [Pa.s]");
    const rows = fc.map((f, i) => {
      const r = [num(f.shearRateApparent)];
      const rep = g.representativeRate?.[i];
      if (rep) r.push(num(rep.shearRateRepresentative), num(rep.viscosityRepresentative), rep.deviation === null ? "—" : (rep.deviation * 100).toFixed(1));
      const u = g.uncertainty?.[i];
      if (u) r.push(num(u.wallShearStress / 1e3), num(u.shearRateWall), num(u.viscosity));
      return r;
    });
    out.push("", g.uncertainty ? "Cross-checks and expanded uncertainties (k = 2)" : "Representative-rate cross-check", table(headers, rows));
  }
  if (g.entrancePressures) {
    out.push("", "Entrance pressure: Bagley and orifice die");
    out.push(
      table(
        ["shear rate app. [1/s]", "Bagley [bar]", "orifice [bar]", "difference [%]"],
        g.entrancePressures.map((e) => [num(e.shearRateApparent), num(e.entrancePressure === null ? null : e.entrancePressure / 1e5), num(e.entrancePressureOrifice === null ? null : e.entrancePressureOrifice / 1e5), e.difference === null ? "—" : (e.difference * 100).toFixed(1)]),
      ),
    );
  }
  if (g.extensional) {
    out.push("", "Extensional viscosity (Cogswell)");
    out.push(
      table(
        ["shear rate wall [1/s]", "entrance p. [bar]", "tensile stress [kPa]", "extension rate [1/s]", "ext. viscosity [Pa.s]", "Trouton [-]"],
        g.extensional.map((e) => [num(e.shearRateWall), num(e.entrancePressure / 1e5), num(e.tensileStress / 1e3), num(e.extensionRate), num(e.extensionalViscosity), num(e.troutonRatio, 3)]),
      ),
    );
  }
  if (g.heating) {
    out.push("", `Viscous heating (b = ${num(g.heating.temperatureCoefficient, 3)} 1/K, ${g.heating.temperatureCoefficientSource})`);
    out.push(
      table(
        ["shear rate app. [1/s]", "pressure [bar]", "adiabatic rise [K]", "Nahme-Griffith [-]"],
        g.heating.rows.map((h) => [num(h.shearRateApparent), num(h.pressure / 1e5), num(h.adiabaticTemperatureRise, 3), num(h.nahmeNumber, 3)]),
      ),
    );
  }
  if (g.pressureDependence) {
    const pc = g.pressureDependence.pressureCoefficient;
    out.push("", `Pressure dependence (median β = ${pc === null ? "—" : num(pc * 1e9, 3)} 1/GPa)`);
    if (g.pressureDependence.rows.length > 0) {
      out.push(
        table(
          ["shear rate app. [1/s]", "β [1/GPa]", "τ at p = 0 [kPa]", "entrance p. [bar]", "ln visc. rise [-]", "dies"],
          g.pressureDependence.rows.map((r) => [num(r.shearRateApparent), num(r.pressureCoefficient * 1e9, 3), num(r.wallShearStressAtZeroPressure / 1e3), num(r.entrancePressure / 1e5), num(r.logViscosityRise, 3), String(r.diesUsed)]),
        ),
      );
    }
  }
  return out;
}

/** Text tables of the top-level optional results. */
export function topExtrasText(result: ReductionResult): string[] {
  const out: string[] = [];
  if (result.slip) {
    out.push("Wall slip (Mooney)");
    out.push(
      table(
        ["temperature [°C]", "wall stress [kPa]", "slip velocity [mm/s]", "shear rate app. corr. [1/s]", "shear rate wall [1/s]", "viscosity [Pa.s]", "R² [-]"],
        result.slip.map((s) => [s.temperature === null ? "—" : num(s.temperature - 273.15), num(s.wallShearStress / 1e3), num(s.slipVelocity * 1e3), num(s.shearRateApparentCorrected), num(s.shearRateWall), num(s.viscosity), s.r2.toFixed(4)]),
      ),
      "",
    );
  }
  if (result.meltFlowRate) {
    const m = result.meltFlowRate;
    out.push("Melt-flow-rate point (apparent, standard die 2.095 × 8.000 mm)");
    out.push(
      table(
        ["flow rate [mm3/s]", "pressure [bar]", "shear rate app. [1/s]", "wall stress app. [kPa]", "visc. app. [Pa.s]"],
        [[num(m.flowRate * 1e9), num(m.pressure / 1e5), num(m.shearRateApparent), num(m.wallShearStressApparent / 1e3), num(m.viscosityApparent)]],
      ),
      "",
    );
  }
  return out;
}
