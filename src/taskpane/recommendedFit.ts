/**
 * The model the pane recommends for a group: the lowest AIC whose parameters the data determine
 * (no POORLY_DETERMINED warning), else the lowest AIC, with the lower-AIC models it passed over.
 * The summary cards, the viscosity chart and "Use the last fit" all take this one. Pure.
 */
import type { CompareResult } from "../core/fit";

/** A ranked model of a comparison. */
export type RankedFit = CompareResult["ranked"][number];

/** The recommended fit of a comparison (see the module comment), or null when nothing was fitted. */
export function recommendedFit(c: CompareResult | null | undefined): { fit: RankedFit; passedOver: string[] } | null {
  const ranked = c?.ranked ?? [];
  const determined = (r: RankedFit) => !r.result.warnings.some((w) => w.code === "POORLY_DETERMINED");
  const best = ranked.find(determined) ?? ranked[0];
  if (!best) return null;
  return { fit: best, passedOver: ranked.filter((r) => r.aic < best.aic).map((r) => r.model) };
}
