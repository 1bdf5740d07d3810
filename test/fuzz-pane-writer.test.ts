/**
 * Property-based test (fast-check, fixed seed) of the pane's Excel writer over the
 * office-addin-mock workbook of helpers/fakeExcel.ts: whatever sheets the workbook already has
 * (names that collide with ours in any letter case, long names) and wherever the run fails (any
 * sync, any chart, or not at all), the user's sheets are never touched, and
 * - on success exactly two new sheets are added, with names no existing sheet has, sharing one
 *   number ("Rheo results 3" / "Rheo method 3");
 * - on failure the error reaches the caller and the workbook has exactly the sheets it had.
 */
import fc from "fast-check";
import { SHEET_BASE_NAMES, writeWorkbookPlan } from "../src/taskpane/excelWriter";
import type { CellBlock, CellValue, ChartSpec, SheetPlan, WorkbookPlan } from "../src/taskpane/sheetPlan";
import { FakeExcel } from "./helpers/fakeExcel";

const RUNS = 250;

const existingNames = fc.uniqueArray(
  fc.oneof(
    fc.constantFrom("Data", "Sheet1", "Rheo results", "Rheo method", "rheo RESULTS 2", "Rheo method 2", "RHEO RESULTS 3", "Rheo results 4", "Rheo method 5", "Rheo results values"),
    fc.string({ minLength: 1, maxLength: 31 }).filter((s) => s.trim() === s && !/[\\/?*[\]:']/.test(s)),
  ),
  { maxLength: 8, selector: (n) => n.toLowerCase() },
);

const cellValue: fc.Arbitrary<CellValue> = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.string({ maxLength: 8 }), fc.constant(null), fc.boolean());

const block = (id: string, row: number): fc.Arbitrary<CellBlock> =>
  fc.record({
    title: fc.option(fc.string({ maxLength: 20 }), { nil: undefined }),
    header: fc.option(fc.array(fc.string({ maxLength: 6 }), { minLength: 2, maxLength: 4 }), { nil: undefined }),
    rows: fc.array(fc.array(cellValue, { minLength: 2, maxLength: 4 }), { minLength: 2, maxLength: 6 }),
  }).map((b) => ({ id, role: "table" as const, row, col: 0, ...b }));

function chart(i: number, rows: number): ChartSpec {
  return {
    id: `c${i}`, title: `chart ${i}`, xTitle: "x", yTitle: "y", xLog: i % 2 === 0, yLog: false,
    series: [{ name: "s", blockId: "b0", xColumn: 0, yColumn: 1, firstRow: 0, rowCount: rows, style: "markers", colour: "#0B4F4C" }],
    anchor: { row: 0, col: 6, rows: 10, cols: 6 },
  };
}

const planParts = fc.tuple(block("b0", 0), block("b1", 12), fc.integer({ min: 0, max: 3 }));

function makePlan([b0, b1, charts]: [CellBlock, CellBlock, number], names: { results: string; method: string }): WorkbookPlan {
  const results: SheetPlan = { name: names.results, blocks: [b0, b1], charts: Array.from({ length: charts }, (_, i) => chart(i, b0.rows.length)), columnWidths: [12, 12, 12] };
  const method: SheetPlan = { name: names.method, blocks: [{ ...b1, id: "m0", row: 0 }], charts: [], columnWidths: [20, 40] };
  return { results, method };
}

const failure = fc.oneof(
  fc.constant({}),
  fc.integer({ min: 1, max: 4 }).map((failAtSync) => ({ failAtSync })),
  fc.integer({ min: 1, max: 3 }).map((failAtChart) => ({ failAtChart })),
);

test("writeWorkbookPlan never touches the user's sheets, and leaves the workbook as it was when it fails", async () => {
  await fc.assert(
    fc.asyncProperty(existingNames, planParts, failure, async (existing, parts, fail) => {
      const fake = new FakeExcel(fail);
      for (const name of existing) fake.addSheet(name);
      let outcome: { names: { results: string; method: string } } | { error: unknown };
      try {
        outcome = { names: await writeWorkbookPlan(fake.batch, (n) => makePlan(parts, n)) };
      } catch (error) {
        outcome = { error };
      }
      for (const name of existing) {
        expect({ name, ranges: fake.sheet(name).ranges.length, charts: fake.sheet(name).charts.length }).toEqual({ name, ranges: 0, charts: 0 });
      }
      if ("error" in outcome) {
        expect(String(outcome.error)).toMatch(/fake: (sync failed|chart could not be created)/);
        expect(fake.names()).toEqual(existing);
        return;
      }
      const { results, method } = outcome.names;
      expect(fake.names()).toEqual([...existing, results, method]);
      const taken = existing.map((n) => n.toLowerCase());
      expect(taken).not.toContain(results.toLowerCase());
      expect(taken).not.toContain(method.toLowerCase());
      expect(results.slice(SHEET_BASE_NAMES.results.length)).toBe(method.slice(SHEET_BASE_NAMES.method.length));
    }),
    { seed: 20261204, numRuns: RUNS },
  );
});
