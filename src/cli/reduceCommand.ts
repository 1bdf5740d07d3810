/**
 * `rheoledger reduce FILE.csv [--json]`: reads a raw-data CSV, reduces it with the core and
 * prints readable tables (units shown) or one JSON document in SI units.
 */
import { RheoError, Warning } from "../core/errors";
import { reduce, ReductionResult, ReduceOptions } from "../core/reduce";
import { RabinowitschMethod } from "../core/rabinowitsch";
import { toSI } from "../core/units";
import { parseCsv } from "../io/csv";
import { readRawTable } from "../io/rawTable";
import { FlagSpec, ParsedArgs, splitQuantity } from "./args";
import { num, table } from "./format";
import { GroupFits, fitFlowCurves } from "../core/flowCurveFits";
import { reductionSummary } from "./summary";
import { METHOD_FLAGS, flowCurveExtrasJson, groupExtrasJson, groupExtrasText, methodOptionsFromFlags, topExtrasJson, topExtrasText } from "./methodFlags";
import { FIT_FLAGS, buildFitReport, fitReportText, withFitJson } from "./fitReport";

export const REDUCE_FLAGS: Record<string, FlagSpec> = {
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  "end-correction": { value: true, description: "bagley (default), none, or orifice (needs an orifice die)" },
  method: { value: true, description: "Rabinowitsch slope method: transition (default), local, global, difference" },
  degree: { value: true, description: "polynomial degree for the local (1–2) or global (1–3) method" },
  window: { value: true, description: "points per local fit (default 5)" },
  "barrel-diameter": { value: true, description: 'barrel bore when the file has no barrel_diameter column, e.g. "15 mm"' },
  density: { value: true, description: 'melt density when the file has no density column, e.g. "0.76 g/cm3"' },
  ...METHOD_FLAGS,
  ...FIT_FLAGS,
  out: { value: true, description: "also write the results workbook (xlsx: summary, Bagley, flow curve, fits, warnings) to FILE" },
  summary: { value: false, description: "print a short summary (with model fits) instead of the full tables" },
};

/** What a command hands back: text for standard output, and the data it printed. */
export interface CommandOutput {
  stdout: string;
  result: ReductionResult;
  options: Partial<ReduceOptions>;
  /** warnings from reading the file */
  inputWarnings: Warning[];
  /** model fits per group, computed for --summary and --out */
  fits?: GroupFits[];
}

function wholeNumber(text: string, flag: string): number {
  const v = Number(text);
  if (!Number.isInteger(v)) throw new RheoError("value", flag, `expected a whole number, got "${text}"`);
  return v;
}

/** Reduce options from the command-line flags. */
export function reduceOptionsFromFlags(args: ParsedArgs): Partial<ReduceOptions> {
  const options: Partial<ReduceOptions> = {};
  const end = args.flags.get("end-correction");
  if (typeof end === "string") {
    if (end !== "bagley" && end !== "none" && end !== "orifice") throw new RheoError("value", "--end-correction", `expected bagley, none or orifice, got "${end}"`);
    options.endCorrection = end;
  }
  const rab: ReduceOptions["rabinowitsch"] = {};
  const method = args.flags.get("method");
  if (typeof method === "string") rab.method = method as RabinowitschMethod;
  const degree = args.flags.get("degree");
  if (typeof degree === "string") rab.degree = wholeNumber(degree, "--degree");
  const window = args.flags.get("window");
  if (typeof window === "string") rab.window = wholeNumber(window, "--window");
  options.rabinowitsch = rab;
  const density = args.flags.get("density");
  const densityParts = typeof density === "string" ? splitQuantity(density, "--density") : undefined;
  const densitySI = densityParts ? toSI(densityParts.value, densityParts.unit, "density", "--density") : undefined;
  Object.assign(options, methodOptionsFromFlags(args, densitySI));
  return options;
}

/** Reads CSV text into measurements (errors name the file's line and column). */
export function readCsvMeasurements(text: string, args: ParsedArgs) {
  const csv = parseCsv(text);
  const cells = csv.lines.map((l) => l.cells);
  const first = csv.lines[0];
  if (!first) throw new RheoError("missing", "file", "is empty");
  const barrel = args.flags.get("barrel-diameter");
  const density = args.flags.get("density");
  const q = (t: string | true | undefined, flag: string, kind: "length" | "density") => {
    if (typeof t !== "string") return undefined;
    const { value, unit } = splitQuantity(t, flag);
    return toSI(value, unit, kind, flag);
  };
  return readRawTable(cells, {
    rowWord: "line",
    headerNumber: first.line,
    rowNumbers: csv.lines.map((l) => l.line),
    decimalComma: csv.decimalComma,
    barrelDiameter: q(barrel, "--barrel-diameter", "length"),
    density: q(density, "--density", "density"),
  });
}

/** The JSON document of a reduction, SI units (the contract in the README). */
export function reductionJson(result: ReductionResult, inputWarnings: Warning[]) {
  return {
    units: { pressure: "Pa", length: "m", time: "s", temperature: "K", viscosity: "Pa.s", shearRate: "1/s" },
    groups: result.groups.map((g) => ({
      temperature: g.temperature,
      dieDiameter: g.dieDiameter,
      dies: g.dies.map((d) => ({ dieLength: d.dieLength, lengthOverRadius: d.lengthOverRadius, points: d.points })),
      bagley: g.bagley.map((b) => ({
        shearRateApparent: b.shearRateApparent,
        wallShearStress: b.wallShearStress,
        entrancePressure: b.entrancePressure,
        endCorrection: b.endCorrection,
        r2: b.r2,
        diesUsed: b.diesUsed,
      })),
      flowCurve: g.flowCurve.map((f, i) => ({
        shearRateApparent: f.shearRateApparent,
        wallShearStress: f.wallShearStress,
        nPrime: f.nPrime,
        shearRateWall: f.shearRateWall,
        viscosity: f.viscosity,
        viscosityApparent: f.viscosityApparent,
        ...flowCurveExtrasJson(g, i),
      })),
      ...groupExtrasJson(g),
      warnings: g.warnings,
    })),
    ...topExtrasJson(result),
    warnings: [...inputWarnings, ...result.warnings],
  };
}

/** Readable tables: kPa for stress, bar for pressure, °C for temperature, mm for dies. */
export function reductionText(result: ReductionResult, inputWarnings: Warning[]): string {
  const out: string[] = [];
  for (const g of result.groups) {
    const t = g.temperature === null ? "temperature not given" : `${num(g.temperature - 273.15)} °C`;
    if (g.geometry === "slit") {
      const h = g.slitHeight as number;
      out.push(`== ${t}, slit ${num((g.slitWidth as number) * 1e3)} × ${num(h * 1e3)} mm; dies: ${g.dies.map((d) => `L ${num(d.dieLength * 1e3)} mm (L/H ${num(d.dieLength / h)})`).join(", ")}`);
    } else out.push(`== ${t}, die diameter ${num(g.dieDiameter * 1e3)} mm; dies: ${g.dies.map((d) => `L ${num(d.dieLength * 1e3)} mm (L/D ${num(d.dieLength / g.dieDiameter)})`).join(", ")}`);
    if (g.bagley.length > 0) {
      out.push("", "Bagley end correction");
      out.push(
        table(
          ["shear rate app. [1/s]", "wall stress [kPa]", "entrance p. [bar]", "e [-]", "R² [-]", "dies"],
          g.bagley.map((b) => [num(b.shearRateApparent), num(b.wallShearStress / 1e3), num(b.entrancePressure / 1e5), num(b.endCorrection, 3), b.r2.toFixed(4), String(b.diesUsed)]),
        ),
      );
    }
    out.push("", "Flow curve (Rabinowitsch-corrected)");
    out.push(
      table(
        ["shear rate app. [1/s]", "wall stress [kPa]", "n' [-]", "shear rate wall [1/s]", "viscosity [Pa.s]", "visc. app. [Pa.s]"],
        g.flowCurve.map((f) => [num(f.shearRateApparent), num(f.wallShearStress / 1e3), num(f.nPrime, 3), num(f.shearRateWall), num(f.viscosity), num(f.viscosityApparent)]),
      ),
    );
    out.push(...groupExtrasText(g));
    out.push("");
  }
  out.push(...topExtrasText(result));
  const warnings = [...inputWarnings, ...result.warnings];
  if (warnings.length > 0) {
    out.push("Warnings");
    for (const w of warnings) out.push(`  [${w.code}] ${w.message}`);
  } else out.push("No warnings.");
  return out.join("\n") + "\n";
}

/** Runs `reduce` on CSV text already read from the file. */
export function runReduce(text: string, args: ParsedArgs): CommandOutput {
  const raw = readCsvMeasurements(text, args);
  const options = reduceOptionsFromFlags(args);
  const result = reduce(raw.measurements, options);
  const fits = args.flags.has("summary") || args.flags.has("out") ? fitFlowCurves(result) : undefined;
  const fitReport = buildFitReport(args, result);
  const stdout = args.flags.has("json")
    ? JSON.stringify(withFitJson(reductionJson(result, raw.warnings), fitReport), null, 2) + "\n"
    : (args.flags.has("summary")
        ? reductionSummary(result, raw.warnings, fits)
        : reductionText(result, raw.warnings)) + fitReportText(fitReport, result);
  return { stdout, result, options, inputWarnings: raw.warnings, fits };
}
