/**
 * Accuracy benchmark of the Rabinowitsch smoothers for `npm run bench` (figures, never a timed
 * test; test/rabinowitsch.test.ts asserts the exact-data and a fixed-seed figure). Invented melts
 * (helpers/capillaryRun.ts): Carreau–Yasuda and Cross, 4 dies (L/D 5, 10, 20, 30, 1 mm bore) × 10
 * apparent rates over 20–5000 1/s, end correction rising with rate; pressures exact, then with 1 %
 * relative Gaussian noise in `draws` seeded draws. Each run goes through the whole reduction
 * (Bagley lines, then Rabinowitsch); the figure is the worst point's |γ̇_w/γ̇_w,true − 1| with the
 * true wall rates from the exact flow integral. Goals (issue 12): the default ≤ 0.3 % on exact data,
 * median worst point ≤ 2.5 % under noise, and never worse in median than the best alternative.
 * A yield-stress paste (Herschel–Bulkley) is shown for information: its n′ near 0 at low rates
 * makes (3n′+1)/(4n′) steep, and no method meets the melt goals there.
 */
import { reduce } from "../src/core/reduce";
import type { RabinowitschOptions } from "../src/core/rabinowitsch";
import { BENCH_MELTS, capillaryRun, logRates, trueCurve, worstWallRateError, type TrueCurve } from "../test/helpers/capillaryRun";

/** The goals of issue 12. */
export const SMOOTHER_GOALS = Object.freeze({ exactWorst: 0.003, noiseMedianWorst: 0.025 });

/** The methods compared: the default and every alternative. */
export const SMOOTHER_METHODS: Readonly<Record<string, Partial<RabinowitschOptions>>> = Object.freeze({
  "default (transition)": {},
  "global cubic": { method: "global", degree: 3 },
  "global quadratic": { method: "global", degree: 2 },
  "local quadratic, 5 points": { method: "local", degree: 2, window: 5 },
  "finite difference": { method: "difference" },
});

/** One row of the result: a melt and a method. */
export interface SmootherRow {
  melt: string;
  method: string;
  /** worst-point error on exact data */
  exact: number;
  /** median and 90th percentile of the worst-point error over the noisy draws */
  median: number;
  p90: number;
  /** the default's verdict against the goals (null for the alternatives and the paste) */
  verdict: boolean | null;
}

function worstPoints(curve: TrueCurve, options: Partial<RabinowitschOptions>, draws: number): { exact: number; median: number; p90: number } {
  const worst = (noise: number, seed: number) => {
    const group = reduce(capillaryRun(curve, { noise, seed }), { rabinowitsch: options }).groups[0];
    return group ? worstWallRateError(curve, group.flowCurve) : Infinity;
  };
  const errors = Array.from({ length: draws }, (_, k) => worst(0.01, k + 1)).sort((a, b) => a - b);
  const at = (q: number) => errors[Math.min(errors.length - 1, Math.floor(q * errors.length))] as number;
  return { exact: worst(0, 1), median: at(0.5), p90: at(0.9) };
}

/** Runs the benchmark: one row per melt and method. */
export function smootherBenchmark(draws: number): SmootherRow[] {
  const rows: SmootherRow[] = [];
  const melts: [string, (rate: number) => number, boolean][] = [
    ...Object.entries(BENCH_MELTS).map(([name, eta]): [string, (rate: number) => number, boolean] => [name, eta, true]),
    ["Herschel–Bulkley paste (info)", (g: number) => (5000 + 2000 * g ** 0.4) / g, false],
  ];
  for (const [melt, eta, judged] of melts) {
    const curve = trueCurve(eta, logRates(20, 5000, 10));
    const results = Object.entries(SMOOTHER_METHODS).map(([method, options]) => ({ method, ...worstPoints(curve, options, draws) }));
    const bestAlternative = Math.min(...results.slice(1).map((r) => r.median));
    results.forEach((r, k) => {
      const verdict = judged && k === 0 ? r.exact <= SMOOTHER_GOALS.exactWorst && r.median <= SMOOTHER_GOALS.noiseMedianWorst && r.median <= bestAlternative : null;
      rows.push({ melt, ...r, verdict });
    });
  }
  return rows;
}

const pct = (x: number) => (Number.isFinite(x) ? `${(x * 100).toFixed(x < 0.01 ? 3 : 2)} %` : "—");

/** The rows as a plain-text table and a Markdown table, with a line on the goals. */
export function smootherTables(rows: SmootherRow[], draws: number): { plain: string; markdown: string; note: string } {
  const cells = rows.map((r) => [r.melt, r.method, pct(r.exact), pct(r.median), pct(r.p90), r.verdict === null ? "" : r.verdict ? "PASS" : "MISS"]);
  const head = ["melt", "method", "exact data", `median (${draws} draws)`, "90th percentile", ""];
  const widths = head.map((h, c) => Math.max(h.length, ...cells.map((row) => (row[c] as string).length)));
  const line = (row: string[]) => row.map((v, c) => (c >= 2 && c <= 4 ? v.padStart(widths[c] as number) : v.padEnd(widths[c] as number))).join("  ");
  const plain = [line(head), line(widths.map((w) => "-".repeat(w))), ...cells.map(line)].join("\n");
  const markdown = [`| ${head.join(" | ")} |`, `|${head.map(() => "---").join("|")}|`, ...cells.map((row) => `| ${row.join(" | ")} |`)].join("\n");
  const note =
    `Rabinowitsch smoothers: worst-point error of the true wall rate, 4 dies × 10 rates through the whole reduction, 1 % pressure noise in ${draws} seeded draws. ` +
    `Goals for the default: ≤ ${pct(SMOOTHER_GOALS.exactWorst)} on exact data, median ≤ ${pct(SMOOTHER_GOALS.noiseMedianWorst)}, and a median no worse than the best alternative's.`;
  return { plain, markdown, note };
}
