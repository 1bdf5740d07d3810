/**
 * Invented demo scenario: a short pressure recording for the task pane's preview (the recording
 * panel), small enough to ship inside the pane. The made-up QF-207 film grade
 * (scripts/demo/filmGrade.ts) at 210 °C on its three dies of 1 mm bore (L = 10, 20, 30 mm), each
 * die run climbing a ladder of five piston speeds and ending with the first speed again (the
 * thermal-stability check).
 *
 * Generated, not measured: each step approaches its known plateau, the grade's steady pressure
 * filmGradePressure(210 °C, L, v), as a first-order response p(t) = p_ss + (p_start − p_ss)·e^(−t/τ)
 * with τ = 3 s (invented; the compressible-barrel model of src/core/compressionTime.ts), held
 * 30 s, sampled at 1 Hz, with 0.4 % Gaussian noise on the pressure and 0.5 % on the speed (seed
 * 4113), four significant digits written; the melt thermocouple reads the set-point. One staged defect: on the 30 mm die the operator ends the
 * 40 mm/min step after 8 s, so that step never becomes steady. The clock restarts with each die.
 */
import { writeFileSync } from "node:fs";
import { gaussian, seededRandom } from "../../src/core/random";
import { FILM_GRADE, filmGradePressure } from "./filmGrade";

export const TRACE_LADDER = {
  temperatureC: 210,
  pistonSpeedsMmMin: [2.5, 5, 10, 20, 40],
  timeConstant: 3,
  stepSeconds: 30,
  /** the 30 mm die's 40 mm/min step, cut short */
  cutShort: { dieLengthMm: 30, speedMmMin: 40, seconds: 8 },
  sampleSeconds: 1,
  pressureNoise: 0.004,
  speedJitter: 0.005,
  seed: 4113,
};

/** The recording's header row. */
export const TRACE_LADDER_HEADER = ["time [s]", "piston_speed [mm/min]", "pressure [bar]", "temperature [C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]"];

/** One plateau of the ladder: the die, the speed and the steady pressure it approaches (Pa). */
export interface LadderPlateau {
  dieLengthMm: number;
  speedMmMin: number;
  pressure: number;
  /** false for the step cut short (it never reaches its plateau) */
  reached: boolean;
}

/** The known plateau ladder, in recording order (the repeated first speed last in each die run). */
export function traceLadderPlateaus(): LadderPlateau[] {
  const r = TRACE_LADDER;
  return FILM_GRADE.dieLengths.flatMap((L) => {
    const lengthMm = Math.round(L * 1e3);
    return [...r.pistonSpeedsMmMin, r.pistonSpeedsMmMin[0] as number].map((v) => ({
      dieLengthMm: lengthMm,
      speedMmMin: v,
      pressure: filmGradePressure(r.temperatureC, L, v),
      reached: !(lengthMm === r.cutShort.dieLengthMm && v === r.cutShort.speedMmMin),
    }));
  });
}

/** CSV rows of the recording (header first). */
export function traceLadderRows(): string[][] {
  const r = TRACE_LADDER;
  const random = seededRandom(r.seed);
  const rows: string[][] = [TRACE_LADDER_HEADER];
  let previousDie = -1;
  let t = 0;
  let p = 0;
  for (const plateau of traceLadderPlateaus()) {
    if (plateau.dieLengthMm !== previousDie) {
      previousDie = plateau.dieLengthMm;
      t = 0;
      p = 0;
    }
    const start = p;
    const seconds = plateau.reached ? r.stepSeconds : r.cutShort.seconds;
    const n = Math.round(seconds / r.sampleSeconds);
    for (let i = 0; i < n; i++) {
      const s = i * r.sampleSeconds;
      p = plateau.pressure + (start - plateau.pressure) * Math.exp(-s / r.timeConstant);
      const reading = p * (1 + r.pressureNoise * gaussian(random));
      const speed = plateau.speedMmMin * (1 + r.speedJitter * gaussian(random));
      rows.push([String(t), String(Number(speed.toPrecision(4))), String(Number((reading / 1e5).toPrecision(4))), String(r.temperatureC), "1", String(plateau.dieLengthMm), "15"]);
      t += r.sampleSeconds;
    }
  }
  return rows;
}

/** The CSV text: a comment line naming the scenario, then the rows. */
export function traceLadderCsv(): string {
  return "# Invented demo data (not a real material or lab): see scripts/demo/traceLadder.ts\n" + traceLadderRows().map((row) => row.join(",")).join("\n") + "\n";
}

if (process.argv[1]?.endsWith("traceLadder.cjs")) {
  const out = process.argv[2] ?? "workbooks/demo-trace-ladder.csv";
  writeFileSync(out, traceLadderCsv());
  console.log(`wrote ${out}`);
}
