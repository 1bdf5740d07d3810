/**
 * The input side of `npm run bench` (scripts/bench.ts calls {@link inputBench}):
 *
 *   5. CLI cold start: `node bin/rheoledger.js reduce TINY.csv` against a bare `node -e 0`, the
 *      two interleaved in one run (wall time, medians); goal ≤ 1.5×. The bin's code cache is
 *      written by an untimed first run, as by a user's first command after a build; the same
 *      without it (RHEOLEDGER_CODE_CACHE=0) for information.
 *   6. A 40,000-row file (4 dies × 10,000 piston speeds) reduced by the CLI (`reduce FILE --json`,
 *      wall time of the whole process) against the in-process core time of the same file: the
 *      first runReduction() call on its measurements in a fresh Node process (measurements built
 *      before the timing; both sides run the core cold, so the ratio is the command line's own
 *      cost: starting, reading, printing); goal ≤ 2×. For information, the same CLI time against
 *      runReduction() warm in this process (fourth call on) and against the cold core inside each
 *      CLI run (RHEOLEDGER_TIMING), and in a note how much slower a first call is than a warm one.
 *   7. RHEO.WALLSTRESSAPP filled down 10,000 rows (per-row calls, 1×1 ranges as Excel passes them),
 *      in a Node process of its own (perRowInChild), so that earlier sections do not decide what
 *      the optimiser makes of the function,
 *      against a plain loop over the same arithmetic (unit factors and the core function);
 *      CPU time of this process, so that other processes on a shared machine count less, in
 *      interleaved rounds of batched samples (interleavedCpu): the median of the per-round ratios,
 *      with their quartiles; goal ≤ 10×.
 *      For information: the same calls on argument arrays built once, and a bare function of the
 *      same shape (three 1×1 ranges in, [[value]] out, no units, no checks), the least any
 *      worksheet function called this way can cost; and the per-row and built-once figures in a
 *      second process where the function has spilled a column and answered an error row first.
 *   8. A large CSV (200 MB by default, `--big` for 1 GB; far more rows than the limit) through the
 *      CLI: the time to its message and the process's peak memory (info: no goal but "a message,
 *      never a crash").
 *
 * Files are generated under .cache/ (invented data from a power law with a fixed seed) and left
 * there for a rerun; the large file only with --big-file or --big.
 */
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, openSync, closeSync, readFileSync, statSync, writeSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { type Measurement } from "../../src/core/reduce";
import { runReduction } from "../../src/core/run";
import { apparentWallShearStress } from "../../src/core/capillary";
import { unitFactors } from "../../src/core/units";
import { seededRandom } from "../../src/core/random";
import { wallStressApp } from "../../src/functions/functions";
import { median, ms } from "./sampling";

export const INPUT_TARGETS = Object.freeze({ coldStartRatio: 1.5, cli40kOverCore: 2, perRowOverPlain: 10 });

export interface BenchLine {
  what: string;
  measured: string;
  target: string;
  verdict: "PASS" | "MISS" | "";
}

const ROOT = process.cwd();
const CACHE = path.join(ROOT, ".cache");
const BIN = path.join(ROOT, "bin", "rheoledger.js");

const msText = ms;
const wall = (args: string[], env: Record<string, string> = {}): number => {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { stdio: ["ignore", "ignore", "pipe"], maxBuffer: 1 << 30, env: { ...process.env, ...env } });
  const t = performance.now() - t0;
  if (r.status !== 0) throw new Error(`bench: node ${args.join(" ")} failed: ${String(r.stderr).slice(0, 300)}`);
  return t;
};

/** A power-law melt on 1 mm dies, 15 mm barrel (invented): rows of D, L [mm], speed [mm/min], pressure [bar]. */
function runRows(dies: number[], speeds: number[]): string[] {
  const random = seededRandom(4040);
  const rows: string[] = [];
  for (const L of dies) {
    for (const v of speeds) {
      const q = ((v * 1e-3) / 60) * ((Math.PI * 0.015 ** 2) / 4);
      const rate = (32 * q) / (Math.PI * 1e-9);
      const tau = 8000 * (rate * 1.375) ** 0.4;
      const p = (2 * tau * ((2 * L) / 1 + 3) * (1 + 0.002 * (random() - 0.5))) / 1e5;
      rows.push(`1,${L},${Number(v.toPrecision(8))},${Number(p.toPrecision(7))}`);
    }
  }
  return rows;
}

const HEADER = "die_diameter [mm],die_length [mm],barrel_diameter [mm],piston_speed [mm/min],pressure [bar]";
const withBarrel = (row: string) => row.replace(/^([^,]*,[^,]*),/, "$1,15,");

function writeFile(file: string, lines: string[]): void {
  const fd = openSync(file, "w");
  try {
    writeSync(fd, HEADER + "\n");
    for (let i = 0; i < lines.length; i += 10000) writeSync(fd, lines.slice(i, i + 10000).map(withBarrel).join("\n") + "\n");
  } finally {
    closeSync(fd);
  }
}

function measurementsOf(lines: string[]): Measurement[] {
  return lines.map((l) => {
    const [D, L, v, p] = l.split(",").map(Number) as [number, number, number, number];
    return { dieDiameter: D * 1e-3, dieLength: L * 1e-3, flowRate: ((v * 1e-3) / 60) * ((Math.PI * 0.015 ** 2) / 4), pressure: p * 1e5 };
  });
}

/** CPU milliseconds of this process since `t0` (user + system). */
const cpuSince = (t0: NodeJS.CpuUsage) => {
  const d = process.cpuUsage(t0);
  return (d.user + d.system) / 1000;
};

/**
 * CPU milliseconds per call of each of `fns`, measured side by side: after a warm-up, each
 * function's batch (the number of calls that takes at least `sampleMs`, so that a sample is far
 * above the clock's and the scheduler's granularity) is timed once per round, the functions
 * in turn and the order rotating from round to round, so that a change of load or of CPU clock
 * during the run falls on every side alike. Returns the samples per function, one per round.
 */
function interleavedCpu(fns: (() => number)[], rounds: number, warmup: number[], sampleMs: number): number[][] {
  let sink = 0;
  const batches = fns.map((fn, i) => {
    for (let k = 0; k < (warmup[i] as number); k++) sink += fn();
    const t0 = process.cpuUsage();
    let calls = 0;
    do {
      sink += fn();
      calls++;
    } while (cpuSince(t0) < sampleMs / 4);
    return Math.max(1, Math.ceil(calls * 4));
  });
  const samples: number[][] = fns.map(() => []);
  for (let r = 0; r < rounds; r++) {
    for (let j = 0; j < fns.length; j++) {
      const i = (j + r) % fns.length;
      const fn = fns[i] as () => number;
      const batch = batches[i] as number;
      const t0 = process.cpuUsage();
      for (let k = 0; k < batch; k++) sink += fn();
      (samples[i] as number[]).push(cpuSince(t0) / batch);
    }
  }
  if (sink === 42) process.stdout.write("");
  return samples;
}

/** Quartiles of `xs`: [lower, median, upper] (the medians of each half for the outer two). */
function quartiles(xs: number[]): [number, number, number] {
  const s = [...xs].sort((a, b) => a - b);
  const half = s.length >> 1;
  return [median(s.slice(0, Math.max(1, half))), median(s), median(s.slice(s.length - Math.max(1, half)))];
}

/**
 * 7. RHEO.WALLSTRESSAPP filled down 10,000 rows against a plain loop over the same arithmetic
 * (see the module comment); `reps` scales the number of rounds (--quick). With `mixed`, the
 * process first calls the function per row (so that it is optimised), then spills a column and
 * answers an error row through it, as a workbook mixing these would, and only then compiles and
 * times the loops: once its general path has run, the optimiser keeps the 1×1 arrays (they reach
 * a call it does not inline on that path; docs/performance.md). Returns only the per-row and
 * built-once lines then.
 */
export function perRowBench(reps: (n: number) => number, mixed = false): BenchLine[] {
  const lines: BenchLine[] = [];
  if (mixed) {
    const warm = () => {
      let t = 0;
      for (let i = 0; i < 10000; i++) t += (wallStressApp([[20 + i / 25]], [[1]], [[20]])[0] as unknown[])[0] as number;
      return t;
    };
    for (let k = 0; k < 50; k++) warm();
    wallStressApp(
      Array.from({ length: 100 }, (_, i) => [20 + i]),
      [[1]],
      [[20]],
    );
    wallStressApp([[-1]], [[1]], [[20]]);
  }
  const random = seededRandom(10000);
  const pressures = Array.from({ length: 10000 }, () => 20 + 400 * random());
  const bar = unitFactors("pressure", "bar").factor;
  const mm = unitFactors("length", "mm").factor;
  const perRow = () => {
    let t = 0;
    for (let i = 0; i < pressures.length; i++) t += (wallStressApp([[pressures[i]]], [[1]], [[20]])[0] as unknown[])[0] as number;
    return t;
  };
  const plain = () => {
    let t = 0;
    for (let i = 0; i < pressures.length; i++) t += apparentWallShearStress((pressures[i] as number) * bar, 1 * mm, 20 * mm);
    return t;
  };
  // the same calls on argument arrays built once (what the adapter itself costs, without the
  // 1×1 arrays Excel builds for every call)
  const cells = pressures.map((p) => [[p]]);
  const one = [[1]];
  const twenty = [[20]];
  const perRowBuilt = () => {
    let t = 0;
    for (let i = 0; i < cells.length; i++) t += (wallStressApp(cells[i] as number[][], one, twenty)[0] as unknown[])[0] as number;
    return t;
  };
  // the least a worksheet function called this way can cost: three 1×1 ranges in, [[value]] out,
  // the same arithmetic, no unit arguments, no checks of the cells
  const bareFn = (p: unknown[][], d: unknown[][], l: unknown[][]): unknown[][] => [
    [apparentWallShearStress(((p[0] as unknown[])[0] as number) * bar, ((d[0] as unknown[])[0] as number) * mm, ((l[0] as unknown[])[0] as number) * mm)],
  ];
  const bareRow = () => {
    let t = 0;
    for (let i = 0; i < pressures.length; i++) t += (bareFn([[pressures[i]]], [[1]], [[20]])[0] as unknown[])[0] as number;
    return t;
  };
  // interleaved rounds of samples of at least 8 ms each; each round gives one ratio per side
  // against the plain loop timed in the same round, and the median of those ratios is the figure
  // (the plain loop alone flips between about 20 and 45 µs from run to run on a shared machine)
  const [rowSamples, builtSamples, bareSamples, plainSamples] = interleavedCpu([perRow, perRowBuilt, bareRow, plain], reps(41), [30, 30, 30, 300], 8) as [number[], number[], number[], number[]];
  const ratios = (xs: number[]) => quartiles(xs.map((x, r) => x / (plainSamples[r] as number)));
  const spread = (q: [number, number, number]) => `pair ratios ${q[0].toFixed(1)}–${q[2].toFixed(1)}× between quartiles, ${plainSamples.length} rounds`;
  const times = (q: [number, number, number]) => `${q[1].toFixed(q[1] < 10 ? 1 : 0)}×`;
  const plainCpu = median(plainSamples);
  const [rowQ, builtQ, bareQ] = [ratios(rowSamples), ratios(builtSamples), ratios(bareSamples)];
  if (mixed) {
    lines.push({
      what: "same, in a process where the function has spilled a column and answered an error row before (info)",
      measured: `per row ${times(rowQ)} (${msText(median(rowSamples))} vs ${msText(plainCpu)}; ${spread(rowQ)}), arrays built once ${times(builtQ)} (${msText(median(builtSamples))})`,
      target: "",
      verdict: "",
    });
    return lines;
  }
  const rowRatio = rowQ[1];
  lines.push({ what: "RHEO.WALLSTRESSAPP per-row ÷ plain loop (CPU)", measured: `${times(rowQ)} (${msText(median(rowSamples))} vs ${msText(plainCpu)} per 10,000 rows; ${spread(rowQ)})`, target: `≤ ${INPUT_TARGETS.perRowOverPlain}×`, verdict: rowRatio <= INPUT_TARGETS.perRowOverPlain ? "PASS" : "MISS" });
  lines.push({ what: "same, argument arrays built once (info)", measured: `${times(builtQ)} (${msText(median(builtSamples))}; ${spread(builtQ)})`, target: "", verdict: "" });
  lines.push({ what: "bare function, 1×1 ranges in, [[value]] out, no units or checks (info)", measured: `${bareQ[1].toFixed(1)}× (${msText(median(bareSamples))}; ${spread(bareQ)})`, target: "", verdict: "" });
  return lines;
}

/** The flags with which scripts/bench.ts runs only {@link perRowBench} (or its mixed form) and prints its lines as JSON. */
export const PER_ROW_ONLY = "--per-row-only";
export const PER_ROW_MIXED = "--per-row-mixed";

/** The flag with which scripts/bench.ts times one runReduction() on a CSV file's measurements and prints the milliseconds. */
export const CORE_ONCE = "--core-once";

/** One runReduction() of `file`'s measurements in this (fresh) process, ms; the measurements are built first. */
export function coreOnce(file: string): number {
  const lines = readFileSync(file, "utf8").trim().split("\n").slice(1);
  const measurements = measurementsOf(lines.map((l) => l.replace(/^([^,]*,[^,]*),[^,]*,/, "$1,")));
  const t0 = performance.now();
  runReduction(measurements, {});
  return performance.now() - t0;
}

function coreOnceInChild(file: string): number {
  const r = spawnSync(process.execPath, [process.argv[1] as string, CORE_ONCE, file], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  const took = Number(r.stdout.trim().split("\n").pop());
  if (r.status !== 0 || !(took > 0)) throw new Error(`bench: the in-process core run failed: ${String(r.stderr).slice(0, 300)}`);
  return took;
}

/** {@link perRowBench}, then its mixed form, each in a fresh Node process running this same bench script. */
function perRowInChild(quick: boolean): BenchLine[] {
  return [PER_ROW_ONLY, PER_ROW_MIXED].flatMap((flag) => {
    const r = spawnSync(process.execPath, [process.argv[1] as string, flag, ...(quick ? ["--quick"] : [])], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
    if (r.status !== 0) throw new Error(`bench: the per-row section failed: ${String(r.stderr).slice(0, 300)}`);
    return JSON.parse(r.stdout.trim().split("\n").pop() as string) as BenchLine[];
  });
}

/** Runs the input benchmarks (see the module comment). */
export function inputBench(options: { quick: boolean; bigFile: boolean; hugeFile: boolean }): { lines: BenchLine[]; notes: string[] } {
  const lines: BenchLine[] = [];
  const notes: string[] = [];
  mkdirSync(CACHE, { recursive: true });
  const reps = (n: number) => (options.quick ? Math.max(5, Math.round(n / 4)) : n);

  // 5. cold start
  const tiny = path.join(CACHE, "bench-tiny.csv");
  writeFile(tiny, runRows([10, 20], [1, 10]));
  // builds dist/cli.cjs when stale, and the first `reduce` after a build writes the code cache
  // (bin/rheoledger.js), both outside the timing
  wall([BIN, "--version"]);
  wall([BIN, "reduce", tiny]);
  const bare: number[] = [];
  const cli: number[] = [];
  const uncached: number[] = [];
  for (let i = 0; i < reps(21); i++) {
    bare.push(wall(["-e", "0"]));
    cli.push(wall([BIN, "reduce", tiny]));
    uncached.push(wall([BIN, "reduce", tiny], { RHEOLEDGER_CODE_CACHE: "0" }));
  }
  const startRatio = median(cli) / median(bare);
  lines.push({ what: "CLI cold start, tiny file ÷ bare node -e 0", measured: `${startRatio.toFixed(2)}× (${msText(median(cli))} vs ${msText(median(bare))})`, target: `≤ ${INPUT_TARGETS.coldStartRatio}×`, verdict: startRatio <= INPUT_TARGETS.coldStartRatio ? "PASS" : "MISS" });
  lines.push({ what: "same without the code cache (RHEOLEDGER_CODE_CACHE=0, info)", measured: `${(median(uncached) / median(bare)).toFixed(2)}× (${msText(median(uncached))})`, target: "", verdict: "" });

  // 6. 40,000 rows through the CLI and through the core
  const speeds = Array.from({ length: 10000 }, (_, i) => 0.5 * Math.pow(400, i / 9999));
  const big = runRows([5, 10, 20, 30], speeds);
  const file40k = path.join(CACHE, "bench-40k.csv");
  writeFile(file40k, big);
  // The goal compares the whole CLI run (start Node, load, read the file, runReduction(), build and
  // write the JSON) with the in-process core time of the same file: the first runReduction() call
  // on the same measurements in a fresh Node process (what a script calling the core once pays;
  // the measurements are built before the timing). Both sides then run the core cold, so the
  // ratio is the command line's own cost. Shown beside it: the same call warm in this process
  // (after three calls; V8 has optimised it) and the cold core inside each CLI run. One of each
  // per round, so that all sides see the same load.
  const measurements = measurementsOf(big);
  for (let i = 0; i < 3; i++) runReduction(measurements, {}); // compiled before the first timed call
  const warm: number[] = [];
  const first: number[] = [];
  const cliTimes: number[] = [];
  const coreTimes: number[] = [];
  const readTimes: number[] = [];
  const formatTimes: number[] = [];
  for (let i = 0; i < reps(9); i++) {
    const w0 = performance.now();
    runReduction(measurements, {});
    warm.push(performance.now() - w0);
    first.push(coreOnceInChild(file40k));
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [BIN, "reduce", file40k, "--json"], { encoding: "utf8", maxBuffer: 1 << 30, env: { ...process.env, RHEOLEDGER_TIMING: "1" } });
    cliTimes.push(performance.now() - t0);
    if (r.status !== 0) throw new Error(`bench: the CLI failed on the 40,000-row file: ${r.stderr.slice(0, 300)}`);
    coreTimes.push(Number(/timing reduce ([\d.]+)/.exec(r.stderr)?.[1]));
    readTimes.push(Number(/timing read ([\d.]+)/.exec(r.stderr)?.[1]));
    formatTimes.push(Number(/timing format ([\d.]+)/.exec(r.stderr)?.[1]) + Number(/timing write ([\d.]+)/.exec(r.stderr)?.[1]));
  }
  const ratio40k = median(cliTimes) / median(first);
  lines.push({ what: "CLI reduce, 40,000-row file ÷ first in-process runReduction() (fresh process)", measured: `${ratio40k.toFixed(2)}× (${msText(median(cliTimes))} vs ${msText(median(first))})`, target: `≤ ${INPUT_TARGETS.cli40kOverCore}×`, verdict: ratio40k <= INPUT_TARGETS.cli40kOverCore ? "PASS" : "MISS" });
  lines.push({ what: "same ÷ runReduction() warm in this process, 4th call on (info)", measured: `${(median(cliTimes) / median(warm)).toFixed(2)}× (${msText(median(warm))})`, target: "", verdict: "" });
  lines.push({ what: "same ÷ the cold runReduction() inside each CLI run (info)", measured: `${(median(cliTimes) / median(coreTimes)).toFixed(2)}× (${msText(median(coreTimes))})`, target: "", verdict: "" });
  notes.push(
    `40,000-row file (${(statSync(file40k).size / 1e6).toFixed(1)} MB, 4 dies × 10,000 piston speeds): the CLI run ${msText(median(cliTimes))} = reading the file ${msText(median(readTimes))}, ` +
      `the core's runReduction() (reduction and flow-curve fits) ${msText(median(coreTimes))}, building and writing the JSON document ${msText(median(formatTimes))}, the rest starting Node and loading the command line; ` +
      `a first runReduction() call in a fresh process ${msText(median(first))}, warm in this process ${msText(median(warm))}: a first call is ${(median(first) / median(warm)).toFixed(2)}× a warm one (V8 optimises as it goes), whoever makes it.`,
  );

  // 7. per-row worksheet function against a plain loop, in a process of its own: what the
  // earlier sections ran (RHEO.WALLSTRESSAPP spilling a column, for one) changes what the
  // optimiser makes of the function, and section 7 states that history itself
  lines.push(...perRowInChild(options.quick));

  // 8. a large file ends in a message
  if (options.bigFile || options.hugeFile) {
    const bytes = options.hugeFile ? 1e9 : 2e8;
    const file = path.join(CACHE, `bench-${options.hugeFile ? "1GB" : "200MB"}.csv`);
    if (!existsSync(file) || statSync(file).size < bytes) {
      const block = runRows([10, 20, 30], speeds).map(withBarrel).join("\n") + "\n";
      const fd = openSync(file, "w");
      try {
        writeSync(fd, HEADER + "\n");
        for (let written = 0; written < bytes; written += block.length) writeSync(fd, block);
      } finally {
        closeSync(fd);
      }
    }
    const probe = "process.on('exit',()=>process.stderr.write('\\nmaxRSS '+process.resourceUsage().maxRSS+'\\n'));";
    const t0 = performance.now();
    const r = spawnSync(process.execPath, ["-e", `${probe}require(${JSON.stringify(BIN)})`, BIN, "reduce", file], { encoding: "utf8", maxBuffer: 1 << 26 });
    const seconds = (performance.now() - t0) / 1000;
    const rss = Number(/maxRSS (\d+)/.exec(r.stderr)?.[1] ?? NaN) / 1024;
    const message = r.stderr.split("\n").find((l) => l.startsWith("rheoledger:")) ?? "(no message)";
    lines.push({ what: `CLI on a ${(statSync(file).size / 1e6).toFixed(0)} MB CSV (info)`, measured: `${seconds.toFixed(1)} s, ${rss.toFixed(0)} MB peak`, target: "a message, exit 1", verdict: r.status === 1 && /more than .* data lines/.test(message) ? "PASS" : "MISS" });
    notes.push(`large file: exit ${r.status}, "${message.slice(0, 160)}"`);
  }
  return { lines, notes };
}
