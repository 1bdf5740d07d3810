/**
 * Writes the lab-style raw-data fixtures of the reduction tests (test/reduce-lab.test.ts) and the
 * true flow curve they were made from. Invented data: an invented shear-thinning melt at 190 °C
 * (Carreau–Yasuda η0 = 5000 Pa·s, λ = 0.2 s, a = 0.7, n = 0.3; no real material), a 1 mm bore,
 * dies of 10, 20 and 30 mm, a 15 mm barrel, piston speeds in mm/min, pressures in bar written to
 * two decimals and melt temperatures to one, as instruments and spreadsheets write them.
 * Deterministic (seeded); run `node scripts/run-ts.mjs scripts/make-flow-fixtures.ts`.
 *
 *   lab-repeats.csv   each die's ladder with the first speed repeated at the end (the stability
 *                     check): L = 30 mm drifted −6 % (a degraded melt), the others within 1 %; one
 *                     row of L = 20 mm copied twice (an exact duplicate)
 *   lab-spurt.csv     ten speeds; from the eighth speed up every die's pressure is 15 % below the
 *                     stable curve (spurt), as in the trial of issue 12
 *   lab-jittered.csv  measured (not set) piston speeds, each within ±1.5 % of its set-point, so no
 *                     two dies share a rate
 *   lab-truth.json    the true γ̇_a, γ̇_w, τ_w and η at every set speed (exact flow integral)
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import { gaussian, seededRandom } from "../src/core/random";
import { carreauYasuda, trueCurve } from "../test/helpers/capillaryRun";

const MELT = { eta0: 5000, lambda: 0.2, a: 0.7, n: 0.3 };
const eta = carreauYasuda(MELT.eta0, MELT.lambda, MELT.a, MELT.n);
const D = 1; // mm
const BARREL = 15; // mm
const LENGTHS = [10, 20, 30]; // mm
const SPEEDS = [0.6, 1.2, 2.5, 5, 10, 20, 40, 80, 160, 320]; // mm/min
const HEADER = "temperature [C],die_diameter [mm],die_length [mm],barrel_diameter [mm],piston_speed [mm/min],pressure [bar]";
const OUT = path.resolve("test/fixtures");

/** γ̇_a = 32Q/(πD³) with Q = v·πD_b²/4: 8·v·D_b²/D³ (v in mm/s, lengths in mm). */
const apparentRate = (speedMmMin: number) => (8 * (speedMmMin / 60) * BARREL ** 2) / D ** 3;
/** The end correction of the invented die entry, in radii: 2 + 1.5·log10(γ̇_a/10). */
const endCorrection = (rate: number) => 2 + 1.5 * Math.log10(rate / 10);

const truthCurve = trueCurve(eta, SPEEDS.map(apparentRate));
const truth = SPEEDS.map((v, i) => ({
  pistonSpeed: v,
  shearRateApparent: truthCurve.rates[i] as number,
  shearRateWall: truthCurve.wallRates[i] as number,
  wallShearStress: truthCurve.stresses[i] as number,
  viscosity: (truthCurve.stresses[i] as number) / (truthCurve.wallRates[i] as number),
}));

/** Pressure in bar of a die at a piston speed (as the truth's flow curve gives it, interpolated log–log between set speeds). */
function pressureBar(lengthMm: number, speed: number): number {
  const rate = apparentRate(speed);
  const k = Math.max(0, Math.min(SPEEDS.length - 2, SPEEDS.findIndex((v) => v > speed) - 1));
  const r0 = truthCurve.rates[k] as number;
  const r1 = truthCurve.rates[k + 1] as number;
  const t = (Math.log(rate) - Math.log(r0)) / (Math.log(r1) - Math.log(r0));
  const tau = Math.exp(Math.log(truthCurve.stresses[k] as number) * (1 - t) + Math.log(truthCurve.stresses[k + 1] as number) * t);
  return (2 * tau * ((2 * lengthMm) / D + endCorrection(rate))) / 1e5;
}

const random = seededRandom(20261203);
const noisy = (p: number, noise = 0.003) => p * (1 + noise * gaussian(random));
const temperature = () => (190 + 0.2 * (2 * random() - 1)).toFixed(1);
const row = (length: number, speed: number | string, bar: number) => `${temperature()},${D},${length},${BARREL},${speed},${bar.toFixed(2)}`;

function write(name: string, comment: string, rows: string[]): void {
  writeFileSync(path.join(OUT, name), [`# Invented data (no real material or lab): ${comment} See scripts/make-flow-fixtures.ts.`, HEADER, ...rows].join("\n") + "\n");
}

// lab-repeats.csv: 9 speeds per die, the first repeated at the end; one copied row
{
  const speeds = SPEEDS.slice(0, 9);
  const rows: string[] = [];
  for (const L of LENGTHS) {
    for (const v of speeds) {
      const line = row(L, v, noisy(pressureBar(L, v)));
      rows.push(line);
      if (L === 20 && v === 10) rows.push(line);
    }
    const drift = L === 30 ? 0.94 : L === 20 ? 1.008 : 0.993;
    rows.push(row(L, speeds[0] as number, pressureBar(L, speeds[0] as number) * drift));
  }
  write("lab-repeats.csv", "each die's first speed repeated at the end; L = 30 mm drifted -6 %; one copied row.", rows);
}

// lab-spurt.csv: every die 15 % low from the eighth speed up
{
  const rows = LENGTHS.flatMap((L) => SPEEDS.map((v, i) => row(L, v, noisy(pressureBar(L, v)) * (i >= 7 ? 0.85 : 1))));
  write("lab-spurt.csv", "spurt: from 80 mm/min up every die reads 15 % below the stable curve.", rows);
}

// lab-jittered.csv: measured speeds within ±1.5 % of the set-points, 4 significant figures
{
  const speeds = SPEEDS.slice(0, 9);
  const rows = LENGTHS.flatMap((L) =>
    speeds.map((v) => {
      const measured = Number((v * (1 + 0.015 * (2 * random() - 1))).toPrecision(4));
      return row(L, measured, noisy(pressureBar(L, measured)));
    }),
  );
  write("lab-jittered.csv", "measured piston speeds, each within 1.5 % of its set-point.", rows);
}

writeFileSync(
  path.join(OUT, "lab-truth.json"),
  JSON.stringify(
    {
      about: "True flow curve of the invented melt of lab-*.csv at the set piston speeds: Carreau–Yasuda, exact flow integral (src/core/forwardFlow.ts). SI units. Generated by scripts/make-flow-fixtures.ts.",
      melt: MELT,
      temperatureC: 190,
      dieDiameterMm: D,
      barrelDiameterMm: BARREL,
      points: truth,
    },
    null,
    2,
  ) + "\n",
);
console.log(`wrote lab-repeats.csv, lab-spurt.csv, lab-jittered.csv, lab-truth.json to ${path.relative(process.cwd(), OUT)}`);
