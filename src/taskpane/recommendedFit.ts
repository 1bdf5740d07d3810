/**
 * The model the pane recommends for a group: the core's one verdict (src/core/fit/verdict.ts), as
 * the command line, the results workbook and RHEO.COMPAREFITS show it, with the lower-AIC models it
 * passed over. The summary cards, the viscosity chart and "Use the last fit" all take this one. Pure.
 */
import type { CompareResult } from "../core/fit";
import type { Verdict } from "../core/fit/verdict";

/** A ranked model of a comparison. */
export type RankedFit = CompareResult["ranked"][number];

/** The fits of a group as the pane keeps them: the ranking and the core's verdict on it. */
export interface VerdictedFits {
  compare: CompareResult | null;
  verdict: Verdict | null;
}

/** The recommended fit of a group (see the module comment), or null when the verdict recommends none. */
export function recommendedFit(f: VerdictedFits | null | undefined): { fit: RankedFit; passedOver: string[]; reason: string } | null {
  const v = f?.verdict;
  const ranked = f?.compare?.ranked ?? [];
  const fit = v?.recommended ? ranked.find((r) => r.model === v.recommended) : undefined;
  if (!v || !fit) return null;
  return { fit, passedOver: ranked.filter((r) => r.aic < fit.aic).map((r) => r.model), reason: v.reason };
}
