/**
 * What each model can say about a curve: its family (the shape it describes) and, for models with
 * a zero-shear plateau, the rate at which shear thinning sets in. The fit's verdict uses the onset
 * to tell whether the data reach the plateau, i.e. whether η0 and the time constant are
 * determined by the data or only extrapolated (fit/determination.ts).
 */
import type { ModelId } from "./types";
import { crossWlfLogZeroShear } from "./crossWlf";

/** The shape a model describes; models of one family answer the same question about a curve. */
export type ModelFamily = "newtonian" | "power-law" | "plateau-thinning" | "thinning-plateau" | "yield-stress";

/** Family of every model (one plain-language name each in {@link FAMILY_NAMES}). */
export const MODEL_FAMILY: Readonly<Record<ModelId, ModelFamily>> = Object.freeze({
  newtonian: "newtonian",
  "power-law": "power-law",
  cross: "plateau-thinning",
  carreau: "plateau-thinning",
  "carreau-yasuda": "plateau-thinning",
  ellis: "plateau-thinning",
  "cross-wlf": "plateau-thinning",
  sisko: "thinning-plateau",
  bingham: "yield-stress",
  "herschel-bulkley": "yield-stress",
  casson: "yield-stress",
});

/** Plain names of the families, for messages. */
export const FAMILY_NAMES: Readonly<Record<ModelFamily, string>> = Object.freeze({
  newtonian: "Newtonian",
  "power-law": "power law",
  "plateau-thinning": "zero-shear plateau with shear thinning",
  "thinning-plateau": "shear thinning towards an infinite-shear plateau",
  "yield-stress": "yield stress",
});

/**
 * The onset rate γ̇c (1/s) of shear thinning of a plateau model, where the curve leaves its
 * zero-shear plateau: γ̇c = 1/λ for Cross, Carreau and Carreau–Yasuda (the rate where λγ̇ = 1);
 * γ̇c = τ½/η0 for Ellis and γ̇c = τ* ÷ η0(T) for Cross-WLF (the rate where the stress reaches the
 * model's critical stress, at temperature T in K). Undefined (null) for models without a plateau.
 * @example onsetRate("cross", { eta0: 1e4, etaInf: 0, lambda: 0.5, m: 0.7 }) // 2 (1/s)
 */
export function onsetRate(model: ModelId, parameters: Readonly<Record<string, number>>, temperature?: number): number | null {
  const p = parameters;
  switch (model) {
    case "cross":
    case "carreau":
    case "carreau-yasuda":
      return 1 / (p.lambda as number);
    case "ellis":
      return (p.tauHalf as number) / (p.eta0 as number);
    case "cross-wlf": {
      if (temperature === undefined) return null;
      const lnEta0 = crossWlfLogZeroShear(p.D1 as number, p.A1 as number, p.A2 as number, p.Tstar as number, temperature);
      return Number.isFinite(lnEta0) ? (p.tauStar as number) / Math.exp(lnEta0) : null;
    }
    default:
      return null;
  }
}

/** The parameter that carries the zero-shear viscosity, and the one that sets the onset, per plateau model. */
export const PLATEAU_PARAMETERS: Readonly<Partial<Record<ModelId, { plateau: string; onset: string }>>> = Object.freeze({
  cross: { plateau: "eta0", onset: "lambda" },
  carreau: { plateau: "eta0", onset: "lambda" },
  "carreau-yasuda": { plateau: "eta0", onset: "lambda" },
  ellis: { plateau: "eta0", onset: "tauHalf" },
  "cross-wlf": { plateau: "D1", onset: "tauStar" },
});
