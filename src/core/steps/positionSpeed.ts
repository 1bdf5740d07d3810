/**
 * Piston speed from a recorded piston position: the slope of a least-squares line through the
 * 2h + 1 samples centred on each sample (a Savitzky–Golay first derivative of degree 1, Savitzky
 * & Golay, Anal. Chem. 36 (1964) 1627), shortened at the ends of the record. Positions may count
 * up or down: the sign is chosen so that the run's net travel is positive (the piston pushes).
 */
import { RheoError } from "../errors";

/** Half-width h of the local fit, samples (common practice, no source). */
export const POSITION_HALF_WIDTH = 2;

/**
 * Speed at every sample from positions (see the module comment). SI: m, s, m/s.
 * @throws RheoError("missing") for fewer than 3 samples
 * @example speedFromPosition([0, 1, 2, 3], [0, 0.5, 1, 1.5]) // [0.5, 0.5, 0.5, 0.5]
 */
export function speedFromPosition(time: ArrayLike<number>, position: ArrayLike<number>, halfWidth = POSITION_HALF_WIDTH): Float64Array {
  const n = time.length;
  if (n < 3) throw new RheoError("missing", "piston_position", `needs at least 3 samples to derive a speed, got ${n}`);
  const out = new Float64Array(n);
  const sign = positionSign(position);
  for (let i = 0; i < n; i++) {
    out[i] = windowSpeedFromPosition(time, position, Math.max(0, i - halfWidth), Math.min(n - 1, i + halfWidth), sign);
  }
  return out;
}

/** +1 when the positions count up over the run, −1 when they count down. */
export function positionSign(position: ArrayLike<number>): number {
  return (position[position.length - 1] as number) < (position[0] as number) ? -1 : 1;
}

/**
 * Mean speed over samples [a, b] from positions: the least-squares slope of position against
 * time, times `sign` ({@link positionSign}).
 */
export function windowSpeedFromPosition(time: ArrayLike<number>, position: ArrayLike<number>, a: number, b: number, sign: number): number {
  const m = b - a + 1;
  let st = 0;
  let sx = 0;
  for (let k = a; k <= b; k++) {
    st += time[k] as number;
    sx += position[k] as number;
  }
  const tm = st / m;
  const xm = sx / m;
  let sxx = 0;
  let sxy = 0;
  for (let k = a; k <= b; k++) {
    const dt = (time[k] as number) - tm;
    sxx += dt * dt;
    sxy += dt * ((position[k] as number) - xm);
  }
  return sxx > 0 ? (sign * sxy) / sxx : 0;
}
