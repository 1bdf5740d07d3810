/**
 * Barrel friction of a force-measuring instrument: the piston force of a blank run (the barrel
 * emptied through no die or an orifice, as the lab's procedure defines) against piston speed,
 * interpolated linearly in speed at each step's speed and subtracted as a pressure:
 *
 *   ΔP = (F − F_blank(v)) / A_b,   A_b = π·D_b²/4.
 *
 * Outside the blank's speed range the nearest end value is used and the step says so
 * (common practice, no source). SI: N, m/s, m, Pa.
 */
import { RheoError, requirePositive } from "../errors";

/** One blank point: force F at piston speed v. */
export interface BlankPoint {
  pistonSpeed: number;
  force: number;
}

/** Friction force at one speed. */
export interface FrictionAt {
  /** F_blank(v), N */
  force: number;
  /** true when v lies outside the blank's speed range (the end value was used) */
  outside: boolean;
}

/** A friction curve built from blank points, by {@link frictionCurve}. */
export interface FrictionCurve {
  points: BlankPoint[];
  at(pistonSpeed: number): FrictionAt;
}

/** Barrel cross-section A_b = π·D_b²/4, m². */
export function barrelArea(barrelDiameter: number): number {
  requirePositive(barrelDiameter, "barrelDiameter");
  return (Math.PI * barrelDiameter * barrelDiameter) / 4;
}

/**
 * The friction curve through blank points (sorted by speed; repeated speeds are averaged).
 * @throws RheoError("missing") when no point is given; ("domain") for a negative or non-finite value
 * @example frictionCurve([{ pistonSpeed: 1e-5, force: 50 }, { pistonSpeed: 3e-5, force: 70 }]).at(2e-5).force // 60
 */
export function frictionCurve(points: BlankPoint[]): FrictionCurve {
  if (points.length === 0) throw new RheoError("missing", "blank", "has no steady points (force against piston speed)");
  points.forEach((p, i) => {
    if (!(Number.isFinite(p.pistonSpeed) && p.pistonSpeed > 0)) throw new RheoError("domain", "blank", `point ${i + 1}: piston speed must be greater than zero, got ${p.pistonSpeed}`);
    if (!(Number.isFinite(p.force) && p.force >= 0)) throw new RheoError("domain", "blank", `point ${i + 1}: force must be zero or more, got ${p.force}`);
  });
  const sorted = [...points].sort((a, b) => a.pistonSpeed - b.pistonSpeed);
  const groups: BlankPoint[][] = [];
  for (const p of sorted) {
    const g = groups[groups.length - 1];
    if (g && Math.abs(p.pistonSpeed - (g[0] as BlankPoint).pistonSpeed) <= 1e-9 * p.pistonSpeed) g.push(p);
    else groups.push([p]);
  }
  const clean = groups.map((g) => ({ pistonSpeed: (g[0] as BlankPoint).pistonSpeed, force: g.reduce((s, p) => s + p.force, 0) / g.length }));
  const at = (v: number): FrictionAt => {
    const first = clean[0] as BlankPoint;
    const last = clean[clean.length - 1] as BlankPoint;
    const tol = 1e-9 * v;
    if (v < first.pistonSpeed - tol) return { force: first.force, outside: true };
    if (v > last.pistonSpeed + tol) return { force: last.force, outside: true };
    for (let k = 1; k < clean.length; k++) {
      const a = clean[k - 1] as BlankPoint;
      const b = clean[k] as BlankPoint;
      if (v <= b.pistonSpeed) {
        const u = (v - a.pistonSpeed) / (b.pistonSpeed - a.pistonSpeed);
        return { force: a.force + Math.max(0, Math.min(1, u)) * (b.force - a.force), outside: false };
      }
    }
    return { force: last.force, outside: false };
  };
  return { points: clean, at };
}
