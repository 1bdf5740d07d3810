/**
 * Timing helpers shared by the bench's sections that compare the TypeScript solver with scipy in
 * alternating rounds (scripts/bench.ts section 1, scripts/bench/masterFitBench.ts).
 */

export const median = (v: number[]): number => {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
};

/** Milliseconds as "215 µs" or "1.06 ms". */
export const ms = (v: number): string => (v < 1 ? `${(v * 1000).toFixed(0)} µs` : `${v.toFixed(v < 10 ? 2 : 1)} ms`);

/** The spread of samples, min–max. */
export const spread = (v: number[]): string => `${ms(Math.min(...v))}–${ms(Math.max(...v))}`;

/** Minimum warm-up of each measured function, ms (V8 optimises the solver within the first few hundred calls). */
const WARMUP_MS = 400;

/** Times `fn` in `repeats` samples of `batch` calls after a warm-up; per-call ms. */
export function sample(fn: () => number, repeats: number, batch: number, sink: { value: number }): number[] {
  const warm = performance.now();
  for (let i = 0; i < batch * 3 || performance.now() - warm < WARMUP_MS; i++) sink.value += fn();
  const out: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    for (let b = 0; b < batch; b++) sink.value += fn();
    out.push((performance.now() - t0) / batch);
  }
  return out;
}
