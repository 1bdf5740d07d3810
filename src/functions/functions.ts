/**
 * Excel worksheet functions of the RHEO namespace. Each is a thin adapter over src/core: read the
 * ranges and units (./adapter), call the core, shape the result. The JSDoc of each function is
 * what Excel shows: custom-functions-metadata-plugin turns the @customfunction blocks into
 * dist/functions.json at build time and appends a `CustomFunctions.associate(id, function)` call
 * for each of them to this module, so none is written here.
 *
 * Every data argument takes a single cell, a column or a row; results spill in the same
 * orientation. Errors are returned as cell errors (see ./adapter/cellErrors.ts), never thrown.
 */
import { apparentShearRate, apparentWallShearStress, correctedWallShearStress, viscosityFromStressAndRate, wallShearStressFromEndCorrection } from "../core/capillary";
import { flowRateFromMassRate, flowRateFromPiston } from "../core/flow";
import { acceptedUnits, convertUnit, knownQuantities } from "../core/units";
import { AS_IS, DEFAULT_SHEET_UNITS as U, SI_RESULT, UnitArgument, guard, mapRows, rowCells2, rowCells3, rowCells4, flatten, readNumber, isBlank, optionalText, quantityArg } from "./adapter";
import { bagleyTable, rabinowitschColumn } from "./tables";
import { reduceTable } from "./reduceTable";

/*
 * The unit arguments of the element-wise functions, declared once: the per-row lane
 * (adapter/rowCells.ts) reads their factors, the general path (mapRows) their unit texts. Each
 * element-wise function tries the lane first and hands everything else to its `...Rows` twin,
 * which holds the general path; keeping that path (a closure over the arguments) out of the
 * function itself spares a per-row call an allocation.
 */
const PRESSURE_UNIT = new UnitArgument("pressureUnit", "pressure", U.pressure);
const LENGTH_UNIT = new UnitArgument("lengthUnit", "length", U.length);
const SPEED_UNIT = new UnitArgument("speedUnit", "speed", U.speed);
const FLOW_UNIT = new UnitArgument("flowUnit", "volumetricFlow", U.volumetricFlow);
const MASS_RATE_UNIT = new UnitArgument("massRateUnit", "massRate", U.massRate);
const DENSITY_UNIT = new UnitArgument("densityUnit", "density", U.density);
const STRESS_UNIT = new UnitArgument("stressUnit", "pressure", U.stress);
const FLOW_OUTPUT = new UnitArgument("outputUnit", "volumetricFlow", U.volumetricFlow);
const STRESS_OUTPUT = new UnitArgument("outputUnit", "pressure", U.stress);
const VISCOSITY_OUTPUT = new UnitArgument("outputUnit", "viscosity", U.viscosity);

/**
 * Volumetric flow rate pushed by the piston, Q = v·π·Db²/4.
 * @customfunction FLOWRATE
 * @example =RHEO.FLOWRATE(B2:B20, 15) with piston speeds in mm/min in B and a 15 mm barrel: mm3/s per row.
 * @param pistonSpeed Piston speed v: a cell, column or row (default unit mm/min).
 * @param barrelDiameter Barrel bore Db: one cell or a range as long as pistonSpeed (default unit mm).
 * @param speedUnit Unit of pistonSpeed, e.g. "mm/min", "mm/s" (default mm/min).
 * @param lengthUnit Unit of barrelDiameter, e.g. "mm", "in" (default mm).
 * @param outputUnit Unit of the result, e.g. "mm3/s", "cm3/min" (default mm3/s).
 * @returns Flow rate per row, aligned with pistonSpeed.
 */
export function flowRate(
  pistonSpeed: unknown[][],
  barrelDiameter: unknown[][],
  speedUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return (
    rowCells2(flowRateFromPiston, pistonSpeed, SPEED_UNIT.factor(speedUnit), barrelDiameter, LENGTH_UNIT.factor(lengthUnit), FLOW_OUTPUT.factor(outputUnit)) ??
    flowRateRows(pistonSpeed, barrelDiameter, speedUnit, lengthUnit, outputUnit)
  );
}

function flowRateRows(pistonSpeed: unknown[][], barrelDiameter: unknown[][], speedUnit?: string, lengthUnit?: string, outputUnit?: string): unknown[][] {
  return guard("flowRate", () =>
    mapRows(
      [
        { argument: "pistonSpeed", range: pistonSpeed, quantity: "speed", unit: SPEED_UNIT.read(speedUnit) },
        { argument: "barrelDiameter", range: barrelDiameter, quantity: "length", unit: LENGTH_UNIT.read(lengthUnit) },
      ],
      flowRateFromPiston,
      { quantity: "volumetricFlow", unit: FLOW_OUTPUT.read(outputUnit) },
    ),
  );
}

/**
 * Volumetric flow rate from a weighed extrudate, Q = mass rate / melt density.
 * @customfunction FLOWRATEMASS
 * @example =RHEO.FLOWRATEMASS(C2:C9, 0.76, "g/10min") gives mm3/s per row.
 * @param massRate Mass throughput: a cell, column or row (default unit g/min).
 * @param density Melt density at test temperature: one cell or a range as long as massRate (default unit g/cm3).
 * @param massRateUnit Unit of massRate, e.g. "g/min", "g/10min", "kg/h" (default g/min).
 * @param densityUnit Unit of density, e.g. "g/cm3", "kg/m3" (default g/cm3).
 * @param outputUnit Unit of the result, e.g. "mm3/s", "cm3/min" (default mm3/s).
 * @returns Flow rate per row, aligned with massRate.
 */
export function flowRateMass(
  massRate: unknown[][],
  density: unknown[][],
  massRateUnit?: string,
  densityUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return (
    rowCells2(flowRateFromMassRate, massRate, MASS_RATE_UNIT.factor(massRateUnit), density, DENSITY_UNIT.factor(densityUnit), FLOW_OUTPUT.factor(outputUnit)) ??
    flowRateMassRows(massRate, density, massRateUnit, densityUnit, outputUnit)
  );
}

function flowRateMassRows(massRate: unknown[][], density: unknown[][], massRateUnit?: string, densityUnit?: string, outputUnit?: string): unknown[][] {
  return guard("flowRateMass", () =>
    mapRows(
      [
        { argument: "massRate", range: massRate, quantity: "massRate", unit: MASS_RATE_UNIT.read(massRateUnit) },
        { argument: "density", range: density, quantity: "density", unit: DENSITY_UNIT.read(densityUnit) },
      ],
      flowRateFromMassRate,
      { quantity: "volumetricFlow", unit: FLOW_OUTPUT.read(outputUnit) },
    ),
  );
}

/**
 * Apparent wall shear rate in a round die, 32Q/(πD³), in 1/s.
 * @customfunction SHEARRATEAPP
 * @example =RHEO.SHEARRATEAPP(D2:D20, 1) for a 1 mm die gives 1/s per row.
 * @param flowRate Volumetric flow rate Q: a cell, column or row (default unit mm3/s).
 * @param dieDiameter Die diameter D: one cell or a range as long as flowRate (default unit mm).
 * @param flowUnit Unit of flowRate, e.g. "mm3/s", "cm3/min" (default mm3/s).
 * @param lengthUnit Unit of dieDiameter, e.g. "mm", "in" (default mm).
 * @returns Apparent shear rate in 1/s per row.
 */
export function shearRateApp(flowRate: unknown[][], dieDiameter: unknown[][], flowUnit?: string, lengthUnit?: string): unknown[][] {
  return rowCells2(apparentShearRate, flowRate, FLOW_UNIT.factor(flowUnit), dieDiameter, LENGTH_UNIT.factor(lengthUnit), SI_RESULT) ?? shearRateAppRows(flowRate, dieDiameter, flowUnit, lengthUnit);
}

function shearRateAppRows(flowRate: unknown[][], dieDiameter: unknown[][], flowUnit?: string, lengthUnit?: string): unknown[][] {
  return guard("shearRateApp", () =>
    mapRows(
      [
        { argument: "flowRate", range: flowRate, quantity: "volumetricFlow", unit: FLOW_UNIT.read(flowUnit) },
        { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: LENGTH_UNIT.read(lengthUnit) },
      ],
      apparentShearRate,
    ),
  );
}

/**
 * Apparent (uncorrected) wall shear stress, ΔP·D/(4L); includes the entrance loss.
 * @customfunction WALLSTRESSAPP
 * @example =RHEO.WALLSTRESSAPP(E2:E20, 1, 20) for a 1 × 20 mm die, pressures in bar: Pa per row.
 * @param pressure Measured pressure drop ΔP: a cell, column or row (default unit bar).
 * @param dieDiameter Die diameter D: one cell or a range as long as pressure (default unit mm).
 * @param dieLength Die length L: one cell or a range as long as pressure (default unit mm).
 * @param pressureUnit Unit of pressure, e.g. "bar", "MPa", "psi" (default bar).
 * @param lengthUnit Unit of dieDiameter and dieLength (default mm).
 * @param outputUnit Unit of the stress, e.g. "Pa", "kPa" (default Pa).
 * @returns Apparent wall shear stress per row.
 */
export function wallStressApp(
  pressure: unknown[][],
  dieDiameter: unknown[][],
  dieLength: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  const l = LENGTH_UNIT.factor(lengthUnit);
  return (
    rowCells3(apparentWallShearStress, pressure, PRESSURE_UNIT.factor(pressureUnit), dieDiameter, l, dieLength, l, STRESS_OUTPUT.factor(outputUnit)) ??
    wallStressAppRows(pressure, dieDiameter, dieLength, pressureUnit, lengthUnit, outputUnit)
  );
}

function wallStressAppRows(pressure: unknown[][], dieDiameter: unknown[][], dieLength: unknown[][], pressureUnit?: string, lengthUnit?: string, outputUnit?: string): unknown[][] {
  return guard("wallStressApp", () => {
    const p = PRESSURE_UNIT.read(pressureUnit);
    const l = LENGTH_UNIT.read(lengthUnit);
    return mapRows(
      [
        { argument: "pressure", range: pressure, quantity: "pressure", unit: p },
        { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: l },
        { argument: "dieLength", range: dieLength, quantity: "length", unit: l },
      ],
      apparentWallShearStress,
      { quantity: "pressure", unit: STRESS_OUTPUT.read(outputUnit) },
    );
  });
}

/**
 * Wall shear stress corrected for the entrance loss, (ΔP − ΔPent)·D/(4L).
 * @customfunction WALLSTRESS
 * @example =RHEO.WALLSTRESS(E2:E20, H2:H20, 1, 20, "bar", "mm", "kPa")
 * @param pressure Measured pressure drop ΔP: a cell, column or row (default unit bar).
 * @param entrancePressure Entrance pressure loss ΔPent at the same rate, e.g. from RHEO.BAGLEY: one cell or a range as long as pressure (same unit as pressure).
 * @param dieDiameter Die diameter D: one cell or a range as long as pressure (default unit mm).
 * @param dieLength Die length L: one cell or a range as long as pressure (default unit mm).
 * @param pressureUnit Unit of pressure and entrancePressure, e.g. "bar", "MPa" (default bar).
 * @param lengthUnit Unit of dieDiameter and dieLength (default mm).
 * @param outputUnit Unit of the stress, e.g. "Pa", "kPa" (default Pa).
 * @returns Corrected wall shear stress per row.
 */
export function wallStress(
  pressure: unknown[][],
  entrancePressure: unknown[][],
  dieDiameter: unknown[][],
  dieLength: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  const p = PRESSURE_UNIT.factor(pressureUnit);
  const l = LENGTH_UNIT.factor(lengthUnit);
  return (
    rowCells4(correctedWallShearStress, pressure, p, entrancePressure, p, dieDiameter, l, dieLength, l, STRESS_OUTPUT.factor(outputUnit)) ??
    wallStressRows(pressure, entrancePressure, dieDiameter, dieLength, pressureUnit, lengthUnit, outputUnit)
  );
}

function wallStressRows(
  pressure: unknown[][],
  entrancePressure: unknown[][],
  dieDiameter: unknown[][],
  dieLength: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return guard("wallStress", () => {
    const p = PRESSURE_UNIT.read(pressureUnit);
    const l = LENGTH_UNIT.read(lengthUnit);
    return mapRows(
      [
        { argument: "pressure", range: pressure, quantity: "pressure", unit: p },
        { argument: "entrancePressure", range: entrancePressure, quantity: "pressure", unit: p },
        { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: l },
        { argument: "dieLength", range: dieLength, quantity: "length", unit: l },
      ],
      correctedWallShearStress,
      { quantity: "pressure", unit: STRESS_OUTPUT.read(outputUnit) },
    );
  });
}

/**
 * Wall shear stress corrected with the Bagley end correction e (in die radii), ΔP/(2(L/R + e)).
 * @customfunction WALLSTRESSEND
 * @example =RHEO.WALLSTRESSEND(E2:E20, 2.4, 1, 20)
 * @param pressure Measured pressure drop ΔP: a cell, column or row (default unit bar).
 * @param endCorrection Bagley end correction e in die radii (dimensionless), e.g. from RHEO.BAGLEY: one cell or a range as long as pressure.
 * @param dieDiameter Die diameter D: one cell or a range as long as pressure (default unit mm).
 * @param dieLength Die length L: one cell or a range as long as pressure (default unit mm).
 * @param pressureUnit Unit of pressure, e.g. "bar", "MPa" (default bar).
 * @param lengthUnit Unit of dieDiameter and dieLength (default mm).
 * @param outputUnit Unit of the stress, e.g. "Pa", "kPa" (default Pa).
 * @returns Corrected wall shear stress per row.
 */
export function wallStressEnd(
  pressure: unknown[][],
  endCorrection: unknown[][],
  dieDiameter: unknown[][],
  dieLength: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  const l = LENGTH_UNIT.factor(lengthUnit);
  return (
    rowCells4(wallShearStressFromEndCorrection, pressure, PRESSURE_UNIT.factor(pressureUnit), endCorrection, AS_IS, dieDiameter, l, dieLength, l, STRESS_OUTPUT.factor(outputUnit)) ??
    wallStressEndRows(pressure, endCorrection, dieDiameter, dieLength, pressureUnit, lengthUnit, outputUnit)
  );
}

function wallStressEndRows(
  pressure: unknown[][],
  endCorrection: unknown[][],
  dieDiameter: unknown[][],
  dieLength: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return guard("wallStressEnd", () => {
    const l = LENGTH_UNIT.read(lengthUnit);
    return mapRows(
      [
        { argument: "pressure", range: pressure, quantity: "pressure", unit: PRESSURE_UNIT.read(pressureUnit) },
        { argument: "endCorrection", range: endCorrection },
        { argument: "dieDiameter", range: dieDiameter, quantity: "length", unit: l },
        { argument: "dieLength", range: dieLength, quantity: "length", unit: l },
      ],
      wallShearStressFromEndCorrection,
      { quantity: "pressure", unit: STRESS_OUTPUT.read(outputUnit) },
    );
  });
}

/**
 * Bagley table: one row per apparent rate with rate, wall stress, entrance pressure, e, R² and dies used.
 * @customfunction BAGLEY
 * @example =RHEO.BAGLEY(A2:A40, F2:F40, E2:E40, , , , "kPa", TRUE) spills rate, stress, ΔPent, e, R², dies with a header.
 * @param dieLengthOrRatio Per measured point: die L/D (dimensionless), or the die length L when dieDiameter is given.
 * @param shearRateApparent Apparent wall shear rate per point, in 1/s (same length).
 * @param pressure Measured pressure drop per point (same length; default unit bar).
 * @param dieDiameter Die diameter D (one cell or per point); when given, dieLengthOrRatio is read as the length L (default unit mm).
 * @param pressureUnit Unit of pressure and of the entrance-pressure column (default bar).
 * @param lengthUnit Unit of the die length and diameter (default mm).
 * @param stressUnit Unit of the wall-stress column, e.g. "Pa", "kPa" (default Pa).
 * @param header TRUE to put a header row above the table (default FALSE).
 * @returns Columns: apparent rate [1/s], wall stress, entrance pressure, e [-], R² [-], dies used.
 */
export function bagley(
  dieLengthOrRatio: unknown[][],
  shearRateApparent: unknown[][],
  pressure: unknown[][],
  dieDiameter?: unknown[][],
  pressureUnit?: string,
  lengthUnit?: string,
  stressUnit?: string,
  header?: boolean,
): unknown[][] {
  return guard("bagley", () =>
    bagleyTable({ dieLengthOrRatio, shearRateApparent, pressure, dieDiameter, pressureUnit, lengthUnit, stressUnit, header }),
  );
}

/**
 * Local flow index n' = d ln τw / d ln γ̇a at each point of a flow curve.
 * @customfunction NPRIME
 * @example =RHEO.NPRIME(J2:J12, K2:K12)
 * @param shearRateApparent Apparent wall shear rate per point, in 1/s: a column or row.
 * @param wallShearStress Wall shear stress per point (any one stress unit; best end-corrected), same length.
 * @param method How ln τw(ln γ̇a) is smoothed: "transition" (fitted S-shaped curve), "local", "global" (polynomials) or "difference" (default transition).
 * @param degree Polynomial degree for the local (1–2) or global (1–3) method (default 2).
 * @returns n' per row, aligned with the input.
 */
export function nPrime(shearRateApparent: unknown[][], wallShearStress: unknown[][], method?: string, degree?: number): unknown[][] {
  return guard("nPrime", () => rabinowitschColumn("nPrime", { shearRateApparent, wallShearStress, method, degree }));
}

/**
 * True (Rabinowitsch-corrected) wall shear rate, γ̇a·(3n'+1)/(4n'), in 1/s.
 * @customfunction SHEARRATEWALL
 * @example =RHEO.SHEARRATEWALL(J2:J12, K2:K12, "global", 2)
 * @param shearRateApparent Apparent wall shear rate per point, in 1/s: a column or row.
 * @param wallShearStress Wall shear stress per point (any one stress unit; best end-corrected), same length.
 * @param method How ln τw(ln γ̇a) is smoothed: "transition" (fitted S-shaped curve), "local", "global" (polynomials) or "difference" (default transition).
 * @param degree Polynomial degree for the local (1–2) or global (1–3) method (default 2).
 * @returns True wall shear rate in 1/s per row, aligned with the input.
 */
export function shearRateWall(shearRateApparent: unknown[][], wallShearStress: unknown[][], method?: string, degree?: number): unknown[][] {
  return guard("shearRateWall", () => rabinowitschColumn("shearRateWall", { shearRateApparent, wallShearStress, method, degree }));
}

/**
 * True viscosity τw/γ̇w, with the Rabinowitsch-corrected wall rate computed from the flow curve.
 * @customfunction VISCOSITY
 * @example =RHEO.VISCOSITY(J2:J12, K2:K12) gives Pa.s per row.
 * @param shearRateApparent Apparent wall shear rate per point, in 1/s: a column or row.
 * @param wallShearStress Wall shear stress per point, best end-corrected (same length; default unit Pa).
 * @param method How ln τw(ln γ̇a) is smoothed: "transition", "local", "global" or "difference" (default transition).
 * @param degree Polynomial degree for the local (1–2) or global (1–3) method (default 2).
 * @param stressUnit Unit of wallShearStress, e.g. "Pa", "kPa" (default Pa).
 * @param outputUnit Unit of the viscosity, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @returns Viscosity per row, aligned with the input.
 */
export function viscosity(
  shearRateApparent: unknown[][],
  wallShearStress: unknown[][],
  method?: string,
  degree?: number,
  stressUnit?: string,
  outputUnit?: string,
): unknown[][] {
  return guard("viscosity", () =>
    rabinowitschColumn("viscosity", { shearRateApparent, wallShearStress, method, degree, stressUnit, outputUnit }),
  );
}

/**
 * Apparent viscosity τw/γ̇a (no Rabinowitsch correction).
 * @customfunction VISCOSITYAPP
 * @example =RHEO.VISCOSITYAPP(J2:J12, K2:K12, "kPa")
 * @param shearRateApparent Apparent wall shear rate, in 1/s: a cell, column or row.
 * @param wallShearStress Wall shear stress: one cell or a range as long as shearRateApparent (default unit Pa).
 * @param stressUnit Unit of wallShearStress, e.g. "Pa", "kPa" (default Pa).
 * @param outputUnit Unit of the viscosity, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @returns Apparent viscosity per row.
 */
export function viscosityApp(shearRateApparent: unknown[][], wallShearStress: unknown[][], stressUnit?: string, outputUnit?: string): unknown[][] {
  return (
    rowCells2(apparentViscosity, shearRateApparent, AS_IS, wallShearStress, STRESS_UNIT.factor(stressUnit), VISCOSITY_OUTPUT.factor(outputUnit)) ??
    viscosityAppRows(shearRateApparent, wallShearStress, stressUnit, outputUnit)
  );
}

/** τw/γ̇a with the worksheet's argument order (rate first). */
const apparentViscosity = (rate: number, stress: number): number => viscosityFromStressAndRate(stress, rate);

function viscosityAppRows(shearRateApparent: unknown[][], wallShearStress: unknown[][], stressUnit?: string, outputUnit?: string): unknown[][] {
  return guard("viscosityApp", () =>
    mapRows(
      [
        { argument: "shearRateApparent", range: shearRateApparent },
        { argument: "wallShearStress", range: wallShearStress, quantity: "pressure", unit: STRESS_UNIT.read(stressUnit) },
      ],
      apparentViscosity,
      { quantity: "viscosity", unit: VISCOSITY_OUTPUT.read(outputUnit) },
      { shearRate: "shearRateApparent" },
    ),
  );
}

/**
 * Full reduction of raw capillary data (Bagley, Rabinowitsch, viscosities) to a flow-curve table with a header row.
 * @customfunction REDUCE
 * @example =RHEO.REDUCE(Raw!A1:F61, "bagley", , , "kPa") spills the flow curve of every temperature and diameter.
 * @param rawData The raw table including its header row of "quantity [unit]" cells: die_diameter, die_length, pressure, and flow_rate (or piston_speed with barrel_diameter, or mass_rate with density); temperature optional. Recordings: RHEO.PLATEAUS.
 * @param endCorrection "bagley" (needs two or more die lengths per diameter), "orifice" (subtracts a zero-length die's pressure) or "none" (default bagley).
 * @param method Rabinowitsch slope method: "transition", "local", "global" or "difference" (default transition).
 * @param degree Polynomial degree for local (1–2) or global (1–3) (default 2).
 * @param stressUnit Unit of the wall-stress column, e.g. "Pa", "kPa" (default Pa).
 * @param viscosityUnit Unit of the viscosity columns, e.g. "Pa.s", "mPa.s" (default Pa.s).
 * @param barrelDiameter Barrel bore when rawData has no barrel_diameter column (default unit mm).
 * @param density Melt density when rawData has no density column (default unit g/cm3).
 * @param showWarnings TRUE to list the reduction's warnings below the table (default FALSE).
 * @param settings Further reduce settings: a two-column range of name and value, e.g. transducer | 700 bar, 0.25 % (names as in docs/functions.md; default none).
 * @returns Header row, then per point: temperature [C], die diameter [mm], apparent rate, wall stress, n', true rate, viscosity, apparent viscosity.
 */
export function reduceData(
  rawData: unknown[][],
  endCorrection?: string,
  method?: string,
  degree?: number,
  stressUnit?: string,
  viscosityUnit?: string,
  barrelDiameter?: number,
  density?: number,
  showWarnings?: boolean,
  settings?: unknown[][],
): unknown[][] {
  return guard("reduce", () =>
    reduceTable({ rawData, endCorrection, method, degree, stressUnit, viscosityUnit, barrelDiameter, density, showWarnings, settings }),
  );
}

/**
 * Converts values between two units of one quantity (pressure, length, speed, flow, viscosity, temperature, ...).
 * @customfunction CONVERT
 * @example =RHEO.CONVERT(E2:E20, "psi", "bar")
 * @param value Values to convert: a cell or any range; blank cells stay blank.
 * @param fromUnit Unit of the values, e.g. "psi", "mm/min", "°F".
 * @param toUnit Unit wanted, of the same quantity, e.g. "bar", "mm/s", "C".
 * @param quantity Quantity name when a unit is ambiguous, e.g. "temperatureDifference" for K/C/F differences (default: inferred).
 * @returns The converted values, same shape as value.
 */
export function convert(value: unknown[][], fromUnit: string, toUnit: string, quantity?: string): unknown[][] {
  return guard("convert", () => {
    const from = optionalText(fromUnit, "fromUnit", "");
    const to = optionalText(toUnit, "toUnit", "");
    const q = quantityArg(quantity, "quantity");
    const grid = Array.isArray(value) ? value.map((row) => (Array.isArray(row) ? row : [row])) : [[value]];
    if (grid.length > 1 && grid.some((row) => row.length > 1)) {
      return grid.map((row, r) =>
        row.map((cell, c) => convertCell(cell, `row ${r + 1}, column ${c + 1}`, from, to, q)),
      );
    }
    const { orientation, cells } = flatten(value, "value");
    const out = cells.map((cell, i) =>
      convertCell(cell, `${orientation === "row" ? "column" : "row"} ${i + 1}`, from, to, q),
    );
    return orientation === "row" ? [out] : out.map((v) => [v]);
  });
}

function convertCell(cell: unknown, where: string, from: string, to: string, q: ReturnType<typeof quantityArg>): unknown {
  const v = readNumber(cell, "value", where);
  return v === null ? "" : convertUnit(v, from, to, q);
}

/**
 * Lists the units the RHEO functions accept: for one quantity, or every quantity with its units.
 * @customfunction UNITS
 * @example =RHEO.UNITS("pressure")
 * @param quantity A quantity name, e.g. "pressure", "viscosity"; omit for the full list.
 * @returns One unit per row; or two columns (quantity, units) when quantity is omitted.
 */
export function units(quantity?: string): unknown[][] {
  return guard("units", () => {
    const q = isBlank(quantity) ? undefined : quantityArg(quantity, "quantity");
    if (q) return acceptedUnits(q).map((u) => [u]);
    return knownQuantities().map((name) => [name, acceptedUnits(name).join(", ")]);
  });
}
