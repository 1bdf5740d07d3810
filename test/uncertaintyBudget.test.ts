import { reduce, Measurement, ReductionGroup } from "../src/core/reduce";
import { flowRateForApparentShearRate } from "../src/core/capillary";
import { DEFAULT_UNCERTAINTY_BUDGET_OPTIONS, UncertaintyBudgetRow, UncertaintySource } from "../src/core/uncertaintyBudget";
import { seededRandom, gaussian } from "../src/core/random";
import { expectClose } from "./helpers/expectClose";

const D = 1e-3;
const transducer = { fullScale: 700e5, accuracy: 0.0025 };
const contribution = (row: UncertaintyBudgetRow, source: UncertaintySource) => row.contributions.find((c) => c.source === source);

describe("budget defaults (common practice, no source)", () => {
  test("bore ±5 µm, length ±25 µm, melt ±1 K, piston speed ±0.5 %, k = 2", () => {
    expect(DEFAULT_UNCERTAINTY_BUDGET_OPTIONS).toEqual({ dieBoreTolerance: 5e-6, dieLengthTolerance: 25e-6, meltTemperatureTolerance: 1, pistonSpeedTolerance: 0.005, coverageFactor: 2 });
  });
});

/**
 * One Newtonian die, no end correction (Hagen–Poiseuille: τ_w = ΔP·D/(4L), γ̇_w = γ̇_a = 32Q/(πD³),
 * η = ΔP·πD⁴/(128·Q·L)). A die of true bore D + u at the nominal flow rate reads
 * ΔP·(D/(D + u))⁴ ≈ ΔP·(1 − 4u/D), so at the reported rate τ_w and η have the sensitivity 4/D
 * (η ∝ D⁴ at a given pressure and flow rate), γ̇_w none; a length L + u reads ΔP·(1 + u/L). Piston
 * speed and melt temperature scale the rate: a Newtonian die's pressure scales with it (s = 1).
 * Inputs rectangular: u = a/√3 (GUM §4.3.7); first-order sensitivities (GUM §5.1.3).
 */
describe("single die, no end correction: the budget by hand", () => {
  const mu = 500;
  const L = 20e-3;
  const rates = [10, 30, 100, 300, 1000];
  const data: Measurement[] = rates.map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: (4 * mu * rate * L) / D }));
  const g = reduce(data, { endCorrection: "none", transducer, uncertainty: { temperatureCoefficient: 0.03 } }).groups[0]!;
  const uBore = 5e-6 / Math.sqrt(3);
  const uLength = 25e-6 / Math.sqrt(3);
  test("die bore: τ_w and η ∝ D⁴ at the reported rate, γ̇_w unchanged", () => {
    g.uncertaintyBudget!.forEach((row, i) => {
      const f = g.flowCurve[i]!;
      const c = contribution(row, "dieBore")!;
      const lr = (4 * uBore) / D;
// @check uncertaintyBudget | bore sensitivity of one Newtonian die: τ_w and η ∝ D⁴ at the reported rate, 5 rates | Hagen–Poiseuille; JCGM 100:2008 (GUM), 5.1 | rel 1e-6 | 10
      expectClose(c.wallShearStress, f.wallShearStress * lr, { rel: 1e-6 });
      expect(c.shearRateWall as number).toBeLessThan(1e-9 * (f.shearRateWall as number));
      expectClose(c.viscosity as number, (f.viscosity as number) * lr, { rel: 1e-6 });
    });
  });
  test("die length: τ and η ∝ 1/L; gain: τ and η ∝ (1 + g); piston speed: γ̇_w ∝ Q, η ∝ 1/Q", () => {
    const uGain = 0.0025 / Math.sqrt(3);
    const uSpeed = 0.005 / Math.sqrt(3);
    g.uncertaintyBudget!.forEach((row, i) => {
      const f = g.flowCurve[i]!;
      expectClose(contribution(row, "dieLength")!.viscosity as number, ((f.viscosity as number) * uLength) / L, { rel: 1e-6 });
      expectClose(contribution(row, "gain")!.viscosity as number, (f.viscosity as number) * uGain, { rel: 1e-12 });
      expect(contribution(row, "gain")!.shearRateWall).toBe(0);
      expectClose(contribution(row, "pistonSpeed")!.viscosity as number, (f.viscosity as number) * uSpeed, { rel: 1e-6 });
      expectClose(contribution(row, "pistonSpeed")!.wallShearStress, f.wallShearStress * uSpeed, { rel: 1e-6 });
    });
  });
  test("zero offset does not cancel on a single die: u(τ) = u_z·D/(4L), u_z = 0.25 %·700 bar/√3", () => {
    const uZero = (0.0025 * 700e5) / Math.sqrt(3);
    g.uncertaintyBudget!.forEach((row) => expectClose(contribution(row, "zero")!.wallShearStress, (uZero * D) / (4 * L), { rel: 1e-9 }));
  });
  test("melt temperature through the shift law at the held rate: u_r(η) = n′·b·u_T (n′ = 1)", () => {
    g.uncertaintyBudget!.forEach((row, i) => expectClose(contribution(row, "temperature")!.viscosity as number, (g.flowCurve[i]!.viscosity as number) * 0.03 * (1 / Math.sqrt(3)), { rel: 1e-6 }));
  });
  test("combined = root sum of squares, expanded = 2·combined; the ± columns are the expanded values", () => {
    g.uncertaintyBudget!.forEach((row, i) => {
      const rss = Math.sqrt(row.contributions.reduce((s, c) => s + (c.viscosity as number) ** 2, 0));
      expectClose(row.combined.viscosity as number, rss, { rel: 1e-12 });
      expectClose(row.expanded.viscosity as number, 2 * rss, { rel: 1e-12 });
      expect(g.uncertainty![i]!.viscosity).toBe(row.expanded.viscosity);
    });
  });
  test("no plateau deviations and no Bagley scatter: UNCERTAINTY_NO_SCATTER; no b: UNCERTAINTY_TEMPERATURE_OMITTED", () => {
    expect(g.warnings.map((w) => w.code)).toContain("UNCERTAINTY_NO_SCATTER");
    const r = reduce(data, { endCorrection: "none", transducer });
    expect(r.warnings.map((w) => w.code)).toContain("UNCERTAINTY_TEMPERATURE_OMITTED");
    expect(r.groups[0]!.uncertaintyBudget![0]!.contributions.map((c) => c.source)).toEqual(["zero", "gain", "dieBore", "dieLength", "pistonSpeed"]);
    expect(() => reduce(data, { endCorrection: "none", transducer, uncertainty: { dieBoreTolerance: -1 } })).toThrow(/dieBoreTolerance: must be zero or more/);
    expect(() => reduce([{ ...(data[0] as Measurement), pressureStd: -1 }, ...data.slice(1)], { endCorrection: "none", transducer })).toThrow(/pressureStd: row 1 must be zero or more/);
  });
});

describe("Bagley: the zero offset cancels, the line's scatter is the random part", () => {
  const mu = 400;
  const rates = [10, 30, 100, 300, 1000];
  const exact: Measurement[] = [10e-3, 20e-3, 30e-3].flatMap((L) => rates.map((rate) => ({ dieDiameter: D, dieLength: L, flowRate: flowRateForApparentShearRate(rate, D), pressure: 6 * mu * rate + (4 * mu * rate * L) / D })));
  test("zero offset: a constant added to every pressure leaves each Bagley slope unchanged", () => {
    const g = reduce(exact, { transducer }).groups[0]!;
    g.uncertaintyBudget!.forEach((row, i) => expect(contribution(row, "zero")!.wallShearStress).toBeLessThan(1e-9 * g.flowCurve[i]!.wallShearStress));
  });
  test("noisy lines: the Bagley standard error is the scatter, through the smoother's n′", () => {
    const random = seededRandom(3);
    const noisy = exact.map((m) => ({ ...m, pressure: m.pressure * (1 + 0.004 * gaussian(random)) }));
    const g = reduce(noisy, { transducer }).groups[0]!;
    g.uncertaintyBudget!.forEach((row, i) => {
      const scatter = contribution(row, "scatter")!;
      const se = g.bagley.find((b) => b.shearRateApparent === g.flowCurve[i]!.shearRateApparent)!.slopeStandardError / 2;
      expectClose(scatter.wallShearStress, se, { rel: 1e-9 });
      expect(scatter.nPrime).toBeGreaterThan(0);
    });
  });
});

/**
 * Monte Carlo check of the budget (JCGM 101:2008, GUM Supplement 1): the measurement is simulated
 * M times with every input drawn from its distribution — transducer zero and gain (one draw per run,
 * rectangular), each die's bore and length (rectangular), the piston speed (rectangular), the melt
 * temperature (rectangular, acting through the shift law a = exp(−b·ΔT) on the rate) and each
 * reading's scatter (normal, its plateau standard deviation) — and reduced with the nominal inputs.
 * The standard deviation of each output is compared with the budget's u_c (within 10 %; M = 2000
 * draws estimate a standard deviation to 1.6 %), and the GUM interval y ± U with the Monte Carlo
 * 95 % probabilistically symmetric interval (JCGM 101 §7.7; clause numbers from memory) by the validation of §8: both endpoint
 * differences within δ = ½·10^l, u_c = c·10^l with one significant digit (n_dig = 1, §8.2), plus
 * twice the numerical standard deviation of the Monte Carlo endpoints themselves, estimated from
 * h = 10 blocks of M/h draws (§7.9.4: M = 2000 does not fix the endpoints to δ). The share of draws
 * inside y ± U must reach 94 % (95 % less the sampling error of M = 2000 draws).
 */
interface Scenario {
  /** apparent flow curve at the reference temperature, τ_w(γ̇_a) in Pa */
  stress: (rate: number) => number;
  dies: { length: number }[];
  rates: number[];
  /** plateau standard deviation of a reading as a fraction of it, or 0 */
  scatter: number;
  b: number;
  options: Parameters<typeof reduce>[1];
}

function readings(s: Scenario, draw: { zero: number; gain: number; bore: number[]; length: number[]; speed: number; dT: number; noise: () => number } | null): Measurement[] {
  const a = draw === null ? 1 : Math.exp(-s.b * draw.dT);
  return s.dies.flatMap((die, d) =>
    s.rates.map((rate) => {
      const flowRate = flowRateForApparentShearRate(rate, D);
      const trueD = D + (draw?.bore[d] ?? 0);
      const trueL = die.length + (draw?.length[d] ?? 0);
      const trueRate = (32 * flowRate * (1 + (draw?.speed ?? 0))) / (Math.PI * trueD ** 3);
      const tau = s.stress(a * trueRate);
      const pressure = 6 * tau + (4 * tau * trueL) / trueD;
      const noise = draw === null ? 0 : s.scatter * pressure * draw.noise();
      const read = draw === null ? pressure : pressure * (1 + draw.gain) + draw.zero + noise;
      const m: Measurement = { dieDiameter: D, dieLength: die.length, flowRate, pressure: read };
      if (s.scatter > 0) m.pressureStd = s.scatter * pressure;
      return m;
    }),
  );
}

function monteCarlo(s: Scenario, trials: number, seed: number) {
  const random = seededRandom(seed);
  const uniform = (half: number) => (2 * random() - 1) * half;
  const nominal = reduce(readings(s, null), { ...s.options, transducer, uncertainty: { temperatureCoefficient: s.b } });
  const g = nominal.groups[0] as ReductionGroup;
  const samples: { tau: number[]; wall: number[]; eta: number[] }[] = g.flowCurve.map(() => ({ tau: [], wall: [], eta: [] }));
  for (let t = 0; t < trials; t++) {
    const draw = {
      zero: uniform(transducer.accuracy * transducer.fullScale),
      gain: uniform(transducer.accuracy),
      bore: s.dies.map(() => uniform(5e-6)),
      length: s.dies.map(() => uniform(25e-6)),
      speed: uniform(0.005),
      dT: uniform(1),
      noise: () => gaussian(random),
    };
    const run = reduce(readings(s, draw), s.options).groups[0]!;
    expect(run.flowCurve.length).toBe(g.flowCurve.length);
    run.flowCurve.forEach((f, i) => {
      samples[i]!.tau.push(f.wallShearStress);
      samples[i]!.wall.push(f.shearRateWall as number);
      samples[i]!.eta.push(f.viscosity as number);
    });
  }
  return { group: g, samples };
}

const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
const std = (v: number[]) => {
  const m = mean(v);
  return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1));
};
/** Probabilistically symmetric 95 % interval (JCGM 101 §7.7): the 2.5 % and 97.5 % quantiles of the sorted draws. */
function interval95(v: number[]): [number, number] {
  const sorted = [...v].sort((a, b) => a - b);
  const q = (p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.round(p * sorted.length) - 1))] as number;
  return [q(0.025), q(0.975)];
}
/** JCGM 101 §8: |y − U − y_low| ≤ δ and |y + U − y_high| ≤ δ, δ = ½·10^l from u_c with n_dig = 1. */
function validates(y: number, uc: number, U: number, mcInterval: [number, number]): { dLow: number; dHigh: number; delta: number } {
  const l = Math.floor(Math.log10(uc));
  return { dLow: Math.abs(y - U - mcInterval[0]), dHigh: Math.abs(y + U - mcInterval[1]), delta: 0.5 * Math.pow(10, l) };
}
/** Numerical standard deviations of the interval endpoints from h blocks (JCGM 101 §7.9.4). */
function endpointSpread(v: number[], h = 10): [number, number] {
  const size = Math.floor(v.length / h);
  const ends = Array.from({ length: h }, (_, b) => interval95(v.slice(b * size, (b + 1) * size)));
  return [std(ends.map((e) => e[0])) / Math.sqrt(h), std(ends.map((e) => e[1])) / Math.sqrt(h)];
}

function checkAgainstMonteCarlo(s: Scenario, trials: number, seed: number) {
  const { group, samples } = monteCarlo(s, trials, seed);
  const report: string[] = [];
  group.uncertaintyBudget!.forEach((row, i) => {
    const f = group.flowCurve[i]!;
    const sm = samples[i]!;
    // standard deviations: M draws give a relative standard error of 1/√(2M) on each (1.6 % at M = 2000)
// @check uncertaintyBudget | combined u of η, τ_w and γ̇_w against a Monte Carlo simulation of the instrument (M = 2000), 7 and 8 rates | JCGM 101:2008 (GUM Supplement 1) | rel 0.1 | 45
    expectClose(std(sm.eta), row.combined.viscosity as number, { rel: 0.1 }, `u(η) at ${f.shearRateApparent} 1/s`);
    expectClose(std(sm.tau), row.combined.wallShearStress, { rel: 0.1 }, `u(τ) at ${f.shearRateApparent} 1/s`);
    expectClose(std(sm.wall), row.combined.shearRateWall as number, { rel: 0.1, abs: 1e-3 * (f.shearRateWall as number) }, `u(γ̇w) at ${f.shearRateApparent} 1/s`);
    const v = validates(f.viscosity as number, row.combined.viscosity as number, row.expanded.viscosity as number, interval95(sm.eta));
    const [sLow, sHigh] = endpointSpread(sm.eta);
    const inside = sm.eta.filter((e) => Math.abs(e - (f.viscosity as number)) <= (row.expanded.viscosity as number)).length / sm.eta.length;
    report.push(`${Number(f.shearRateApparent.toPrecision(4))} 1/s: u_c ${(row.combined.viscosity as number).toPrecision(3)}, MC ${std(sm.eta).toPrecision(3)}; d ${v.dLow.toPrecision(2)}/${v.dHigh.toPrecision(2)}, δ ${v.delta}, endpoint s ${sLow.toPrecision(2)}/${sHigh.toPrecision(2)}; coverage ${inside.toFixed(3)}`);
    expect(v.dLow).toBeLessThanOrEqual(v.delta + 2 * sLow);
    expect(v.dHigh).toBeLessThanOrEqual(v.delta + 2 * sHigh);
    expect(inside).toBeGreaterThanOrEqual(0.94);
  });
  return report;
}

describe("Monte Carlo check (JCGM 101:2008)", () => {
  test("data set 1: power law, three dies, Bagley, plateau deviations 0.3 %, global quadratic smoother (M = 2000)", () => {
    const n = 0.4;
    const report = checkAgainstMonteCarlo(
      {
        stress: (rate) => 1e4 * (((3 * n + 1) / (4 * n)) * rate) ** n,
        dies: [{ length: 10e-3 }, { length: 20e-3 }, { length: 30e-3 }],
        rates: [20, 50, 100, 200, 500, 1000, 2000],
        scatter: 0.003,
        b: 0.03,
        options: { rabinowitsch: { method: "global", degree: 2 } },
      },
      2000,
      11,
    );
    if (process.env.SHOW_MC) console.log(report.join("\n"));
  });
  test("data set 2: Cross-shaped curve, long die and orifice with a land, local smoother, systematic inputs only (M = 2000)", () => {
    const report = checkAgainstMonteCarlo(
      {
        stress: (rate) => (20000 * rate) / (1 + (0.2 * rate) ** 0.65),
        dies: [{ length: 0.5e-3 }, { length: 20e-3 }],
        rates: [20, 50, 100, 200, 500, 1000, 2000, 5000],
        scatter: 0,
        b: 0.025,
        options: { endCorrection: "orifice", rabinowitsch: { method: "local", degree: 2, window: 5 } },
      },
      2000,
      12,
    );
    if (process.env.SHOW_MC) console.log(report.join("\n"));
  });
});
