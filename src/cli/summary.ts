/**
 * The short text summary of a reduction (`rheoledger reduce --summary`, `npm run demo`): one line
 * per group with its rate window, viscosity range, end corrections and best-fitting model, then
 * the number of warnings.
 */
import type { ReductionRun } from "../core/run";
import { groupLabel } from "../core/reduce";
import { type RowAccount, rowAccountText } from "../core/rowAccount";
import { num } from "./format";

function span(values: number[], digits = 3): string {
  if (values.length === 0) return "—";
  return `${num(Math.min(...values), digits)}–${num(Math.max(...values), digits)}`;
}

/** The summary text of a run (its ranked fits, when present, name the best model per group). */
export function reductionSummary(run: ReductionRun, rows?: RowAccount): string {
  const { result } = run;
  const fits = run.comparisons;
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
    // The lowest AIC whose parameters are all determined by the data; a lower-AIC model with a
    // parameter whose standard error exceeds its value is named beside it, not as the answer.
    const ranked = fits?.[i]?.ranked ?? [];
    const determined = (r: (typeof ranked)[number]) => !r.result.warnings.some((w) => w.code === "POORLY_DETERMINED");
    const best = ranked.find(determined) ?? ranked[0];
    if (best) {
      const p = Object.entries(best.result.parameters)
        .filter(([name]) => !best.result.fixed.includes(name))
        .map(([name, v]) => `${name} ${num(v, 3)}`)
        .join(", ");
      const better = ranked.filter((r) => r.aic < best.aic && !determined(r)).map((r) => r.model);
      const note = better.length > 0 ? ` (lower AIC but poorly determined parameters: ${better.join(", ")})` : determined(best) ? "" : " (poorly determined parameters)";
      parts.push(`best fit ${best.model} (${p})${note}`);
    }
    out.push(`  ${g.temperature === null ? "no temperature, " : ""}${groupLabel(g)}, ${g.dies.length} dies: ${parts.join("; ")}`);
  });
  out.push(`${rows ? "Input" : "Rows"}: ${rowAccountText(rows ?? result.rows)}`);
  const warnings = run.warnings;
  const codes = [...new Set(warnings.map((w) => w.code))];
  out.push(warnings.length === 0 ? "No warnings." : `${warnings.length} warning${warnings.length === 1 ? "" : "s"} (${codes.join(", ")}); the full list is in the Warnings sheet or without --summary.`);
  return out.join("\n") + "\n";
}
