/**
 * `rheoledger plan OPTIONS.json [--json]`: plans a capillary test from a small JSON options file
 * (keys in src/io/planOptions.ts, documented in the README and in PLAN_USAGE) and prints the speed
 * ladder per die with predicted pressures, the transducer suggestion, material and duration.
 */
import { RheoError, type Warning } from "../core/errors";
import { planTest, DEFAULT_PLANNER_OPTIONS, type Plan } from "../core/planner";
import { readPlanOptions } from "../io/planOptions";
import { planStepTable, planSummaryTable, type SheetTable } from "../io/planTables";
import { parseArgs, type FlagSpec } from "./args";
import { num, table } from "./format";
import { CliIO, readInputFile } from "./io";

export const PLAN_FLAGS: Record<string, FlagSpec> = {
  json: { value: false, description: "print one JSON document in SI units instead of tables" },
  help: { value: false, description: "show this help" },
};

export const PLAN_USAGE = `rheoledger plan OPTIONS.json [--json]

Plans a test before the barrel is loaded: a log-spaced piston-speed ladder per die, the predicted
pressure of each step (from a prior viscosity), the suggested transducer, material per step and in
total against the barrel's capacity, and the test duration. Predictions are estimates: the
instrument's manual and the transducer's rating decide what is safe to run.

OPTIONS.json (dimensional values as "value unit" text; see workbooks/demo-plan.json):
  barrelDiameter       barrel bore, e.g. "15 mm"                              (required)
  usableLength         usable piston travel, e.g. "200 mm" (or usableVolume "35 cm3")
  density              melt density at test temperature, e.g. "0.75 g/cm3"    (required)
  dwellTime            minimum time per step, e.g. "60 s"                     (required)
  compressibility      melt compressibility, e.g. "1 1/GPa": adds the steady-state criterion
  shearRateMin/Max     target range, e.g. "10 1/s", "5000 1/s"               (required)
  points               steps per die (2–200)                                 (required)
  rateBasis            "apparent" (default) or "wall" (true wall shear rate)
  prior viscosity, exactly one of:
    priorModel + priorParameters   e.g. "power-law" + {"K": 12000, "n": 0.38} (SI), priorTemperature for cross-wlf
    mfr (or mvr) + mfrLoad         e.g. "2 g/10min" + "2.16 kg"; flowIndex n assumed (default 0.4)
    apparentViscosity + apparentShearRate   one point, e.g. "800 Pa.s" at "100 1/s"; flowIndex as above
  priorTemperature     temperature the prior belongs to, e.g. "190 C"
  testTemperature      melt temperature of the test, e.g. "210 C"
  priorActivationEnergy  Arrhenius Ea that shifts the prior to the test's temperature, e.g. "50 kJ/mol"
  priorWlfC1, priorWlfC2 or the WLF constants at priorTemperature, e.g. 4.5 and "150 K"
  endCorrection        assumed Bagley e in die radii (default ${DEFAULT_PLANNER_OPTIONS.endCorrection})
  lowFraction, highFraction   trusted share of full scale (default ${DEFAULT_PLANNER_OPTIONS.lowFraction * 100} % and ${DEFAULT_PLANNER_OPTIONS.highFraction * 100} %)
  settleTolerance      steady-state criterion (default ${DEFAULT_PLANNER_OPTIONS.settleTolerance * 100} %)
  timePerLoad          loading and preheating per die, e.g. "10 min" (default 0)
  dies                 [{"name", "type": capillary|orifice|slit, "diameter", "length", "width", "height", "transducer"?}]
  transducers          [{"name", "fullScale": "500 bar", "accuracy": "0.25 %"}]
`;

/** The JSON document of a plan (SI units). */
export function planJson(plan: Plan, prior: string) {
  return {
    units: { pressure: "Pa", length: "m", time: "s", volume: "m3", mass: "kg", viscosity: "Pa.s", shearRate: "1/s", speed: "m/s", flowRate: "m3/s" },
    prior,
    caution: plan.caution,
    options: plan.options,
    barrelVolume: plan.barrelVolume,
    barrelMass: plan.barrelMass,
    totalVolume: plan.totalVolume,
    totalMass: plan.totalMass,
    totalDuration: plan.totalDuration,
    dies: plan.dies.map((d) => ({
      die: d.die,
      transducer: d.transducer,
      suggested: d.suggested,
      transducerCoversAll: d.transducerCoversAll,
      volume: d.volume,
      mass: d.mass,
      capacityUsed: d.capacityUsed,
      duration: d.duration,
      steps: d.steps,
    })),
    warnings: plan.warnings,
  };
}

function render(t: SheetTable, pick?: number[]): string {
  const cols = pick ?? t.header.map((_, i) => i);
  return table(
    cols.map((i) => t.header[i] as string),
    t.rows.map((r) => cols.map((i) => (typeof r[i] === "number" ? num(r[i] as number) : String(r[i])))),
  );
}

/** Readable plan: one ladder per die, the summary, the warnings. */
export function planText(plan: Plan, prior: string): string {
  const steps = planStepTable(plan);
  const out: string[] = [`Prior viscosity: ${prior}`, ...plan.caution.map((c) => `Caution: ${c}`), ""];
  for (const d of plan.dies) {
    const rows = steps.rows.filter((r) => r[0] === d.die.name);
    out.push(`== die "${d.die.name}" (${d.die.kind}), transducer "${d.transducer.name}"`);
    out.push(render({ header: steps.header, rows }, [1, 2, 3, 6, 8, 10, 11, 12, 14, 15, 16]), "");
  }
  out.push("Summary (one barrel load per die)", render(planSummaryTable(plan)), "");
  out.push(warningsText(plan.warnings));
  return out.join("\n") + "\n";
}

export function warningsText(warnings: Warning[]): string {
  if (warnings.length === 0) return "No warnings.";
  return ["Warnings", ...warnings.map((w) => `  [${w.code}] ${w.message}`)].join("\n");
}

/** Runs `rheoledger plan`; returns the exit code. Throws RheoError for bad options (main prints it). */
export function runPlanCommand(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, PLAN_FLAGS);
  if (args.flags.has("help")) {
    io.stdout(PLAN_USAGE);
    return 0;
  }
  const file = args.positionals[0];
  if (!file || args.positionals.length > 1) {
    io.stderr(`rheoledger plan: give exactly one options file\n\n${PLAN_USAGE}`);
    return 2;
  }
  const text = readInputFile(io, file);
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new RheoError("value", file, `is not valid JSON: ${(e as Error).message}`);
  }
  const parsed = readPlanOptions(raw);
  const plan = planTest(parsed.input, parsed.options);
  io.stdout(args.flags.has("json") ? JSON.stringify(planJson(plan, parsed.priorDescription), null, 2) + "\n" : planText(plan, parsed.priorDescription));
  return 0;
}
