/**
 * Invented demo scenario: the pressure recording behind the QF-207 demo (scripts/demo/filmGrade.ts;
 * a made-up film grade of the made-up Quillfen Films QC lab) at 190 °C: three barrel loads, one per
 * die (1 mm bore, L = 10, 20, 30 mm), each climbing the piston-speed ladder and ending with the
 * first speed again as the thermal-stability check. Sampled at 2 Hz; the clock restarts with
 * every load.
 *
 * Generated, not measured: each step approaches the grade's steady pressure (filmGradePressure)
 * as a first-order response with the compressible-barrel time constant τ = β·V_melt·ΔP/Q
 * (src/core/compressionTime.ts; β = 1.2 GPa⁻¹, invented), V_melt falling as the piston advances
 * from a 26.5 cm³ load; each step lasts max(40 s, 7τ), the repeat max(90 s, 10τ). Noise 0.4 % of
 * the pressure, 0.5 % on the speed, ±0.2 K on the melt thermocouple (seed 2071). Three staged
 * defects for the demo to find:
 *   - L = 10 mm: the operator stops the 80 mm/min step after 6 s (cut short);
 *   - L = 30 mm: stick–slip at 80 mm/min (a 12 % sawtooth of period 2.5 s);
 *   - L = 30 mm: the melt slowly degrades (−6 % over the load), so the repeated first speed reads low.
 */
import { writeFileSync } from "node:fs";
import { compressionTimeConstant } from "../../src/core/compressionTime";
import { gaussian, seededRandom } from "../../src/core/random";
import { FILM_GRADE, filmGradePressure } from "./filmGrade";

export const FILM_GRADE_RECORDING = {
  temperatureC: 190,
  pistonSpeedsMmMin: [0.6, 1.2, 2.5, 5, 10, 20, 40, 80],
  compressibility: 1.2e-9,
  loadVolume: 26.5e-6,
  minStepSeconds: 40,
  settleConstants: 7,
  /** the repeat is held longer: coming down from the top speed takes more time constants */
  checkSeconds: 90,
  checkConstants: 10,
  sampleSeconds: 0.5,
  pressureNoise: 0.004,
  speedJitter: 0.005,
  seed: 2071,
};

/** The file's header row. */
export const RECORDING_HEADER = ["time [s]", "piston_speed [mm/min]", "pressure [bar]", "temperature [C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]"];

/** CSV rows of the recording (header first). */
export function filmGradeRecordingRows(): string[][] {
  const r = FILM_GRADE_RECORDING;
  const random = seededRandom(r.seed);
  const area = (Math.PI * FILM_GRADE.barrelDiameter ** 2) / 4;
  const rows: string[][] = [RECORDING_HEADER];
  for (const L of FILM_GRADE.dieLengths) {
    const lengthMm = Math.round(L * 1e3);
    const speeds = [...r.pistonSpeedsMmMin, r.pistonSpeedsMmMin[0] as number];
    let volume = r.loadVolume;
    let t = 0;
    let p = 0;
    const degradation = lengthMm === 30 ? 0.06 : 0;
    // the load's total time, for the degradation's rate
    const steps = speeds.map((v, k) => {
      const target = filmGradePressure(r.temperatureC, L, v);
      const q = ((v * 1e-3) / 60) * area;
      const tau = compressionTimeConstant(r.compressibility, volume, target, q);
      const check = k === speeds.length - 1;
      let duration = check ? Math.max(r.checkSeconds, r.checkConstants * tau) : Math.max(r.minStepSeconds, r.settleConstants * tau);
      if (lengthMm === 10 && v === 80) duration = 6;
      volume -= q * duration;
      return { v, target, tau, duration, stickSlip: lengthMm === 30 && v === 80 && !check };
    });
    const total = steps.reduce((s, x) => s + x.duration, 0);
    for (const step of steps) {
      const start = p;
      const n = Math.round(step.duration / r.sampleSeconds);
      for (let i = 0; i < n; i++) {
        const s = i * r.sampleSeconds;
        const ageing = 1 - degradation * (t / total);
        const steady = step.target * ageing;
        p = steady + (start - steady) * Math.exp(-s / step.tau);
        let reading = p * (1 + r.pressureNoise * gaussian(random));
        if (step.stickSlip) reading += 0.12 * steady * (((s / 2.5) % 1) - 0.5);
        const speed = step.v * (1 + r.speedJitter * gaussian(random));
        const temperature = r.temperatureC + 0.2 * gaussian(random);
        rows.push([t.toFixed(1), speed.toFixed(4), (reading / 1e5).toFixed(3), temperature.toFixed(2), "1", String(lengthMm), "15"]);
        t += r.sampleSeconds;
      }
    }
  }
  return rows;
}

/** The CSV text: a comment line naming the scenario, then the rows. */
export function filmGradeRecordingCsv(): string {
  return "# Invented demo data (not a real material or lab): see scripts/demo/filmGradeRecording.ts\n" + filmGradeRecordingRows().map((row) => row.join(",")).join("\n") + "\n";
}

if (process.argv[1]?.endsWith("filmGradeRecording.cjs")) {
  const out = process.argv[2] ?? "workbooks/demo-film-grade-recording.csv";
  writeFileSync(out, filmGradeRecordingCsv());
  console.log(`wrote ${out}`);
}
