/**
 * A full recording of a three-die test, read as a trace table and reduced end to end, gives the
 * same flow curve as the steady-point table it was generated from, within the plateau noise.
 * The point table is an invented power-law melt (K = 5000 Pa·sⁿ, n = 0.4) with a Bagley end
 * correction e = 2: ΔP = 2τ_w(L/R + e), τ_w = K·γ̇_w^n, γ̇_w = γ̇_a(3n + 1)/(4n) (Bagley 1957;
 * Rabinowitsch 1929). The recording approaches each pressure as a first-order response
 * (compressionTime.ts) with 0.5 % noise and 1 % speed jitter.
 */
import { reduce, runTraceReduction, stepMeasurements, type Measurement } from "../src/core";
import { readTraceTable } from "../src/io/traceTable";
import { expectClose } from "./helpers/expectClose";
import { syntheticRun } from "./helpers/syntheticTrace";

const K = 5000;
const N = 0.4;
const E = 2;
const D = 1e-3;
const DB = 15e-3;
const LENGTHS = [5e-3, 10e-3, 20e-3];
const SPEEDS_MM_MIN = [1, 3, 10, 30, 100];
const NOISE = 0.005;

function steadyPressure(length: number, speed: number): number {
  const q = (speed * Math.PI * DB * DB) / 4;
  const rateApparent = (32 * q) / (Math.PI * D ** 3);
  const tauW = K * (rateApparent * ((3 * N + 1) / (4 * N))) ** N;
  return 2 * tauW * ((2 * length) / D + E);
}

function recordingCells(): unknown[][] {
  const rows: unknown[][] = [["time [s]", "piston_speed [mm/min]", "pressure [bar]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "temperature [C]"]];
  LENGTHS.forEach((length, i) => {
    const steps = SPEEDS_MM_MIN.map((s) => ({ speed: s, pressure: steadyPressure(length, (s * 1e-3) / 60) / 1e5, duration: 60 }));
    const r = syntheticRun({ steps, tau: 2.5, noise: NOISE, speedJitter: 0.01, dt: 0.2, seed: 100 + i });
    r.time.forEach((t, k) => rows.push([t, r.speed[k], r.pressure[k], 1, length * 1e3, 15, 190 + 0.1 * Math.sin(k)]));
  });
  return rows;
}

describe("three-die recording against its steady-point table", () => {
  test("same flow curve within the plateau noise", () => {
    const table = readTraceTable(recordingCells(), { rowWord: "line" });
    expect(table.runs).toHaveLength(3);
    expect(table.runs.map((r) => r.die?.dieLength)).toEqual(LENGTHS);
    const run = runTraceReduction(table.runs, {}, {}, {}, table.warnings);
    // nothing wrong with the reduction: only notes (rates interpolated between dies whose measured
    // speeds differ slightly, the wall stress reaching the melt-fracture range) and, at most, a
    // model of the default list that a pure power law cannot determine
    expect(run.warnings.filter((w) => w.severity !== "info" && w.code !== "FIT_FAILED")).toEqual([]);
    const trace = run.steps;
    expect(stepMeasurements(trace)).toHaveLength(15);
    const fromTrace = run.result;
    const points: Measurement[] = LENGTHS.flatMap((L) =>
      SPEEDS_MM_MIN.map((s) => ({ dieDiameter: D, dieLength: L, flowRate: ((s * 1e-3) / 60) * ((Math.PI * DB * DB) / 4), pressure: steadyPressure(L, (s * 1e-3) / 60), temperature: 463.15 })),
    );
    const fromTable = reduce(points);
    expect(fromTrace.groups).toHaveLength(1);
    const a = fromTrace.groups[0]!.flowCurve;
    const b = fromTable.groups[0]!.flowCurve;
    expect(a).toHaveLength(b.length);
    a.forEach((row, i) => {
      const ref = b[i]!;
      expectClose(row.shearRateApparent, ref.shearRateApparent, { rel: 0.003 }, `γ̇a ${i}`);
      expectClose(row.wallShearStress, ref.wallShearStress, { rel: NOISE }, `τw ${i}`);
      expectClose(row.viscosity!, ref.viscosity!, { rel: NOISE }, `η ${i}`);
    });
    // the recording's flow curve is the power law within the plateau noise
    a.forEach((row, i) => {
      // @check steps/traceSteps, traceRun | flow curve of a three-die recording against η = K·γ̇_w^(n−1) at 5 rates | Ostwald–de Waele power law with the Rabinowitsch factor (3n + 1)/(4n) (Rabinowitsch, Z. Phys. Chem. A145 (1929) 1) | rel 0.005 | 5
      expectClose(row.viscosity!, K * row.shearRateWall! ** (N - 1), { rel: NOISE }, `law ${i}`);
    });
    // and the table itself recovers the invented law (n' = n, η = K·γ̇_w^(n−1))
    for (const row of b) {
      expectClose(row.nPrime, N, { rel: 1e-6 });
      expectClose(row.viscosity!, K * row.shearRateWall! ** (N - 1), { rel: 1e-6 });
    }
    expectClose(fromTrace.groups[0]!.temperature!, 463.15, { abs: 0.01 });
  });
});
