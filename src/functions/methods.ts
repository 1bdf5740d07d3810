/**
 * Worksheet functions of the correction-check methods (slit dies, orifice dies, wall slip,
 * representative rate, Cogswell, viscous heating, pressure dependence, transducer uncertainty,
 * melt flow rate). Thin adapters over src/core, declared here so Excel reads their JSDoc
 * (this file is listed in webpack.config.js FUNCTION_FILES).
 */
import { apparentSlitShearRate } from "../core/slitFlow";
import { slitWallShearStress } from "../core/slit";
import { orificeEntrancePressure } from "../core/orifice";
import { mooneySlip } from "../core/slip";
import { representativeViscosity } from "../core/representativeRate";
import { cogswell } from "../core/cogswell";
import { adiabaticTemperatureRise, nahmeNumber } from "../core/viscousHeating";
import { fitBarusBagley } from "../core/pressureDependence";
import { pressureStandardUncertainty } from "../core/uncertainty";
import { meltFlowPoint } from "../core/meltFlowRate";
import { RheoError } from "../core/errors";
import { fromSI, isUnitOf, toSI } from "../core/units";
import { appendWarnings } from "./reduceTable";
import { DEFAULT_SHEET_UNITS as U, Rows, SI_RESULT, UnitArgument, atRows, booleanArg, cellError, column, guard, mapRows, readNumber, readRows, rowCells3, rowCells4, unitArg, optionalText } from "./adapter";

/*
 * Unit arguments of the element-wise functions below: the per-row lane (adapter/rowCells.ts)
 * reads their factors, the general path (the `...Rows` twin of each function) their unit texts.
 */
const PRESSURE_UNIT = new UnitArgument("pressureUnit", "pressure", U.pressure);
const LENGTH_UNIT = new UnitArgument("lengthUnit", "length", U.length);
const FLOW_UNIT = new UnitArgument("flowUnit", "volumetricFlow", U.volumetricFlow);
const DENSITY_UNIT = new UnitArgument("densityUnit", "density", U.density);
const HEAT_CAPACITY_UNIT = new UnitArgument("heatCapacityUnit", "heatCapacity", "J/(kg.K)");
const STRESS_OUTPUT = new UnitArgument("outputUnit", "pressure", U.stress);
/** A blank optional entrance pressure: none. */
const NO_ENTRANCE_PRESSURE = Object.freeze([Object.freeze([0])]) as unknown as unknown[][];

/** Spills several values per kept row (blank rows stay blank), down a column or across a row of rows. */
function spillTable(rows: Rows, values: unknown[][], width: number): unknown[][] {
  if (width === 1 && rows.orientation === "row") {
    const line = new Array<unknown>(rows.length).fill("");
    rows.kept.forEach((pos, k) => (line[pos] = (values[k] as unknown[])[0]));
    return [line];
  }
  const out: unknown[][] = Array.from({ length: rows.length }, () => new Array<unknown>(width).fill(""));
  rows.kept.forEach((pos, k) => {
    out[pos] = values[k] as unknown[];
  });
  return out;
}

function scalar(value: unknown, argument: string): number {
  const v = readNumber(Array.isArray(value) ? (value[0] as unknown[] | undefined)?.[0] ?? (value[0] as unknown) : value, argument, "the value");
  if (v === null) throw new RheoError("missing", argument, "is required");
  return v;
}

/**
 * Apparent wall shear rate in a slit die, 6Q/(W·H²), in 1/s.
 * @customfunction SLITSHEARRATEAPP
 * @example =RHEO.SLITSHEARRATEAPP(C2:C12, 10, 1) for a 10 mm × 1 mm slit gives 1/s per row.
 * @param flowRate Volumetric flow rate Q: a cell, column or row (default unit mm3/s).
 * @param slitWidth Slit width W: one cell or a range as long as flowRate (default unit mm).
 * @param slitHeight Slit height (gap) H: one cell or a range as long as flowRate (default unit mm).
 * @param flowUnit Unit of flowRate, e.g. "mm3/s", "cm3/min" (default mm3/s).
 * @param lengthUnit Unit of slitWidth and slitHeight (default mm).
 * @returns Apparent shear rate in 1/s per row.
 */
export function slitShearRateApp(flowRate: unknown[][], slitWidth: unknown[][], slitHeight: unknown[][], flowUnit?: string, lengthUnit?: string): unknown[][] {
  const l = LENGTH_UNIT.factor(lengthUnit);
  return (
    rowCells3(apparentSlitShearRate, flowRate, FLOW_UNIT.factor(flowUnit), slitWidth, l, slitHeight, l, SI_RESULT) ??
    slitShearRateAppRows(flowRate, slitWidth, slitHeight, flowUnit, lengthUnit)
  );
}

function slitShearRateAppRows(flowRate: unknown[][], slitWidth: unknown[][], slitHeight: unknown[][], flowUnit?: string, lengthUnit?: string): unknown[][] {
  return guard("slitShearRateApp", () => {
    const l = LENGTH_UNIT.read(lengthUnit);
    return mapRows(
      [
        { argument: "flowRate", range: flowRate, quantity: "volumetricFlow", unit: FLOW_UNIT.read(flowUnit) },
        { argument: "slitWidth", range: slitWidth, quantity: "length", unit: l },
        { argument: "slitHeight", range: slitHeight, quantity: "length", unit: l },
      ],
      apparentSlitShearRate,
    );
  });
}

/**
 * Wall shear stress in a slit die, (ΔP − ΔPent)·H/(2L); without entrancePressure the apparent stress.
 * @customfunction SLITWALLSTRESS
 * @example =RHEO.SLITWALLSTRESS(E2:E12, 1, 20, H2:H12, "bar", "mm", "kPa") gives the end-corrected slit wall stress in kPa.
 * @param pressure Measured pressure drop ΔP: a cell, column or row (default unit bar).
 * @param slitHeight Slit height (gap) H: one cell or a range as long as pressure (default unit mm).
 * @param dieLength Slit length L: one cell or a range as long as pressure (default unit mm).
 * @param entrancePressure Entrance pressure ΔPent at the same rate (e.g. the Bagley intercept in L/H), same unit as pressure; blank for none.
 * @param pressureUnit Unit of pressure and entrancePressure, e.g. "bar", "MPa" (default bar).
 * @param lengthUnit Unit of slitHeight and dieLength (default mm).
 * @param outputUnit Unit of the stress, e.g. "Pa", "kPa" (default Pa).
 * @returns Wall shear stress per row.
 */
export function slitWallStress(
  pressure: unknown[][],
  slitHeight: unknown[][],
  dieLength: unknown[][],
  entrancePressure?: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  const p = PRESSURE_UNIT.factor(pressureUnit);
  const l = LENGTH_UNIT.factor(lengthUnit);
  const entrance = entrancePressure === null || entrancePressure === undefined ? NO_ENTRANCE_PRESSURE : entrancePressure;
  return (
    rowCells4(slitWallShearStress, pressure, p, slitHeight, l, dieLength, l, entrance, p, STRESS_OUTPUT.factor(outputUnit)) ??
    slitWallStressRows(pressure, slitHeight, dieLength, entrancePressure, pressureUnit, lengthUnit, outputUnit)
  );
}

function slitWallStressRows(
  pressure: unknown[][],
  slitHeight: unknown[][],
  dieLength: unknown[][],
  entrancePressure?: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return guard("slitWallStress", () => {
    const p = PRESSURE_UNIT.read(pressureUnit);
    const l = LENGTH_UNIT.read(lengthUnit);
    return mapRows(
      [
        { argument: "pressure", range: pressure, quantity: "pressure", unit: p },
        { argument: "slitHeight", range: slitHeight, quantity: "length", unit: l },
        { argument: "dieLength", range: dieLength, quantity: "length", unit: l },
        { argument: "entrancePressure", range: entrancePressure === null || entrancePressure === undefined ? [[0]] : entrancePressure, quantity: "pressure", unit: p },
      ],
      slitWallShearStress,
      { quantity: "pressure", unit: STRESS_OUTPUT.read(outputUnit) },
    );
  });
}

/**
 * Entrance pressure read off an orifice (zero-length) die at given apparent rates, interpolated log–log; never extrapolated.
 * @customfunction ORIFICEPRESSURE
 * @example =RHEO.ORIFICEPRESSURE(J2:J9, K2:K9, C2:C9) gives the orifice entrance pressure (bar) at the long die's rates.
 * @param orificeShearRate Apparent shear rates at which the orifice die was run, in 1/s: a column or row.
 * @param orificePressure The orifice die's pressures (same length; default unit bar).
 * @param shearRateApparent The long die's apparent rates in 1/s, where the entrance pressure is wanted.
 * @param pressureUnit Unit of orificePressure and of the result (default bar).
 * @returns The entrance pressure per rate; #N/A outside the orifice die's rate range.
 */
export function orificePressure(orificeShearRate: unknown[][], orificePressure: unknown[][], shearRateApparent: unknown[][], pressureUnit?: string): unknown[][] {
  return guard("orificePressure", () => {
    const p = unitArg(pressureUnit, "pressureUnit", "pressure", U.pressure);
    const o = readRows([
      { argument: "orificeShearRate", range: orificeShearRate },
      { argument: "orificePressure", range: orificePressure, quantity: "pressure", unit: p },
    ]);
    const rates = column(o, "orificeShearRate");
    const pressures = column(o, "orificePressure");
    const at = readRows([{ argument: "shearRateApparent", range: shearRateApparent }]);
    const values = column(at, "shearRateApparent").map((rate) => {
      const v = atRows(o, () => orificeEntrancePressure(rates, pressures, rate));
      return v === undefined ? cellError("#N/A", `orificePressure: ${rate} 1/s lies outside the orifice die's rates`) : fromSI(v, p, "pressure");
    });
    return spillTable(at, values.map((v) => [v]), 1);
  });
}

/**
 * Mooney wall-slip table from flow curves of two or more die diameters: wall stress, slip velocity, slip-corrected apparent rate, true wall rate, viscosity.
 * @customfunction SLIPVELOCITY
 * @example =RHEO.SLIPVELOCITY(A2:A31, C2:C31, D2:D31, "mm", "kPa", TRUE, TRUE) spills the Mooney slip table for three bores with its warnings below.
 * @param dieDiameter Die diameter of each flow-curve point: a column (default unit mm).
 * @param shearRateApparent Apparent shear rate of each point in 1/s (same length).
 * @param wallShearStress End-corrected wall shear stress of each point (same length; default unit Pa).
 * @param lengthUnit Unit of dieDiameter (default mm).
 * @param stressUnit Unit of wallShearStress and of the stress column (default Pa).
 * @param header TRUE to put a header row above the table (default FALSE).
 * @param showWarnings TRUE to list the analysis's warnings below the table: a blank row, then code and message per row (default FALSE).
 * @returns Columns: wall stress, slip velocity [mm/s], corrected apparent rate [1/s], true wall rate [1/s], viscosity [Pa.s].
 */
export function slipVelocity(dieDiameter: unknown[][], shearRateApparent: unknown[][], wallShearStress: unknown[][], lengthUnit?: string, stressUnit?: string, header?: boolean, showWarnings?: boolean): unknown[][] {
  return guard("slipVelocity", () => {
    const l = unitArg(lengthUnit, "lengthUnit", "length", U.length);
    const s = unitArg(stressUnit, "stressUnit", "pressure", U.stress);
    const withHeader = booleanArg(header, "header", false);
    const withWarnings = booleanArg(showWarnings, "showWarnings", false);
    const rows = readRows([
      { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: l },
      { argument: "shearRateApparent", range: shearRateApparent },
      { argument: "wallShearStress", range: wallShearStress, quantity: "pressure", unit: s },
    ]);
    const d = column(rows, "dieDiameter");
    const byD = new Map<number, { rates: number[]; stresses: number[] }>();
    d.forEach((dia, i) => {
      const key = [...byD.keys()].find((k) => Math.abs(k - dia) <= 1e-9 * k) ?? dia;
      const c = byD.get(key) ?? { rates: [], stresses: [] };
      c.rates.push(column(rows, "shearRateApparent")[i] as number);
      c.stresses.push(column(rows, "wallShearStress")[i] as number);
      byD.set(key, c);
    });
    const result = mooneySlip([...byD.entries()].map(([dia, c]) => ({ dieDiameter: dia, shearRateApparent: c.rates, wallShearStress: c.stresses })));
    const table: unknown[][] = result.rows.map((r) => [fromSI(r.wallShearStress, s, "pressure"), r.slipVelocity * 1e3, r.shearRateApparentCorrected, r.shearRateWall ?? "", r.viscosity ?? ""]);
    if (table.length === 0) throw new RheoError("missing", "wallShearStress", "no stress gave a positive slip-corrected rate");
    const out = withHeader ? [[`wall_shear_stress [${s}]`, "slip_velocity [mm/s]", "shear_rate_apparent_corrected [1/s]", "shear_rate_wall [1/s]", "viscosity [Pa.s]"], ...table] : table;
    if (withWarnings) appendWarnings(out, result.warnings);
    return out;
  });
}

/**
 * Representative-rate (Schümmer) cross-check: the rate (π/4)·γ̇a and the viscosity τw/γ̇a placed at it, per row.
 * @customfunction REPVISCOSITY
 * @example =RHEO.REPVISCOSITY(C2:C12, D2:D12) gives the representative rate and viscosity beside the Rabinowitsch result.
 * @param shearRateApparent Apparent shear rate in 1/s: a cell, column or row.
 * @param wallShearStress End-corrected wall shear stress: one cell or a range as long (default unit Pa).
 * @param stressUnit Unit of wallShearStress (default Pa).
 * @param viscosityUnit Unit of the viscosity column (default Pa.s).
 * @returns Two columns per row: representative rate [1/s], viscosity.
 */
export function repViscosity(shearRateApparent: unknown[][], wallShearStress: unknown[][], stressUnit?: string, viscosityUnit?: string): unknown[][] {
  return guard("repViscosity", () => {
    const v = unitArg(viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
    const rows = readRows([
      { argument: "shearRateApparent", range: shearRateApparent },
      { argument: "wallShearStress", range: wallShearStress, quantity: "pressure", unit: unitArg(stressUnit, "stressUnit", "pressure", U.stress) },
    ]);
    const stress = column(rows, "wallShearStress");
    const values = column(rows, "shearRateApparent").map((rate, k) => {
      const r = atRows(rows, () => representativeViscosity(rate, stress[k] as number));
      return [r.shearRate, fromSI(r.viscosity, v, "viscosity")];
    });
    return spillTable(rows, values, 2);
  });
}

/**
 * Cogswell extensional flow from the entrance pressure: tensile stress, extension rate, extensional viscosity and Trouton ratio per row.
 * @customfunction COGSWELL
 * @example =RHEO.COGSWELL(E2:E10, F2:F10, G2:G10, H2:H10) spills extension rate, tensile stress, extensional viscosity and Trouton ratio.
 * @param entrancePressure Entrance pressure ΔPent: a cell, column or row (default unit bar).
 * @param shearRateWall True wall shear rate in 1/s (same length or one cell).
 * @param viscosity Shear viscosity at that rate (same length; default unit Pa.s).
 * @param flowIndex Local power-law index n (n'), dimensionless (same length or one cell).
 * @param pressureUnit Unit of entrancePressure (default bar).
 * @param viscosityUnit Unit of viscosity and of the extensional viscosity (default Pa.s).
 * @returns Four columns: tensile stress [Pa], extension rate [1/s], extensional viscosity, Trouton ratio [-].
 */
export function cogswellFlow(entrancePressure: unknown[][], shearRateWall: unknown[][], viscosity: unknown[][], flowIndex: unknown[][], pressureUnit?: string, viscosityUnit?: string): unknown[][] {
  return guard("cogswell", () => {
    const v = unitArg(viscosityUnit, "viscosityUnit", "viscosity", U.viscosity);
    const rows = readRows([
      { argument: "entrancePressure", range: entrancePressure, quantity: "pressure", unit: unitArg(pressureUnit, "pressureUnit", "pressure", U.pressure) },
      { argument: "shearRateWall", range: shearRateWall },
      { argument: "viscosity", range: viscosity, quantity: "viscosity", unit: v },
      { argument: "flowIndex", range: flowIndex },
    ]);
    const [p, g, e, n] = ["entrancePressure", "shearRateWall", "viscosity", "flowIndex"].map((a) => column(rows, a)) as [number[], number[], number[], number[]];
    const values = p.map((_, k) => {
      const c = atRows(rows, () => cogswell(p[k] as number, g[k] as number, e[k] as number, n[k] as number));
      return [c.tensileStress, c.extensionRate, fromSI(c.extensionalViscosity, v, "viscosity"), c.troutonRatio];
    });
    return spillTable(rows, values, 4);
  });
}

/**
 * Adiabatic temperature rise of the melt passing the die, ΔP/(ρ·cp), in K.
 * @customfunction HEATING
 * @example =RHEO.HEATING(E2:E12, 0.76, 2300) gives the adiabatic temperature rise in K per row.
 * @param pressure Pressure drop over the die: a cell, column or row (default unit bar).
 * @param density Melt density: one cell or a range as long (default unit g/cm3).
 * @param heatCapacity Specific heat capacity cp: one cell or a range as long (default unit J/(kg.K)).
 * @param pressureUnit Unit of pressure (default bar).
 * @param densityUnit Unit of density (default g/cm3).
 * @param heatCapacityUnit Unit of heatCapacity, "J/(kg.K)" or "kJ/(kg.K)" (default J/(kg.K)).
 * @returns Adiabatic temperature rise in K per row.
 */
export function heating(pressure: unknown[][], density: unknown[][], heatCapacity: unknown[][], pressureUnit?: string, densityUnit?: string, heatCapacityUnit?: string): unknown[][] {
  return (
    rowCells3(adiabaticTemperatureRise, pressure, PRESSURE_UNIT.factor(pressureUnit), density, DENSITY_UNIT.factor(densityUnit), heatCapacity, HEAT_CAPACITY_UNIT.factor(heatCapacityUnit), SI_RESULT) ??
    heatingRows(pressure, density, heatCapacity, pressureUnit, densityUnit, heatCapacityUnit)
  );
}

function heatingRows(pressure: unknown[][], density: unknown[][], heatCapacity: unknown[][], pressureUnit?: string, densityUnit?: string, heatCapacityUnit?: string): unknown[][] {
  return guard("heating", () =>
    mapRows(
      [
        { argument: "pressure", range: pressure, quantity: "pressure", unit: PRESSURE_UNIT.read(pressureUnit) },
        { argument: "density", range: density, quantity: "density", unit: DENSITY_UNIT.read(densityUnit) },
        { argument: "heatCapacity", range: heatCapacity, quantity: "heatCapacity", unit: HEAT_CAPACITY_UNIT.read(heatCapacityUnit) },
      ],
      adiabaticTemperatureRise,
    ),
  );
}

/**
 * Nahme–Griffith number b·η·γ̇w²·R²/k: above about 1, viscous heating distorts the measured viscosity.
 * @customfunction NAHME
 * @example =RHEO.NAHME(0.03, G2:G12, F2:F12, 1, 0.2) gives the Nahme–Griffith number per row for a 1 mm die.
 * @param temperatureCoefficient b = −d ln η/dT in 1/K: one cell or a range.
 * @param viscosity Viscosity η: a cell, column or row (default unit Pa.s).
 * @param shearRateWall True wall shear rate in 1/s (same length or one cell).
 * @param dieDiameter Die diameter D (R = D/2; for a slit give the gap H): one cell or a range (default unit mm).
 * @param conductivity Thermal conductivity k in W/(m.K): one cell or a range.
 * @param viscosityUnit Unit of viscosity (default Pa.s).
 * @param lengthUnit Unit of dieDiameter (default mm).
 * @returns The Nahme–Griffith number per row (dimensionless).
 */
export function nahme(temperatureCoefficient: unknown[][], viscosity: unknown[][], shearRateWall: unknown[][], dieDiameter: unknown[][], conductivity: unknown[][], viscosityUnit?: string, lengthUnit?: string): unknown[][] {
  return guard("nahme", () =>
    mapRows(
      [
        { argument: "temperatureCoefficient", range: temperatureCoefficient },
        { argument: "viscosity", range: viscosity, quantity: "viscosity", unit: unitArg(viscosityUnit, "viscosityUnit", "viscosity", U.viscosity) },
        { argument: "shearRateWall", range: shearRateWall },
        { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: unitArg(lengthUnit, "lengthUnit", "length", U.length) },
        { argument: "conductivity", range: conductivity },
      ],
      (b, eta, rate, d, k) => nahmeNumber(b, eta, rate, d / 2, k),
    ),
  );
}

/**
 * Pressure coefficient of viscosity β from one curved Bagley line (three or more dies at one rate), Barus law.
 * @customfunction PRESSURECOEFF
 * @example =RHEO.PRESSURECOEFF({10;20;40;60}, {151;262;487;731}) estimates the pressure coefficient β in 1/GPa from one rate's Bagley points.
 * @param lengthOverRadius L/R of each die (L/H for slits): a column or row, three or more distinct values.
 * @param pressure Pressure of each die at the same apparent rate (same length; default unit bar).
 * @param pressureUnit Unit of pressure (default bar).
 * @param outputUnit Unit of β, e.g. "1/GPa", "1/MPa", "1/Pa" (default 1/GPa).
 * @returns β, positive for a line bending upwards.
 */
export function pressureCoeff(lengthOverRadius: unknown[][], pressure: unknown[][], pressureUnit?: string, outputUnit?: string): unknown[][] {
  return guard("pressureCoeff", () => {
    const out = unitArg(outputUnit, "outputUnit", "inverseStress", "1/GPa");
    const rows = readRows([
      { argument: "lengthOverRadius", range: lengthOverRadius },
      { argument: "pressure", range: pressure, quantity: "pressure", unit: unitArg(pressureUnit, "pressureUnit", "pressure", U.pressure) },
    ]);
    const fit = atRows(rows, () => fitBarusBagley(column(rows, "lengthOverRadius"), column(rows, "pressure")), { x: "lengthOverRadius" });
    if (!fit.converged) return [[cellError("#NUM!", "pressureCoeff: the curved Bagley fit did not converge")]];
    return [[fromSI(fit.pressureCoefficient, out, "inverseStress")]];
  });
}

/**
 * Expanded uncertainty (k = 2 by default) of one pressure reading from the transducer's full scale and accuracy (rectangular, GUM).
 * @customfunction PRESSUREUNC
 * @example =RHEO.PRESSUREUNC(1000, 0.25) gives the standard and expanded pressure uncertainty in bar.
 * @param fullScale Transducer full-scale range (default unit bar).
 * @param accuracy Accuracy in percent of full scale, e.g. 0.25.
 * @param pressureUnit Unit of fullScale and of the result (default bar).
 * @param coverageFactor Coverage factor k (default 2).
 * @returns ± pressure uncertainty in pressureUnit.
 */
export function pressureUnc(fullScale: unknown, accuracy: unknown, pressureUnit?: string, coverageFactor?: number): unknown[][] {
  return guard("pressureUnc", () => {
    const p = unitArg(pressureUnit, "pressureUnit", "pressure", U.pressure);
    const k = coverageFactor === null || coverageFactor === undefined ? 2 : scalar(coverageFactor, "coverageFactor");
    const u = pressureStandardUncertainty({ fullScale: toSI(scalar(fullScale, "fullScale"), p, "pressure", "fullScale"), accuracy: scalar(accuracy, "accuracy") / 100 });
    return [[fromSI(k * u, p, "pressure")]];
  });
}

/**
 * Apparent flow-curve point of a melt-flow-rate test in the standard die (2.095 × 8.000 mm, barrel 9.550 mm).
 * @customfunction MFRPOINT
 * @example =RHEO.MFRPOINT(12, "g/10min", 2.16, 0.76) places an MFR result as an apparent shear rate and viscosity.
 * @param rate The MFR (mass per time, e.g. g/10min) or MVR (volume per time, e.g. cm3/10min).
 * @param rateUnit Unit of rate: a mass rate such as "g/10min" (then give density) or a volume rate such as "cm3/10min".
 * @param load Test load in kg, e.g. 2.16.
 * @param density Melt density at the test temperature, needed for an MFR (default unit g/cm3).
 * @param densityUnit Unit of density (default g/cm3).
 * @returns One row: apparent shear rate [1/s], apparent wall stress [Pa], apparent viscosity [Pa.s].
 */
export function mfrPoint(rate: unknown, rateUnit: string, load: unknown, density?: unknown, densityUnit?: string): unknown[][] {
  return guard("mfrPoint", () => {
    const unit = optionalText(rateUnit, "rateUnit", "");
    const value = scalar(rate, "rate");
    const kg = scalar(load, "load");
    let flow: { volumeRate?: number; massRate?: number; density?: number };
    if (isUnitOf("volumetricFlow", unit)) flow = { volumeRate: toSI(value, unit, "volumetricFlow", "rateUnit") };
    else if (isUnitOf("massRate", unit)) {
      if (density === null || density === undefined || density === "") throw new RheoError("missing", "density", "an MFR (mass per time) needs the melt density");
      flow = { massRate: toSI(value, unit, "massRate", "rateUnit"), density: toSI(scalar(density, "density"), unitArg(densityUnit, "densityUnit", "density", U.density), "density", "density") };
    } else throw new RheoError("value", "rateUnit", `"${unit}" is neither a mass rate (e.g. g/10min) nor a volume rate (e.g. cm3/10min)`);
    const p = meltFlowPoint(flow, kg);
    return [[p.shearRateApparent, p.wallShearStressApparent, p.viscosityApparent]];
  });
}
