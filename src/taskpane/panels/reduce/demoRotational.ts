/**
 * The invented rotational curve of preview mode: an oscillatory test (|η*| against ω, joined to the
 * capillary curve by the Cox–Merz rule) of the demo grade at 210 °C, generated here from the same
 * Carreau–Yasuda curve the demo capillary data come from (scripts/demo/filmGrade.ts: η0 = 6000 Pa·s,
 * λ = 0.6 s, a = 0.8, n = 0.38 at 210 °C) with 1 % Gaussian scatter (seed 210). Its rates reach from
 * the zero-shear plateau up into the lowest capillary rates, so the two overlap. Invented data, for
 * the demo only. Returned as cells, header row first, for the shared rotational table reader.
 */
import { evaluateModel } from "../../../core/models";
import { gaussian, seededRandom } from "../../../core/random";

/** How the demo rotational curve is named in the pane and the method record. */
export const DEMO_ROTATIONAL_LABEL = "invented demo rotational curve, 210 °C";

/** The Carreau–Yasuda curve of the demo grade at 210 °C (SI), as scripts/demo/filmGrade.ts generates the capillary data. */
export const DEMO_ROTATIONAL_TRUTH = Object.freeze({
  model: "carreau-yasuda" as const,
  parameters: Object.freeze({ eta0: 6000, etaInf: 0, lambda: 0.6, n: 0.38, a: 0.8 }),
  temperatureC: 210,
  /** ω from 0.01 to 100 rad/s, four points a decade */
  angularFrequency: Object.freeze(Array.from({ length: 17 }, (_, i) => Number((0.01 * 10 ** (i / 4)).toPrecision(3)))),
  scatter: 0.01,
  seed: 210,
});

/** The demo rotational table as cells: angular frequency, complex viscosity, temperature. */
export function demoRotationalCells(): unknown[][] {
  const t = DEMO_ROTATIONAL_TRUTH;
  const random = seededRandom(t.seed);
  const eta = evaluateModel(t.model, t.parameters, [...t.angularFrequency]);
  return [
    ["angular_frequency [rad/s]", "complex_viscosity [Pa.s]", "temperature [C]"],
    ...t.angularFrequency.map((w, i) => [w, Number(((eta[i] as number) * (1 + t.scatter * gaussian(random))).toPrecision(4)), t.temperatureC]),
  ];
}
