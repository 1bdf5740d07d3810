/**
 * The fit across temperatures in `npm run bench`: fitMasterCurve("carreau-yasuda", Arrhenius) on
 * the three-temperature reference problem of test/fixtures/scipy-master-fits.json (invented data,
 * 45 points), timed next to scipy.optimize.least_squares on the same problem in the same run
 * (scripts/bench_master_scipy.py, through the first Python that imports scipy: scripts/findPython.ts).
 *
 * Same problem on both sides: residuals in ln η, parameters in ln p, the same start (the
 * generating values × 1.3, as the fixture's generator), the tolerances of DEFAULT_FIT_OPTIONS.
 * The two sides are measured in alternating rounds (ours, scipy, ours, scipy, ...) so a change in
 * the machine's load touches both; each line gives the median and the spread (min–max) over all
 * samples, and the sum of squares each side reached. The complete call with the automatic start
 * (polynomial shift fit, then the model on its master curve) is timed too, for information.
 */
import { spawnSync } from "node:child_process";
import path from "node:path";
import { fitMasterCurve, type TemperatureCurve } from "../../src/core/temperature";
import { findPython } from "../findPython";
import { median, ms, sample, spread } from "./sampling";
import reference from "../../test/fixtures/scipy-master-fits.json";

export interface BenchLine {
  what: string;
  measured: string;
  target: string;
  verdict: "PASS" | "MISS" | "";
}

interface Sampled {
  samples: number[];
}

/** Lines and notes of the bench for the fit across temperatures. */
export function benchMasterFit(quick: boolean): { lines: BenchLine[]; notes: string[] } {
  const c = reference.masterCases[0] as unknown as { truth: Record<string, number>; referenceTemperature: number; data: { temperature: number[]; shearRate: number[]; viscosity: number[] } };
  const byT = new Map<number, { shearRate: number[]; viscosity: number[] }>();
  c.data.temperature.forEach((T, i) => {
    const k = byT.get(T) ?? { shearRate: [], viscosity: [] };
    k.shearRate.push(c.data.shearRate[i] as number);
    k.viscosity.push(c.data.viscosity[i] as number);
    byT.set(T, k);
  });
  const curves: TemperatureCurve[] = [...byT].map(([temperature, k]) => ({ temperature, ...k }));
  const start = Object.fromEntries(Object.entries(c.truth).map(([k, v]) => [k, v * 1.3]));
  const options = { law: "arrhenius" as const, referenceTemperature: c.referenceTemperature };
  const ours = fitMasterCurve(curves, "carreau-yasuda", { ...options, initial: start });
  if (!ours.converged) throw new Error(`bench: the fit across temperatures did not converge (${ours.stopReason})`);
  const sink = { value: 0 };
  const rounds = quick ? 2 : 4;
  const repeats = quick ? 5 : 10;
  const batch = 5;
  const oursGiven: Sampled = { samples: [] };
  const oursAuto: Sampled = { samples: [] };
  const scipy = new Map<string, { samples: number[]; nfev: number; ssr: number; success: boolean; parameters: Record<string, number> }>();
  let scipyVersion = "";
  let skipped: string | null = null;
  const py = findPython(["numpy", "scipy"]);
  if (py.python === null) skipped = py.reason;
  for (let round = 0; round < rounds; round++) {
    oursGiven.samples.push(...sample(() => fitMasterCurve(curves, "carreau-yasuda", { ...options, initial: start }).parameters.n as number, repeats, batch, sink));
    oursAuto.samples.push(...sample(() => fitMasterCurve(curves, "carreau-yasuda", options).parameters.n as number, repeats, batch, sink));
    if (skipped !== null || py.python === null) continue;
    const job = JSON.stringify({ ...c.data, referenceTemperature: c.referenceTemperature, start, repeats, batch });
    const run = spawnSync(py.python, [path.join(process.cwd(), "scripts", "bench_master_scipy.py")], { input: job, encoding: "utf8", timeout: 300000 });
    let answer: { scipy?: string; error?: string; variants?: { name: string; samplesMs: number[]; nfev: number; ssr: number; success: boolean; parameters: Record<string, number> }[] } | undefined;
    try {
      answer = JSON.parse(run.stdout);
    } catch {
      answer = undefined;
    }
    if (!answer || answer.error || !answer.variants) {
      skipped = answer?.error ?? `bench_master_scipy.py gave no answer (${(run.stderr || run.error?.message || `status ${run.status}`).trim().split("\n").pop()})`;
      continue;
    }
    scipyVersion = answer.scipy ?? "";
    for (const v of answer.variants) {
      const seen = scipy.get(v.name) ?? { samples: [], nfev: v.nfev, ssr: v.ssr, success: v.success, parameters: v.parameters };
      seen.samples.push(...v.samplesMs);
      scipy.set(v.name, seen);
    }
  }
  const oursMedian = median(oursGiven.samples);
  const lines: BenchLine[] = [
    { what: "fit across temperatures: CY × Arrhenius, 3 × 15 points, given start", measured: `${ms(oursMedian)} (${spread(oursGiven.samples)})`, target: "", verdict: "" },
    { what: "same, automatic start (shift fit + master curve) (info)", measured: `${ms(median(oursAuto.samples))} (${spread(oursAuto.samples)})`, target: "", verdict: "" },
  ];
  const notes: string[] = [
    `fit across temperatures: ${ours.iterations} solver iterations, SSR ${ours.ssr.toExponential(6)}, Ea ${((ours.activationEnergy as number) / 1e3).toFixed(3)} kJ/mol; ${rounds} alternating rounds of ${repeats} samples × ${batch} calls per side.`,
  ];
  if (skipped !== null) {
    lines.push({ what: "scipy least_squares, same problem", measured: "skipped", target: "", verdict: "" });
    notes.push(`scipy comparison of the fit across temperatures skipped: ${skipped}.`);
  } else {
    for (const [name, v] of scipy) {
      const m = median(v.samples);
      const agree = Math.max(...Object.entries(v.parameters).map(([k, p]) => Math.abs((k === "activationEnergy" ? (ours.activationEnergy as number) : (ours.parameters[k] as number)) / p - 1)));
      lines.push({ what: `scipy ${scipyVersion} ${name}, same problem`, measured: `${ms(m)} (${spread(v.samples)}); ${(m / oursMedian).toFixed(1)}× ours`, target: "", verdict: "" });
      notes.push(`scipy ${name} (${py.python}): ${v.nfev} residual evaluations, ${v.success ? "converged" : "NOT converged"}, SSR ${v.ssr.toExponential(6)}, largest relative parameter difference from ours ${agree.toExponential(1)}.`);
    }
  }
  if (sink.value === 42) notes.push("");
  return { lines, notes };
}
