/**
 * Property-based test (fast-check, fixed seed) of the pane's Excel writer over the
 * office-addin-mock workbook of helpers/fakeExcel.ts: whatever sheets the workbook already has
 * (names that collide with ours in any letter case, long names) and wherever the run fails (any
 * sync, any chart, or not at all), the user's sheets are never touched, and
 * - on success exactly two new sheets are added, with names no existing sheet has, sharing one
 *   number ("Rheo results 3" / "Rheo method 3");
 * - on failure the error reaches the caller and the workbook has exactly the sheets it had;
 * - every value of the plan lands in its cell unchanged (numbers as numbers, blanks as "");
 * - text stays text: a value starting with = + - @, a tab or a carriage return must not become a
 *   formula (written with a leading apostrophe, or into a cell formatted as text "@"; the writer
 *   formats every text cell "@" before its value, issue 20 "Text stays text").
 * The per-suite report (cases, successful writes, failures by kind) goes to test-output/fuzz-report.json.
 */
import fc from "fast-check";
import { SHEET_BASE_NAMES, writeWorkbookPlan } from "../src/taskpane/excelWriter";
import type { CellBlock, CellValue, ChartSpec, SheetPlan, WorkbookPlan } from "../src/taskpane/sheetPlan";
import { FakeExcel, cellName } from "./helpers/fakeExcel";
import { blockLayout } from "../src/taskpane/sheetPlan";
import { countError, newTally, writeFuzzReport } from "./helpers/fuzzReport";

const RUNS = 250;

const existingNames = fc.uniqueArray(
  fc.oneof(
    fc.constantFrom("Data", "Sheet1", "Rheo results", "Rheo method", "rheo RESULTS 2", "Rheo method 2", "RHEO RESULTS 3", "Rheo results 4", "Rheo method 5", "Rheo results values"),
    fc.string({ minLength: 1, maxLength: 31 }).filter((s) => s.trim() === s && !/[\\/?*[\]:']/.test(s)),
  ),
  { maxLength: 8, selector: (n) => n.toLowerCase() },
);

/** Text a user can type that a spreadsheet would read as a formula or a signed number. */
const formulaLike = fc.tuple(fc.constantFrom("=", "+", "-", "@", "\t", "\r"), fc.constantFrom("HYPERLINK(\"x\")", "1+1", "L20", "P50", "SUM(A1:A3)", "", "5")).map(([lead, rest]) => lead + rest);
const text = fc.oneof({ weight: 3, arbitrary: fc.string({ maxLength: 8 }) }, { weight: 1, arbitrary: formulaLike });
const cellValue: fc.Arbitrary<CellValue> = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), text, fc.constant(null), fc.boolean());

const block = (id: string, row: number): fc.Arbitrary<CellBlock> =>
  fc.record({
    title: fc.option(text, { nil: undefined }),
    header: fc.option(fc.array(text, { minLength: 2, maxLength: 4 }), { nil: undefined }),
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

/** Every cell the plan's blocks put on a sheet: A1 address → the value as planned. */
function plannedCells(plan: SheetPlan): Map<string, CellValue> {
  const out = new Map<string, CellValue>();
  for (const b of plan.blocks) {
    const lay = blockLayout(b);
    if (lay.titleRow !== null) out.set(cellName(lay.titleRow, b.col), b.title as string);
    if (lay.headerRow !== null) (b.header as string[]).forEach((h, c) => out.set(cellName(lay.headerRow as number, b.col + c), h));
    b.rows.forEach((row, r) => row.forEach((v, c) => out.set(cellName(lay.firstDataRow + r, b.col + c), v)));
  }
  return out;
}

const tally = newTally();
afterAll(() => writeFuzzReport("pane-writer", tally));

test("writeWorkbookPlan never touches the user's sheets, writes every planned value unchanged, and leaves the workbook as it was when it fails", async () => {
  await fc.assert(
    fc.asyncProperty(existingNames, planParts, failure, async (existing, parts, fail) => {
      tally.cases++;
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
        countError(tally, /chart/.test(String(outcome.error)) ? "injected chart failure" : "injected sync failure");
        return;
      }
      const { results, method } = outcome.names;
      const plan = makePlan(parts, outcome.names);
      for (const [sheet, planned] of [[results, plan.results], [method, plan.method]] as const) {
        const written = fake.written(sheet);
        for (const [address, value] of plannedCells(planned)) {
          const got = written.get(address);
          // a string may come back escaped with a leading apostrophe (text kept as text)
          const same = got === (value ?? "") || (typeof value === "string" && got === `'${value}`);
          expect({ sheet, address, got, same }).toEqual({ sheet, address, got, same: true });
        }
      }
      tally.reachedCore++;
      expect(fake.names()).toEqual([...existing, results, method]);
      const taken = existing.map((n) => n.toLowerCase());
      expect(taken).not.toContain(results.toLowerCase());
      expect(taken).not.toContain(method.toLowerCase());
      expect(results.slice(SHEET_BASE_NAMES.results.length)).toBe(method.slice(SHEET_BASE_NAMES.method.length));
    }),
    { seed: 20261204, numRuns: RUNS },
  );
});

// Issue 20, "Text stays text": a label such as "=HYPERLINK(…)", "-L20" or "@P50" written through
// range.values would become a formula or #NAME?; the writer formats text cells "@" before their values.
test("text stays text: a planned string starting with = + - @, tab or CR is written as text (issue 20)", async () => {
  await fc.assert(
    fc.asyncProperty(planParts, async (parts) => {
      const fake = new FakeExcel({});
      const names = await writeWorkbookPlan(fake.batch, (n) => makePlan(parts, n));
      const plan = makePlan(parts, names);
      for (const [sheet, planned] of [[names.results, plan.results], [names.method, plan.method]] as const) {
        const written = fake.written(sheet);
        const formats = fake.written(sheet, "numberFormat");
        for (const [address, value] of plannedCells(planned)) {
          if (typeof value !== "string" || !/^[=+\-@\t\r]/.test(value)) continue;
          const got = written.get(address);
          const asText = (typeof got === "string" && got.startsWith("'")) || formats.get(address) === "@";
          expect({ sheet, address, value, asText }).toEqual({ sheet, address, value, asText: true });
        }
      }
    }),
    { seed: 20261206, numRuns: 100 },
  );
});
