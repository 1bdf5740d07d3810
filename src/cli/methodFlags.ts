/**
 * JSON and text output of the optional reduction methods (slip, orifice, representative rate,
 * extensional viscosity, heating, pressure dependence, transducer uncertainty, melt flow rate).
 * Their flags are reduce settings (src/io/reduceOptions.ts).
 */
import { ReductionGroup, ReductionResult } from "../core/reduce";
import { num, table } from "./format";

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
