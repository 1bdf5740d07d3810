import { DEFAULT_REPEAT_OPTIONS, repeatWarnings, speedSteps, StepReading } from "../src/core/speedSteps";
import { expectClose } from "./helpers/expectClose";

/** A ladder of readings (rate 1/s, pressure Pa) numbered from row 2 in the order given. */
const readings = (pairs: [number, number][]): StepReading[] => pairs.map(([rate, pressure], i) => ({ rate, pressure, row: i + 2 }));

describe("speedSteps(readings): repeats at one speed", () => {
  test("the first speed repeated at the end within the threshold is averaged into one step and listed", () => {
    const ladder = speedSteps(readings([[10, 100e5], [20, 130e5], [40, 170e5], [10, 101.5e5]]));
    expect(ladder.steps.map((s) => s.rate)).toEqual([10, 20, 40]);
    expectClose((ladder.steps[0] as { pressure: number }).pressure, 100.75e5, { rel: 1e-15 });
    expect(ladder.steps[0]?.used).toEqual([0, 3]);
    expect(ladder.repeats).toHaveLength(1);
    const r = ladder.repeats[0] as (typeof ladder.repeats)[number];
    expect([r.firstRow, r.repeatRow, r.used]).toEqual([2, 5, "mean"]);
    expectClose(r.change, 0.015, { rel: 1e-12 });
  });

  test("a repeat drifted beyond the threshold (common practice: a few per cent) is left out; the first reading alone stands", () => {
    expect(DEFAULT_REPEAT_OPTIONS.stabilityThreshold).toBe(0.03);
    const ladder = speedSteps(readings([[10, 100e5], [20, 130e5], [10, 90e5]]));
    expect((ladder.steps[0] as { pressure: number }).pressure).toBe(100e5);
    expect(ladder.steps[0]?.drifted).toEqual([2]);
    expect(ladder.repeats[0]?.used).toBe("first");
    expectClose(ladder.repeats[0]?.change as number, -0.1, { rel: 1e-12 });
  });

  test("when one of several repeats drifts, every repeat of that speed is left out and marked 'first'", () => {
    const ladder = speedSteps(readings([[10, 100e5], [10, 101e5], [10, 110e5]]));
    expect(ladder.steps[0]?.used).toEqual([0]);
    expect(ladder.steps[0]?.drifted).toEqual([1, 2]);
    expect(ladder.repeats.map((r) => r.used)).toEqual(["first", "first"]);
  });

  test("the threshold is a setting", () => {
    const ladder = speedSteps(readings([[10, 100e5], [10, 110e5]]), { stabilityThreshold: 0.15 });
    expect(ladder.repeats[0]?.used).toBe("mean");
  });

  test("an exact duplicate row is counted once, not averaged and not compared", () => {
    const ladder = speedSteps(readings([[10, 100e5], [20, 130e5], [20, 130e5]]));
    expect(ladder.steps).toHaveLength(2);
    expect(ladder.steps[1]?.duplicates).toEqual([2]);
    expect(ladder.duplicates).toEqual([[1, 2]]);
    expect(ladder.repeats).toEqual([]);
  });

  test("jittered measured speeds of one set-point (within 1 %) are one step at their geometric mean rate", () => {
    const ladder = speedSteps(readings([[10.02, 100e5], [20, 130e5], [9.97, 100.4e5]]));
    expect(ladder.steps).toHaveLength(2);
    expectClose((ladder.steps[0] as { rate: number }).rate, Math.sqrt(10.02 * 9.97), { rel: 1e-15 });
  });

  test("a dense ladder (steps 0.1 % apart) is never merged: every distinct speed is its own step", () => {
    const pairs: [number, number][] = Array.from({ length: 2000 }, (_, i) => [10 * 1.001 ** i, 1e6 * 1.0004 ** i]);
    const ladder = speedSteps(readings(pairs));
    expect(ladder.steps).toHaveLength(2000);
    expect(ladder.repeats).toEqual([]);
  });

  test("a dense ladder run twice keeps every speed and compares each repeat", () => {
    const once: [number, number][] = Array.from({ length: 500 }, (_, i) => [10 * 1.001 ** i, 1e6 * 1.0004 ** i]);
    const ladder = speedSteps(readings([...once, ...once.map(([r, p]): [number, number] => [r, p * 1.01])]));
    expect(ladder.steps).toHaveLength(500);
    expect(ladder.repeats).toHaveLength(500);
    ladder.repeats.forEach((r) => expectClose(r.change, 0.01, { rel: 1e-9 }));
  });
});

describe("repeatWarnings(dies)", () => {
  const die = (label: string, pairs: [number, number][]) => {
    const rs = readings(pairs);
    return { die: label, readings: rs, ladder: speedSteps(rs) };
  };
  test("REPEAT_DRIFT names the die, the speed, both rows, the change and which reading was used", () => {
    const w = repeatWarnings([die("L=20 mm", [[100, 200e5], [200, 260e5], [100, 188e5]])], 0.03);
    expect(w.map((x) => x.code)).toEqual(["REPEAT_DRIFT"]);
    expect(w[0]?.message).toContain("L=20 mm at 100 1/s, row 4 reads −6.0 % against row 2");
    expect(w[0]?.message).toContain("the first reading alone was used");
  });
  test("REPEATS_AVERAGED and DUPLICATE_ROWS", () => {
    const w = repeatWarnings([die("L=10 mm", [[100, 200e5], [100, 201e5], [200, 260e5], [200, 260e5]])], 0.03);
    expect(w.map((x) => x.code)).toEqual(["DUPLICATE_ROWS", "REPEATS_AVERAGED"]);
    expect(w[0]?.message).toContain("rows 4 and 5 (L=10 mm)");
  });
  test("no repeats, no warnings", () => expect(repeatWarnings([die("L=10 mm", [[100, 200e5], [200, 260e5]])], 0.03)).toEqual([]));
});
