/**
 * `rheoledger compare LOT.csv (--reference REF.csv | --model NAME --params k=v,...) [options]`:
 * compares a new lot's flow curve with a reference table or model within a tolerance band and
 * prints the per-rate deviations, the verdict and the worst point.
 *
 * Exit status: 0 when the lot passes, 3 when it fails or could not be judged (no reference rate
 * inside the lot's range), 1 for bad input, 2 for usage errors.
 */
import { RheoError } from "../core/errors";
import { compareLot, DEFAULT_LOT_COMPARISON_OPTIONS, type LotComparison, type LotReference } from "../core/lotComparison";
import { compareParameters, type ParameterComparison } from "../core/parameterComparison";
import { fitModel } from "../core/fit";
import { toSI } from "../core/units";
import { parseCsv } from "../io/csv";
import { readFlowCurveTable } from "../io/flowCurveTable";
import { readParameters } from "../io/planOptions";
import { lotComparisonTable, lotVerdictTable } from "../io/planTables";
import { parseArgs, splitQuantity, type FlagSpec } from "./args";
import { num, table } from "./format";
import { CliIO, readInputText } from "./io";
import { warningsText } from "./planCommand";

export const COMPARE_FLAGS: Record<string, FlagSpec> = {
  reference: { value: true, description: "reference flow curve CSV (shear_rate [1/s], viscosity [Pa.s])" },
  model: { value: true, description: "reference model id, e.g. power-law, carreau, cross (instead of --reference)" },
  params: { value: true, description: 'model parameters in SI, e.g. "K=12000,n=0.38"' },
  temperature: { value: true, description: 'temperature for cross-wlf, e.g. "230 C"' },
  rates: { value: true, description: "rates (1/s) to compare a model at, e.g. 10,100,1000 (default: the lot's rates)" },
  tolerance: { value: true, description: `band half-width in percent (default ${DEFAULT_LOT_COMPARISON_OPTIONS.tolerance * 100})` },
  "compare-parameters": { value: false, description: "with --model: fit the lot with the model and compare parameters (95 % intervals)" },
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  help: { value: false, description: "show this help" },
};

export const COMPARE_USAGE = `rheoledger compare LOT.csv (--reference REF.csv | --model NAME --params k=v,...) [options]

Compares a lot's flow curve with a reference at the reference's rates (a model: at the lot's rates
or --rates), interpolating the lot in log–log; rates outside the lot's measured range are reported
as not compared, never extrapolated. A point passes when |η_lot/η_ref − 1| ≤ tolerance.
Exit status: 0 pass, 3 fail or not judged, 1 bad input, 2 usage.

CSV files: a header row with "shear_rate [1/s]" (or shear_rate_wall) and "viscosity [Pa.s]".

Options:
${Object.entries(COMPARE_FLAGS)
  .map(([k, s]) => `  --${k}${s.value ? " VALUE" : ""}`.padEnd(28) + s.description)
  .join("\n")}
`;

function readCurve(io: CliIO, file: string, argument: string) {
  const input = readInputText(io, file);
  const csv = parseCsv(input.text, file);
  const read = readFlowCurveTable(
    csv.lines.map((l) => l.cells),
    { argument, rowWord: "line", rowNumbers: csv.lines.map((l) => l.line), decimalMark: csv.delimiter === "," ? "." : undefined },
  );
  return { ...read, warnings: [...input.warnings, ...read.warnings] };
}

function numberList(text: string, flag: string): number[] {
  return text.split(/[,;\s]+/).filter((s) => s !== "").map((s) => {
    const v = Number(s);
    if (!Number.isFinite(v) || v <= 0) throw new RheoError("value", flag, `expected positive numbers separated by commas, got "${s}"`);
    return v;
  });
}

/** The JSON document of a comparison (SI units). */
export function compareJson(result: LotComparison, parameters: ParameterComparison | null, warnings: LotComparison["warnings"]) {
  return {
    units: { shearRate: "1/s", viscosity: "Pa.s", deviation: "1 (fraction)" },
    verdict: result.verdict,
    tolerance: result.tolerance,
    worst: result.worst,
    compared: result.compared,
    failed: result.failed,
    notCompared: result.notCompared,
    points: result.points,
    parameters,
    warnings,
  };
}

function render(header: string[], rows: (string | number)[][]): string {
  return table(header, rows.map((r) => r.map((c) => (typeof c === "number" ? num(c) : c))));
}

/** Runs `rheoledger compare`; returns the exit code. */
export function runCompareCommand(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, COMPARE_FLAGS);
  if (args.flags.has("help")) {
    io.stdout(COMPARE_USAGE);
    return 0;
  }
  const lotFile = args.positionals[0];
  const refFile = args.flags.get("reference");
  const model = args.flags.get("model");
  if (!lotFile || args.positionals.length > 1 || (typeof refFile === "string") === (typeof model === "string")) {
    io.stderr(`rheoledger compare: give one lot CSV and either --reference REF.csv or --model NAME\n\n${COMPARE_USAGE}`);
    return 2;
  }
  const tolText = args.flags.get("tolerance");
  const tolerance = typeof tolText === "string" ? Number(tolText) / 100 : DEFAULT_LOT_COMPARISON_OPTIONS.tolerance;
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) throw new RheoError("value", "--tolerance", `expected a percentage above 0, e.g. 10, got "${String(tolText)}"`);
  const lot = readCurve(io, lotFile, "lot");
  const warnings = [...lot.warnings];
  let reference: LotReference;
  let parameters: ParameterComparison | null = null;
  if (typeof refFile === "string") {
    for (const f of ["params", "temperature", "rates", "compare-parameters"]) {
      if (args.flags.has(f)) throw new RheoError("value", `--${f}`, "applies only with --model");
    }
    const ref = readCurve(io, refFile, "reference");
    warnings.push(...ref.warnings);
    reference = { kind: "table", ...ref.table };
  } else {
    const p = args.flags.get("params");
    if (typeof p !== "string") throw new RheoError("missing", "--params", 'is required with --model, e.g. --params "K=12000,n=0.38"');
    const t = args.flags.get("temperature");
    const temperature = typeof t === "string" ? toSI(splitQuantity(t, "--temperature").value, splitQuantity(t, "--temperature").unit, "temperature", "--temperature") : undefined;
    const r = args.flags.get("rates");
    reference = { kind: "model", model: model as string, parameters: readParameters(p, "--params"), temperature, shearRate: typeof r === "string" ? numberList(r, "--rates") : undefined };
    if (args.flags.has("compare-parameters")) {
      const fit = fitModel(model as string, { shearRate: [...lot.table.shearRate], viscosity: [...lot.table.viscosity], temperature: temperature === undefined ? undefined : lot.table.shearRate.map(() => temperature) });
      parameters = compareParameters({ parameters: reference.parameters }, fit);
      warnings.push(...fit.warnings);
    }
  }
  const result = compareLot(reference, lot.table, { tolerance });
  warnings.push(...result.warnings);
  if (args.flags.has("json")) io.stdout(JSON.stringify(compareJson(result, parameters, warnings), null, 2) + "\n");
  else {
    const t = lotComparisonTable(result);
    const v = lotVerdictTable(result);
    const out = [render(t.header, t.rows), "", render(v.header, v.rows)];
    if (parameters) {
      out.push("", `Parameters (lot fitted with ${String(model)}; 95 % intervals): ${parameters.verdict}`);
      out.push(render(["parameter", "reference", "lot", "lot_interval", "difference [%]", "consistent"], parameters.rows.map((r) => [
        r.name, r.reference, r.lot, r.lotInterval ? `${num(r.lotInterval[0])} … ${num(r.lotInterval[1])}` : "—",
        r.relativeDifference === null ? "—" : r.relativeDifference * 100, r.consistent === null ? "not judged" : r.consistent ? "yes" : "NO",
      ])));
    }
    out.push("", warningsText(warnings));
    io.stdout(out.join("\n") + "\n");
  }
  return result.verdict === "pass" ? 0 : 3;
}
