/**
 * The optional method tables of the results sheet: per group the orifice/Bagley entrance
 * pressures, Cogswell extensional viscosity, viscous heating and pressure dependence; for the run
 * the Mooney slip table and the temperature shift. Display units as in resultsFlowBlocks.ts.
 */
import type { ReductionGroup, ReductionResult } from "../core/reduce";
import { fromSI } from "../core/units";
import { BlockDraft, DEFAULT_OUTPUT_UNITS as U, bar, fmt, kPa } from "./resultsFlowBlocks";
import type { CellValue } from "./sheetPlan";
import type { RunShift as ShiftOutput } from "../core/run";

/** The optional method tables of a group (entrance pressures, Cogswell, heating, pressure dependence). */
export function methodBlocks(g: ReductionGroup, n: number): BlockDraft[] {
  const out: BlockDraft[] = [];
  const barOrNull = (v: number | null) => (v === null ? null : bar(v));
  if (g.entrancePressures) {
    out.push({
      id: `entrance-${n}`,
      role: "table",
      title: "Entrance pressure: Bagley and orifice die",
      header: [`shear rate app. [${U.rate}]`, `Bagley intercept [${U.pressure}]`, `orifice die [${U.pressure}]`, "Bagley vs orifice [%]"],
      rows: g.entrancePressures.map((e) => [e.shearRateApparent, barOrNull(e.entrancePressure), barOrNull(e.entrancePressureOrifice), e.difference === null ? null : e.difference * 100]),
      numberFormats: ["0.00", "0.000", "0.000", "0.0"],
    });
  }
  if (g.extensional) {
    out.push({
      id: `extensional-${n}`,
      role: "table",
      title: "Extensional viscosity (Cogswell)",
      header: [`shear rate wall [${U.rate}]`, `entrance pressure [${U.pressure}]`, `tensile stress [${U.stress}]`, "extension rate [1/s]", `extensional viscosity [${U.viscosity}]`, "Trouton ratio [-]"],
      rows: g.extensional.map((e) => [e.shearRateWall, bar(e.entrancePressure), kPa(e.tensileStress), e.extensionRate, e.extensionalViscosity, e.troutonRatio]),
      numberFormats: ["0.00", "0.000", "0.000", "0.00", "0", "0.00"],
      keyColumns: [0, 4, 5],
    });
  }
  if (g.heating) {
    out.push({
      id: `heating-${n}`,
      role: "table",
      title: `Viscous heating (b = ${fmt(g.heating.temperatureCoefficient)} 1/K, ${g.heating.temperatureCoefficientSource})`,
      header: [`shear rate app. [${U.rate}]`, `die pressure [${U.pressure}]`, "adiabatic rise [K]", "Nahme number [-]"],
      rows: g.heating.rows.map((h) => [h.shearRateApparent, bar(h.pressure), h.adiabaticTemperatureRise, h.nahmeNumber]),
      numberFormats: ["0.00", "0.000", "0.00", "0.000"],
    });
  }
  if (g.pressureDependence) {
    const beta = g.pressureDependence.pressureCoefficient;
    const rows: CellValue[][] = g.pressureDependence.rows.map((r) => [r.shearRateApparent, r.pressureCoefficient * 1e9, kPa(r.wallShearStressAtZeroPressure), bar(r.entrancePressure), r.logViscosityRise, r.diesUsed, r.converged ? "yes" : "no"]);
    out.push({
      id: `pressure-${n}`,
      role: "table",
      title: `Pressure dependence (median β = ${beta === null ? "not determined" : `${fmt(beta * 1e9)} 1/GPa`})`,
      header: [`shear rate app. [${U.rate}]`, "β [1/GPa]", `wall stress at p = 0 [${U.stress}]`, `entrance pressure [${U.pressure}]`, "ln viscosity rise [-]", "dies", "converged"],
      rows: rows.length > 0 ? rows : [["No rate had three or more dies on its Bagley line."]],
      numberFormats: ["0.00", "0.00", "0.000", "0.000", "0.000", "0", null],
      keyColumns: [0, 1, 5],
    });
  }
  return out;
}

/** The Mooney slip table of the run (null when slip was not asked for). */
export function slipBlock(result: ReductionResult): BlockDraft | null {
  if (!result.slip) return null;
  return {
    id: "slip",
    role: "table",
    title: "Wall slip (Mooney)",
    header: [`temperature [°C]`, `wall shear stress [${U.stress}]`, "slip velocity [mm/s]", "std. error of slip velocity [mm/s]", `shear rate app. slip-corrected [${U.rate}]`, "n' [-]", `shear rate wall [${U.rate}]`, `viscosity [${U.viscosity}]`, "R² [-]"],
    rows: result.slip.map((s) => [s.temperature === null ? null : fromSI(s.temperature, U.temperature, "temperature"), kPa(s.wallShearStress), s.slipVelocity * 1e3, s.slipVelocityStandardError * 1e3, s.shearRateApparentCorrected, s.nPrime, s.shearRateWall, s.viscosity, s.r2]),
    numberFormats: ["0.0", "0.000", "0.0000", "0.0000", "0.00", "0.000", "0.00", "0.0", "0.0000"],
    keyColumns: [0, 1, 2, 7],
  };
}

/** The temperature-shift blocks: the law's constants, and aT per temperature. */
export function shiftBlocks(shift: ShiftOutput): BlockDraft[] {
  const f = shift.fit;
  const tC = (k: number) => fromSI(k, U.temperature, "temperature");
  const constants: CellValue[][] =
    f.law === "arrhenius"
      ? [
          ["law", "Arrhenius: aT = exp[(Ea/R)(1/T − 1/Tref)]"],
          ["reference temperature [°C]", tC(f.referenceTemperature)],
          ["activation energy Ea [kJ/mol]", f.activationEnergy / 1e3],
          ["std. error of Ea [kJ/mol]", f.activationEnergyStandardError / 1e3],
          ["RMSE of the fit (ln η) [-]", f.rmse],
          ["converged", f.converged ? "yes" : "no"],
        ]
      : [
          ["law", "WLF: log10 aT = −C1(T − Tref)/(C2 + T − Tref)"],
          ["reference temperature [°C]", tC(f.referenceTemperature)],
          ["C1 [-]", f.C1],
          ["std. error of C1 [-]", Number.isNaN(f.C1StandardError) ? "held" : f.C1StandardError],
          ["C2 [K]", f.C2],
          ["std. error of C2 [K]", Number.isNaN(f.C2StandardError) ? "held" : f.C2StandardError],
          ["RMSE of the fit (ln η) [-]", f.rmse],
          ["converged", f.converged ? "yes" : "no"],
        ];
  return [
    { id: "shift", role: "list", title: `Temperature shift (${f.law === "arrhenius" ? "Arrhenius" : "WLF"})`, header: ["quantity", "value"], rows: constants, numberFormats: [null, "0.000"] },
    {
      id: "shift-factors",
      role: "table",
      title: "Shift factors",
      header: ["temperature [°C]", "aT [-]", "log10 aT [-]"],
      rows: f.factors.map((x) => [tC(x.temperature), x.aT, Math.log10(x.aT)]),
      numberFormats: ["0.0", "0.0000", "0.0000"],
    },
  ];
}

