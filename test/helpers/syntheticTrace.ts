/**
 * Synthetic pressure–time recordings for the step-detection tests: each step approaches its known
 * steady pressure as a first-order response p(t) = p_ss + (p_start − p_ss)·exp(−t/τ) (the
 * compressible-barrel model of src/core/compressionTime.ts), with optional Gaussian noise, a slow
 * linear drift, a sawtooth stick–slip oscillation and speed jitter. Seeded, so reproducible.
 */
import { gaussian, seededRandom } from "../../src/core/random";

export interface SyntheticStep {
  /** piston speed, m/s */
  speed: number;
  /** steady pressure p_ss, Pa */
  pressure: number;
  /** s */
  duration: number;
  /** drift of the pressure, fraction of p_ss per second */
  drift?: number;
  /** sawtooth: peak-to-peak fraction of p_ss, period s */
  stickSlip?: { amplitude: number; period: number };
  /** time constant for this step, s (default the run's) */
  tau?: number;
}

export interface SyntheticRunSpec {
  steps: SyntheticStep[];
  /** τ, s */
  tau: number;
  /** relative noise standard deviation (of each step's p_ss) */
  noise?: number;
  /** relative speed jitter standard deviation */
  speedJitter?: number;
  /** sample interval, s */
  dt?: number;
  /** pressure before the first step, Pa */
  startPressure?: number;
  /** time of the first sample, s */
  startTime?: number;
  seed?: number;
}

export interface SyntheticRun {
  time: number[];
  speed: number[];
  pressure: number[];
  /** the noise-free pressure */
  clean: number[];
  /** index of each step's first sample */
  stepStarts: number[];
}

export function syntheticRun(spec: SyntheticRunSpec): SyntheticRun {
  const rand = seededRandom(spec.seed ?? 1);
  const dt = spec.dt ?? 0.1;
  const out: SyntheticRun = { time: [], speed: [], pressure: [], clean: [], stepStarts: [] };
  let pStart = spec.startPressure ?? 0;
  let t = spec.startTime ?? 0;
  for (const step of spec.steps) {
    const n = Math.round(step.duration / dt);
    out.stepStarts.push(out.time.length);
    const tau = step.tau ?? spec.tau;
    let last = pStart;
    for (let k = 0; k < n; k++) {
      const s = k * dt;
      let p = step.pressure + (pStart - step.pressure) * Math.exp(-s / tau);
      if (step.drift) p += step.drift * step.pressure * s;
      if (step.stickSlip) {
        const phase = (s / step.stickSlip.period) % 1;
        p += step.stickSlip.amplitude * step.pressure * (phase - 0.5);
      }
      last = p;
      out.time.push(t);
      out.speed.push(step.speed * (1 + (spec.speedJitter ?? 0) * gaussian(rand)));
      out.clean.push(p);
      out.pressure.push(p + (spec.noise ?? 0) * step.pressure * gaussian(rand));
      t += dt;
    }
    pStart = last;
  }
  return out;
}
