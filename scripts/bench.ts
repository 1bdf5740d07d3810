/**
 * `npm run bench`: speed and bundle-size figures on the current machine, as medians over repeated
 * runs, each against its target (PASS/MISS). Never part of the tests: timings depend on the
 * machine and its load, so no test asserts on them.
 *
 *   npm run bench                          print the table
 *   npm run bench -- --write-docs          also write it into docs/performance.md (between the
 *                                          `<!-- performance -->` and `<!-- performance:end -->` markers)
 *   npm run bench -- --quick               fewer repeats (a smoke run; figures are noisier)
 *   npm run bench -- --no-build            read dist/ as it is, even when older than the sources
 *   npm run bench -- --big-file            also a 200 MB CSV through the CLI (--big: 1 GB)
 *
 * What is measured (all data invented, generated from known laws with a fixed seed):
 *   1. fitModel("carreau-yasuda") on 40 points (2 % log-normal noise): the complete call (guesses,
 *      solve, statistics), timed in rounds of samples (median, min–max). When a Python imports scipy (scripts/findPython.ts), scripts/bench_scipy.py
 *      fits the same points with the same residuals (ln η), coordinates (ln p), start and
 *      tolerances (MINPACK lm with the analytic Jacobian and with differences, and scipy's default
 *      trf), in rounds alternating with ours; each ratio scipy/ours with the spread of both sides and
 *      the sums of squares reached; otherwise the line says why it is skipped.
 *   1b. fitMasterCurve: Carreau–Yasuda × Arrhenius on three curves next to scipy's least_squares
 *      on the same problem, in alternating rounds (scripts/bench/masterFitBench.ts).
 *   2. reduce() of 4 dies × 10 piston speeds (Bagley, Rabinowitsch "transition") and a
 *      Carreau–Yasuda fit of the corrected flow curve.
 *   3. RHEO.WALLSTRESSAPP filled down a 10 000-row column: 10 000 calls with 1×1 ranges in one
 *      loop, the way Excel hands a batch of per-cell invocations to the custom-functions runtime.
 *      For comparison (not a target), the same column as one call with a 10 000-row range.
 *   5.–8. The command line's cold start, a 40,000-row file through the CLI against the core, the
 *      per-row worksheet function against a plain loop, and optionally a large file: see
 *      scripts/bench/inputBench.ts.
 *   2b. A pressure recording of 100 000 samples (3 dies × 8 piston speeds, first-order approach to
 *      each plateau, 0.5 % noise, 1 % speed jitter): steps detected (detectTraceSteps), turned into
 *      measurements and reduced; beside it, the reduction of the same test's 24-point steady table.
 *   4. Minified sizes of dist/functions.js and dist/taskpane.js from a production build (run
 *      first when dist/ is missing or older than the sources). 1 KB = 1024 bytes, as the
 *      webpack budget in webpack.config.js counts.
 *   5. Accuracy, not speed: the worst-point wall-rate error of every Rabinowitsch smoother on
 *      exact data and under 1 % pressure noise (scripts/benchSmoothers.ts; 200 draws, 50 with
 *      --quick), against the goals of issue 12.
 */
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { gzipSync } from "node:zlib";
import { fitModel } from "../src/core/fit";
import { getModel } from "../src/core/models";
import { gaussian, seededRandom } from "../src/core/random";
import { type Measurement, reduce } from "../src/core/reduce";
import { wallRateFromApparentRate } from "../src/core/forwardFlow";
import { wallStressApp } from "../src/functions/functions";
import { CORE_ONCE, PER_ROW_MIXED, PER_ROW_ONLY, coreOnce, inputBench, perRowBench } from "./bench/inputBench";
import { smootherBenchmark, smootherTables } from "./benchSmoothers";
import { detectTraceSteps, stepMeasurements, type TraceRun } from "../src/core/steps";
import { syntheticRun } from "../test/helpers/syntheticTrace";
import { benchMasterFit } from "./bench/masterFitBench";
import { findPython } from "./findPython";
import { median, ms, sample, spread } from "./bench/sampling";

/** The issue's targets. */
export const BENCH_TARGETS = Object.freeze({
  fitMs: 0.2,
  scipyRatio: 3,
  reductionMs: 2,
  traceMs: 150,
  column10kMs: 20,
  /** runtime.js + core.js + functions.js: what the worksheet functions load (webpack.config.js holds the build to it) */
  functionsBundleBytes: 305 * 1024,
  /**
   * every script of the shared runtime page (the pane's included). 400 KB until the pane gained the
   * recording panel and the fit settings (issues 14, 15); the pane's own bundle loads async after
   * the first paint (issue 16), so this bounds time to a working pane, not to a visible one.
   */
  taskpaneBundleBytes: 520 * 1024,
});

const ROOT = process.cwd();
const flags = new Set(process.argv.slice(2));
const QUICK = flags.has("--quick");

/** Keeps results alive so that no timed work can be optimised away. */
let sink = 0;

interface Timing {
  median: number;
  min: number;
  runs: number;
}

/**
 * Median wall time of one call of `fn`, in ms: `repeats` samples, each the mean over `batch`
 * consecutive calls (so sub-millisecond calls are timed well above the clock's resolution),
 * after a warm-up of at least `warmup` untimed calls and at least WARMUP_MS of calling, so V8 has
 * finished optimising the code (on a loaded 2-core machine that took ~3000 fit calls) and the
 * figure is the settled speed an Excel session sees, not the first calls' compilation.
 */
function time(fn: () => number, repeats: number, batch: number, warmup: number): Timing {
  const warmStart = performance.now();
  for (let i = 0; i < warmup || performance.now() - warmStart < WARMUP_MS; i++) sink += fn();
  const samples: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    for (let b = 0; b < batch; b++) sink += fn();
    samples.push((performance.now() - t0) / batch);
  }
  samples.sort((a, b) => a - b);
  const mid = samples.length >> 1;
  const median = samples.length % 2 ? (samples[mid] as number) : ((samples[mid - 1] as number) + (samples[mid] as number)) / 2;
  return { median, min: samples[0] as number, runs: repeats * batch };
}

/** Minimum warm-up time per measurement, ms. */
const WARMUP_MS = 500;

const reps = (n: number) => (QUICK ? Math.max(5, Math.round(n / 4)) : n);

// ---------------------------------------------------------------------------------------------
// 1. Carreau–Yasuda fit on 40 points

/** Invented melt: η0 = 3000 Pa·s, λ = 0.25 s, n = 0.35, a = 0.7, η∞ = 0; 2 % log-normal noise; 0.1–10⁴ 1/s. */
export const FIT_TRUTH = Object.freeze({ eta0: 3000, lambda: 0.25, n: 0.35, a: 0.7, noise: 0.02, seed: 4040, points: 40 });

function fitData(): { shearRate: number[]; viscosity: number[] } {
  const t = FIT_TRUTH;
  const random = seededRandom(t.seed);
  const shearRate: number[] = [];
  const viscosity: number[] = [];
  for (let i = 0; i < t.points; i++) {
    const rate = Math.pow(10, -1 + (5 * i) / (t.points - 1)); // 0.1 … 10 000 1/s
    const eta = t.eta0 * Math.pow(1 + Math.pow(t.lambda * rate, t.a), (t.n - 1) / t.a);
    shearRate.push(rate);
    viscosity.push(eta * Math.exp(t.noise * gaussian(random)));
  }
  return { shearRate, viscosity };
}

interface ScipyVariant {
  name: string;
  samplesMs: number[];
  nfev: number;
  ssr: number;
  success: boolean;
  parameters: Record<string, number>;
}

/** One round of scripts/bench_scipy.py through `python`: its variants, or the reason it gave none. */
function scipyRound(python: string, data: { shearRate: number[]; viscosity: number[] }, start: number[], repeats: number): { scipy: string; variants: ScipyVariant[] } | string {
  const job = JSON.stringify({ ...data, start, repeats, batch: 10 });
  const run = spawnSync(python, [path.join(ROOT, "scripts", "bench_scipy.py")], { input: job, encoding: "utf8", timeout: 300000 });
  let answer: { scipy?: string; error?: string; variants?: ScipyVariant[] } | undefined;
  try {
    answer = JSON.parse(run.stdout);
  } catch {
    answer = undefined;
  }
  if (!answer) return `bench_scipy.py gave no answer (${(run.stderr || run.error?.message || `status ${run.status}`).trim().split("\n").pop()})`;
  if (answer.error !== undefined || !answer.variants) return answer.error ?? "bench_scipy.py gave no variants";
  return { scipy: answer.scipy ?? "", variants: answer.variants };
}

/**
 * Our fit timed in rounds, alternating with scipy's variants when a Python imports scipy (ours,
 * scipy, ours, ...), so that a change in the machine's load touches both sides: our samples (each
 * the mean of 10 fits), scipy's answer per variant, or the reason scipy was skipped.
 */
function fitRounds(data: { shearRate: number[]; viscosity: number[] }, start: number[]): { ours: number[]; scipy: { version: string; variants: Map<string, ScipyVariant> } | string } {
  const py = findPython(["numpy", "scipy"]);
  let skipped: string | null = py.python === null ? py.reason : null;
  const rounds = QUICK ? 2 : 4;
  const repeats = QUICK ? 5 : 10;
  const ours: number[] = [];
  const variants = new Map<string, ScipyVariant>();
  let version = "";
  const counter = { value: 0 };
  for (let round = 0; round < rounds; round++) {
    ours.push(...sample(() => fitModel("carreau-yasuda", data).parameters.n as number, repeats, 10, counter));
    if (skipped !== null || py.python === null) continue;
    const answer = scipyRound(py.python, data, start, repeats);
    if (typeof answer === "string") {
      skipped = answer;
      continue;
    }
    version = `${answer.scipy} (${py.python})`;
    for (const v of answer.variants) {
      const seen = variants.get(v.name);
      if (seen) seen.samplesMs.push(...v.samplesMs);
      else variants.set(v.name, { ...v, samplesMs: [...v.samplesMs] });
    }
  }
  sink += counter.value;
  return { ours, scipy: skipped ?? { version, variants } };
}

// ---------------------------------------------------------------------------------------------
// 2. Full reduction of 4 dies × 10 rates with a fit

/** Invented test: one 1 mm bore, L = 5, 10, 20, 30 mm, 15 mm barrel, 10 piston speeds, 0.5 % noise. */
export const REDUCTION_SETUP = Object.freeze({
  eta0: 3000, lambda: 0.25, n: 0.35, a: 0.7,
  dieDiameter: 1e-3, dieLengths: [5e-3, 10e-3, 20e-3, 30e-3], barrelDiameter: 15e-3,
  pistonSpeedsMmMin: [0.5, 1, 2, 4, 8, 15, 30, 60, 120, 200], noise: 0.005, seed: 410,
});

function reductionData(): Measurement[] {
  const s = REDUCTION_SETUP;
  const eta = (rate: number) => s.eta0 * Math.pow(1 + Math.pow(s.lambda * rate, s.a), (s.n - 1) / s.a);
  const random = seededRandom(s.seed);
  const out: Measurement[] = [];
  for (const v of s.pistonSpeedsMmMin) {
    const flowRate = ((v * 1e-3) / 60) * ((Math.PI * s.barrelDiameter ** 2) / 4);
    const rateApp = (32 * flowRate) / (Math.PI * s.dieDiameter ** 3);
    const wall = wallRateFromApparentRate(eta, rateApp);
    const tau = eta(wall) * wall;
    const e = 2 + 1.5 * Math.log10(rateApp); // invented entrance loss, in die radii
    for (const L of s.dieLengths) {
      const pressure = 2 * tau * ((2 * L) / s.dieDiameter + e) * (1 + s.noise * gaussian(random));
      out.push({ dieDiameter: s.dieDiameter, dieLength: L, flowRate, pressure });
    }
  }
  return out;
}

function reduceAndFit(measurements: Measurement[]): number {
  const result = reduce(measurements);
  const curve = (result.groups[0]?.flowCurve ?? []).filter((f) => f.shearRateWall !== null && f.viscosity !== null);
  const fit = fitModel("carreau-yasuda", {
    shearRate: curve.map((f) => f.shearRateWall as number),
    viscosity: curve.map((f) => f.viscosity as number),
  });
  return fit.parameters.n as number;
}

// ---------------------------------------------------------------------------------------------
// 2b. A 100 000-sample pressure recording: steps detected and reduced

/** Invented test: power-law melt (K = 5000 Pa·sⁿ, n = 0.4), e = 2, D = 1 mm, L = 5, 10, 20 mm, 15 mm barrel. */
export const TRACE_SETUP = Object.freeze({
  K: 5000, n: 0.4, e: 2, dieDiameter: 1e-3, dieLengths: [5e-3, 10e-3, 20e-3], barrelDiameter: 15e-3,
  pistonSpeedsMmMin: [0.5, 1, 2, 5, 10, 20, 50, 100], stepSeconds: 60, samples: 100000, tau: 3, noise: 0.005, seed: 77,
});

function traceSteadyPressure(length: number, speed: number): number {
  const s = TRACE_SETUP;
  const rateApparent = (32 * speed * ((Math.PI * s.barrelDiameter ** 2) / 4)) / (Math.PI * s.dieDiameter ** 3);
  return 2 * s.K * (rateApparent * ((3 * s.n + 1) / (4 * s.n))) ** s.n * ((2 * length) / s.dieDiameter + s.e);
}

function traceData(): { runs: TraceRun[]; points: Measurement[] } {
  const s = TRACE_SETUP;
  const perDie = Math.ceil(s.samples / s.dieLengths.length);
  const dt = (s.pistonSpeedsMmMin.length * s.stepSeconds) / perDie;
  const runs = s.dieLengths.map((L, i) => {
    const steps = s.pistonSpeedsMmMin.map((v) => ({ speed: (v * 1e-3) / 60, pressure: traceSteadyPressure(L, (v * 1e-3) / 60), duration: s.stepSeconds }));
    const r = syntheticRun({ steps, tau: s.tau, noise: s.noise, speedJitter: 0.01, dt, seed: s.seed + i });
    return { time: r.time, pressure: r.pressure, pistonSpeed: r.speed, die: { dieDiameter: s.dieDiameter, dieLength: L }, barrelDiameter: s.barrelDiameter };
  });
  const points = s.dieLengths.flatMap((L) =>
    s.pistonSpeedsMmMin.map((v) => ({ dieDiameter: s.dieDiameter, dieLength: L, flowRate: ((v * 1e-3) / 60) * ((Math.PI * s.barrelDiameter ** 2) / 4), pressure: traceSteadyPressure(L, (v * 1e-3) / 60) })),
  );
  return { runs, points };
}

function traceReduce(runs: TraceRun[]): number {
  const result = reduce(stepMeasurements(detectTraceSteps(runs)));
  return result.groups[0]?.flowCurve.length ?? 0;
}

// ---------------------------------------------------------------------------------------------
// 3. A 10 000-row column through a per-row worksheet function

const COLUMN_ROWS = 10000;

function columnPressures(): number[] {
  const random = seededRandom(10000);
  return Array.from({ length: COLUMN_ROWS }, () => 20 + 400 * random()); // bar
}

/** One formula per row, `=RHEO.WALLSTRESSAPP(E2, 1, 20)` filled down: Excel's batch of invocations. */
function perRowCalls(pressures: number[]): number {
  let total = 0;
  for (let i = 0; i < pressures.length; i++) {
    const out = wallStressApp([[pressures[i]]], [[1]], [[20]], null as unknown as string, null as unknown as string, null as unknown as string);
    total += (out[0] as unknown[])[0] as number;
  }
  return total;
}

/** One formula over the whole column, `=RHEO.WALLSTRESSAPP(E2:E10001, 1, 20)`, spilling. */
function oneSpillCall(column: unknown[][]): number {
  const out = wallStressApp(column, [[1]], [[20]]);
  return ((out[out.length - 1] as unknown[])[0] as number) + out.length;
}

// ---------------------------------------------------------------------------------------------
// 4. Bundle sizes

const BUNDLES = ["runtime.js", "core.js", "functions.js", "taskpane.js"] as const;
/** What each budget counts: the functions' scripts, and the whole shared runtime page. */
const BUNDLE_SETS = { functions: ["runtime.js", "core.js", "functions.js"], page: ["runtime.js", "core.js", "functions.js", "taskpane.js"] } as const;
const BUILD_INPUTS = ["src", "webpack.config.js", "package.json", "package-lock.json", "manifest.xml", "tsconfig.json"];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  return Math.max(st.mtimeMs, ...readdirSync(p).map((name) => newestMtime(path.join(p, name))));
}

/** Sizes of the built bundles, building first when dist/ is missing or older than its inputs. */
function bundleSizes(): { sizes: Record<string, { bytes: number; gzip: number } | null>; note: string } {
  const dist = path.join(ROOT, "dist");
  const built = BUNDLES.map((b) => path.join(dist, b));
  const oldest = Math.min(...built.map((f) => (existsSync(f) ? statSync(f).mtimeMs : 0)));
  const newestInput = Math.max(...BUILD_INPUTS.map((p) => newestMtime(path.join(ROOT, p))));
  let note = "dist/ up to date";
  if (oldest < newestInput && !flags.has("--no-build")) {
    process.stderr.write("bench: dist/ is missing or older than the sources; running `npm run build` ...\n");
    const started = Date.now();
    const run = spawnSync("npm", ["run", "build", "--silent"], { cwd: ROOT, encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
    note = run.status === 0 ? "fresh production build" : `production build FAILED (status ${run.status}); sizes are of what it emitted`;
    if (run.status !== 0) process.stderr.write((run.stdout + run.stderr).split("\n").filter((l) => /error|ERROR/.test(l)).slice(0, 10).join("\n") + "\n");
    // a failed build may have emitted nothing: then the old files do not count
    for (const f of built) if (existsSync(f) && statSync(f).mtimeMs < started - 1000 && run.status !== 0) note += `; ${path.basename(f)} is stale`;
  } else if (oldest < newestInput) {
    note = "dist/ older than the sources (--no-build)";
  }
  const sizes: Record<string, { bytes: number; gzip: number } | null> = {};
  for (const b of BUNDLES) {
    const f = path.join(dist, b);
    if (!existsSync(f)) sizes[b] = null;
    else {
      const content = readFileSync(f);
      sizes[b] = { bytes: content.length, gzip: gzipSync(content, { level: 9 }).length };
    }
  }
  return { sizes, note };
}

// ---------------------------------------------------------------------------------------------
// Report

interface Line {
  what: string;
  measured: string;
  target: string;
  verdict: "PASS" | "MISS" | "";
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} KB`;
const verdict = (ok: boolean): "PASS" | "MISS" => (ok ? "PASS" : "MISS");

function machine(): string {
  let cpu = os.cpus()[0]?.model ?? "unknown CPU";
  try {
    const m = /^model name\s*:\s*(.+)$/m.exec(readFileSync("/proc/cpuinfo", "utf8"));
    if (m?.[1]) cpu = m[1].trim();
  } catch {
    // not Linux: os.cpus() is the fallback
  }
  const cores = typeof os.availableParallelism === "function" ? os.availableParallelism() : os.cpus().length;
  const load = os.loadavg()[0] as number;
  return `${cores} cores (nproc), ${cpu}, Node ${process.version}, ${os.platform()} ${os.arch()}, load average ${load.toFixed(1)}`;
}

function markdownTable(lines: Line[]): string {
  return [
    "| what | median | target | |",
    "|---|---|---|---|",
    ...lines.map((l) => `| ${l.what} | ${l.measured} | ${l.target} | ${l.verdict} |`),
  ].join("\n");
}

function plainTable(lines: Line[]): string {
  const w = [0, 1, 2].map((c) => Math.max(...lines.map((l) => [l.what, l.measured, l.target][c]!.length), 6));
  const row = (a: string, b: string, c: string, d: string) => `${a.padEnd(w[0]!)}  ${b.padStart(w[1]!)}  ${c.padEnd(w[2]!)}  ${d}`;
  return [row("what", "median", "target", ""), row("-".repeat(w[0]!), "-".repeat(w[1]!), "-".repeat(w[2]!), "----"), ...lines.map((l) => row(l.what, l.measured, l.target, l.verdict))].join("\n");
}

/** Replaces the block after `<!-- performance -->` (up to `<!-- performance:end -->`) in docs/performance.md. */
function writeReadme(block: string): void {
  const file = path.join(ROOT, "docs", "performance.md");
  const text = readFileSync(file, "utf8"); // read right before writing: others edit this file too
  const start = "<!-- performance -->";
  const end = "<!-- performance:end -->";
  const i = text.indexOf(start);
  if (i < 0) throw new Error(`docs/performance.md has no ${start} marker; add it where the figures belong`);
  const j = text.indexOf(end, i);
  const after = j < 0 ? text.slice(i + start.length) : text.slice(j + end.length);
  writeFileSync(file, `${text.slice(0, i)}${start}\n${block}\n${end}${after}`);
}

function main(): void {
  const lines: Line[] = [];
  const notes: string[] = [];

  // 1. fit
  const data = fitData();
  const ours = fitModel("carreau-yasuda", data);
  if (!ours.converged) throw new Error(`bench: the Carreau–Yasuda fit did not converge (${ours.stopReason})`);
  const rounds = fitRounds(data, getModel("carreau-yasuda").initialGuess(data));
  const oursMedian = median(rounds.ours);
  lines.push({ what: "Carreau–Yasuda fit, 40 points", measured: `${ms(oursMedian)} (${spread(rounds.ours)})`, target: `≤ ${ms(BENCH_TARGETS.fitMs)}`, verdict: verdict(oursMedian <= BENCH_TARGETS.fitMs) });
  const heldTime = time(() => fitModel("carreau-yasuda", data, { fixed: { etaInf: 0 } }).parameters.n as number, reps(41), 20, 100);
  lines.push({ what: "same fit with η∞ held at 0 (info)", measured: ms(heldTime.median), target: "", verdict: "" });
  const scipy = rounds.scipy;
  if (typeof scipy === "string") {
    lines.push({ what: "scipy ÷ ours, same fit", measured: "skipped", target: `≥ ${BENCH_TARGETS.scipyRatio}×`, verdict: "" });
    notes.push(`scipy comparison skipped: ${scipy}.`);
  } else {
    notes.push(`Carreau–Yasuda fit: ${QUICK ? 2 : 4} rounds, ours then scipy ${scipy.version}, each round ${QUICK ? 5 : 10} samples of 10 fits per side (median and min–max of all samples); ours reached SSR ${ours.ssr.toExponential(6)}.`);
    for (const v of scipy.variants.values()) {
      const ratio = median(v.samplesMs) / oursMedian;
      const agree = Math.max(...Object.entries(v.parameters).map(([k, p]) => Math.abs((ours.parameters[k] as number) / p - 1)));
      lines.push({ what: `scipy (${v.name}) ÷ ours`, measured: `${ratio.toFixed(1)}× (${ms(median(v.samplesMs))}, ${spread(v.samplesMs)})`, target: `≥ ${BENCH_TARGETS.scipyRatio}×`, verdict: verdict(ratio >= BENCH_TARGETS.scipyRatio) });
      notes.push(`scipy.optimize.least_squares, ${v.name}: ${v.nfev} residual evaluations, ${v.success ? "converged" : "NOT converged"}, SSR ${v.ssr.toExponential(6)}, largest relative parameter difference from ours ${agree.toExponential(1)}.`);
    }
  }
  notes.push(
    `fitModel: ${ours.iterations} solver iterations, stop "${ours.stopReason}", n = ${(ours.parameters.n as number).toFixed(4)} (generated with ${FIT_TRUTH.n}), ` +
      `η∞ = ${(ours.parameters.etaInf as number).toPrecision(3)} Pa·s. One solver run with all five parameters free, η∞ in linear coordinates ` +
      "kept ≥ 0 by projection (so it could stop on its bound 0); scipy is given the same five-parameter problem.",
  );

  // 1b. the fit across temperatures next to scipy on the same problem (scripts/bench/masterFitBench.ts)
  const master = benchMasterFit(QUICK);
  lines.push(...master.lines);
  notes.push(...master.notes);

  // 2. reduction
  const measurements = reductionData();
  const reduceTime = time(() => reduceAndFit(measurements), reps(31), 5, 30);
  lines.push({ what: "reduce 4 dies × 10 rates + CY fit", measured: ms(reduceTime.median), target: `≤ ${ms(BENCH_TARGETS.reductionMs)}`, verdict: verdict(reduceTime.median <= BENCH_TARGETS.reductionMs) });

  // 2b. recording of 100 000 samples
  const trace = traceData();
  const samples = trace.runs.reduce((n, r) => n + r.time.length, 0);
  const detected = detectTraceSteps(trace.runs);
  const used = stepMeasurements(detected).length;
  const traceTime = time(() => traceReduce(trace.runs), reps(11), 1, 3);
  const tableTime = time(() => reduce(trace.points).groups.length, reps(31), 5, 30);
  lines.push({ what: `recording of ${samples} samples: steps detected + reduced`, measured: ms(traceTime.median), target: `≤ ${ms(BENCH_TARGETS.traceMs)}`, verdict: verdict(traceTime.median <= BENCH_TARGETS.traceMs) });
  lines.push({ what: `same test's ${trace.points.length}-point steady table, reduced (info)`, measured: ms(tableTime.median), target: "", verdict: "" });
  notes.push(`recording: ${trace.runs.length} die runs, ${detected.runs.reduce((n, r) => n + r.steps.length, 0)} steps found, ${used} used, ${detected.warnings.length} warnings; the recording costs ${(traceTime.median / tableTime.median).toFixed(0)}× the steady table's reduction.`);

  // 3. per-row worksheet function
  const pressures = columnPressures();
  const firstCall = wallStressApp([[pressures[0]]], [[1]], [[20]]);
  if (typeof (firstCall[0] as unknown[])[0] !== "number") throw new Error("bench: RHEO.WALLSTRESSAPP returned an error for valid input");
  const rowTime = time(() => perRowCalls(pressures), reps(15), 1, 3);
  lines.push({ what: "RHEO.WALLSTRESSAPP × 10 000 rows (per-row calls)", measured: ms(rowTime.median), target: `≤ ${ms(BENCH_TARGETS.column10kMs)}`, verdict: verdict(rowTime.median <= BENCH_TARGETS.column10kMs) });
  const column = pressures.map((p) => [p]);
  const spillTime = time(() => oneSpillCall(column), reps(15), 1, 3);
  lines.push({ what: "same column as one 10 000-row range (info)", measured: ms(spillTime.median), target: "", verdict: "" });

  // 5.–8. command line start, file reading, per-row worksheet functions, large files (scripts/bench/inputBench.ts)
  const input = inputBench({ quick: QUICK, bigFile: flags.has("--big-file"), hugeFile: flags.has("--big") });
  lines.push(...input.lines);
  notes.push(...input.notes);

  // 4. bundles
  const { sizes, note } = bundleSizes();
  const sum = (files: readonly string[]) => files.reduce((acc, f) => ({ bytes: acc.bytes + (sizes[f]?.bytes ?? NaN), gzip: acc.gzip + (sizes[f]?.gzip ?? NaN) }), { bytes: 0, gzip: 0 });
  for (const [what, files, budget] of [
    ["functions' scripts (runtime + core + functions) minified (gzip)", BUNDLE_SETS.functions, BENCH_TARGETS.functionsBundleBytes],
    ["shared runtime page, all scripts (+ taskpane) minified (gzip)", BUNDLE_SETS.page, BENCH_TARGETS.taskpaneBundleBytes],
  ] as const) {
    const s = sum(files);
    lines.push({ what, measured: Number.isFinite(s.bytes) ? `${kb(s.bytes)} (${kb(s.gzip)})` : "not built", target: `≤ ${kb(budget)}`, verdict: verdict(Number.isFinite(s.bytes) && s.bytes <= budget) });
  }
  for (const b of BUNDLES) {
    const s = sizes[b];
    lines.push({ what: `dist/${b} minified (gzip)`, measured: s ? `${kb(s.bytes)} (${kb(s.gzip)})` : "not built", target: "", verdict: "" });
  }
  notes.push(`bundles: ${note}.`);

  // 5. smoother accuracy (a second table)
  const draws = QUICK ? 50 : 200;
  const smoothers = smootherTables(smootherBenchmark(draws), draws);

  const date = new Date().toISOString().slice(0, 10);
  const where = machine();
  console.log(`Rheoledger bench, ${date}: ${where}${QUICK ? " (--quick)" : ""}\n`);
  console.log(plainTable(lines));
  console.log("\n" + notes.map((n) => `- ${n}`).join("\n"));
  console.log(`\n${smoothers.note}\n\n${smoothers.plain}`);
  if (sink === 42) console.log(""); // use the sink

  if (flags.has("--write-docs")) {
    const block = [
      "",
      `Latest \`npm run bench\` on ${date}:`,
      `${where}.`,
      "Medians over repeated runs (each sample the mean of a batch of calls, after warm-up);",
      "1 KB = 1024 bytes. Figures vary with the machine and its load; no test depends on them.",
      "",
      markdownTable(lines),
      "",
      ...notes.map((n) => `- ${n}`),
      "",
      smoothers.note,
      "",
      smoothers.markdown,
      "",
    ].join("\n");
    writeReadme(block);
    console.log("\ndocs/performance.md: performance section updated.");
  }
}

// section 7 runs in processes of its own (scripts/bench/inputBench.ts, perRowInChild)
const coreOnceAt = process.argv.indexOf(CORE_ONCE);
if (coreOnceAt > 0) console.log(coreOnce(process.argv[coreOnceAt + 1] as string).toFixed(3));
else if (flags.has(PER_ROW_ONLY) || flags.has(PER_ROW_MIXED)) console.log(JSON.stringify(perRowBench((n) => (QUICK ? Math.max(5, Math.round(n / 4)) : n), flags.has(PER_ROW_MIXED))));
else main();
