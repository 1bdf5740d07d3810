/**
 * The short text summary of a run (`rheoledger reduce --summary`, `npm run demo`): one line per
 * group with its rate window, viscosity range, end corrections and the one verdict on its model
 * fits (src/core/fit/verdict.ts), the fit across temperatures and the joined rotational curve when
 * asked for, then the number of warnings (fits included).
 */
import type { ReductionRun } from "../core/run";
import type { FitResult } from "../core/fit";
import type { Verdict } from "../core/fit/verdict";
import { getModel } from "../core/models";
import { CROSS_WLF_LITERATURE } from "../core/temperature/masterFit";
import { groupLabel } from "../core/reduce";
import { type RowAccount, rowAccountText } from "../core/rowAccount";
import { parameterValueText } from "../io/fitFormat";
import { num } from "./format";

function span(values: number[], digits = 3): string {
  if (values.length === 0) return "—";
  return `${num(Math.min(...values), digits)}–${num(Math.max(...values), digits)}`;
}

/** "cross: eta0 ≥ 1340 Pa.s (not determined …), lambda …, m 0.628" — the free parameters as the data support them. */
function parametersText(fit: Pick<FitResult, "parameters" | "undetermined" | "fixed">, specs: readonly { name: string; unit: string }[]): string {
  return specs
    .filter((p) => !fit.fixed.includes(p.name) && fit.parameters[p.name] !== undefined)
    .map((p) => `${p.name} ${parameterValueText(fit, p.name, p.unit)}`)
    .join(", ");
}

/** The verdict in one phrase: "recommended cross (eta0 …, m 0.628; not well determined)". */
export function verdictPhrase(v: Verdict): string {
  if (!v.recommended || !v.fit) return `no model fitted (${v.reason})`;
  const params = parametersText(v.fit, getModel(v.recommended).parameters);
  return `recommended ${v.recommended} (${params})${v.status === "well-determined" ? "" : "; no model is well determined by these data"}`;
}

/** The summary text of a run; `rows`, the account of the input's rows, adds an "Input:" line. */
export function reductionSummary(run: ReductionRun, rows?: RowAccount): string {
  const { result } = run;
  const out: string[] = [`Reduced ${result.groups.length} group${result.groups.length === 1 ? "" : "s"}:`];
  result.groups.forEach((g, i) => {
    const rates = g.flowCurve.map((f) => f.shearRateWall).filter((v): v is number => v !== null);
    const etas = g.flowCurve.map((f) => f.viscosity).filter((v): v is number => v !== null);
    const parts = [
      `${g.flowCurve.length} points`,
      `true wall rate ${span(rates)} 1/s`,
      `viscosity ${span(etas)} Pa.s`,
      `n' ${span(g.flowCurve.map((f) => f.nPrime), 2)} (${g.smoother.curve})`,
    ];
    if (g.bagley.length > 0) parts.push(`Bagley e ${span(g.bagley.map((b) => b.endCorrection), 2)}`);
    const gf = run.groupFits[i];
    if (gf) parts.push(verdictPhrase(gf.verdict));
    out.push(`  ${g.temperature === null ? "no temperature, " : ""}${groupLabel(g)}, ${g.dies.length} dies: ${parts.join("; ")}`);
  });
  const m = run.master;
  if (m) {
    const law = m.law === "arrhenius" ? `Ea ${num((m.activationEnergy as number) / 1e3, 3)} kJ/mol` : `c1 ${num(m.c1, 3)}, c2 ${num(m.c2, 3)} K`;
    const specs = m.model === "cross-wlf" ? CROSS_WLF_LITERATURE : getModel(m.model).parameters;
    out.push(
      `  across ${m.temperatures.length} temperatures: ${m.model}${m.model === "cross-wlf" ? "" : ` × ${m.law}`} at ${m.model === "cross-wlf" ? "D2" : "Tref"} ${num(m.referenceTemperature - 273.15)} °C (${parametersText(m, specs)}; ${law})${m.converged ? "" : "; NOT converged"}${m.wellDetermined ? "" : "; not every parameter is determined by the data"}`,
    );
  }
  const j = run.joined;
  if (j) {
    const o = j.join.overlap;
    out.push(
      `  rotational + capillary${j.temperature === null ? "" : ` at ${num(j.temperature - 273.15)} °C`}: ${o ? `overlap ratio ${num(o.ratio, 3)}${o.withinTolerance ? "" : " (outside the tolerance)"}` : "no overlap"}; ${verdictPhrase(j.fits.verdict)}`,
    );
  }
  out.push(`${rows ? "Input" : "Rows"}: ${rowAccountText(rows ?? result.rows)}`);
  const warnings = run.warnings;
  const codes = [...new Set(warnings.map((w) => w.code))];
  out.push(warnings.length === 0 ? "No warnings." : `${warnings.length} warning${warnings.length === 1 ? "" : "s"} (${codes.join(", ")}); the full list is in the Warnings sheet or without --summary.`);
  return out.join("\n") + "\n";
}
