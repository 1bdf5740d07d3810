/**
 * fast-check generators of what Excel can hand a worksheet function: cell values of every kind
 * (numbers from tiny to huge, NaN and infinities that a runtime could pass, blanks, text, logicals,
 * error values), ranges of every shape, and option arguments drawn from the words the functions
 * understand mixed with junk. Shared by the property-based suites (test/fuzz-*.test.ts).
 */
import fc from "fast-check";
import { acceptedUnits, knownQuantities } from "../../src/core/units";
import { MODEL_IDS } from "../../src/core/models";
import { FakeCustomFunctionError } from "./sheet";

/** Numbers at the edges of the double range and of physics. */
export const EDGE_NUMBERS = [0, -0, 1, -1, 2, 3, 0.5, -1e-9, 1e-300, -1e-300, 5e-324, 1e300, -1e300, Number.MAX_VALUE, -Number.MAX_VALUE, NaN, Infinity, -Infinity];

/** Every unit text the functions accept, of every quantity (so also the wrong quantity's). */
export const ALL_UNITS = [...new Set(knownQuantities().flatMap((q) => acceptedUnits(q)))];

/** Words the option arguments accept somewhere (methods, choices, model ids, quantities). */
export const KNOWN_WORDS = [
  ...ALL_UNITS,
  ...knownQuantities(),
  ...MODEL_IDS,
  "transition", "local", "global", "difference", "bagley", "none", "orifice",
  "steps", "summary", "warnings", "log", "linear", "TRUE", "FALSE",
];

/** A positive number of a plausible lab magnitude (log-uniform over 1e-3 … 1e4). */
export const plausible = fc.double({ min: -3, max: 4, noNaN: true }).map((e) => Math.pow(10, e));

/** Any number a cell could hold or a runtime could pass, edges included. */
export const anyNumber = fc.oneof(
  { weight: 3, arbitrary: plausible },
  { weight: 2, arbitrary: fc.double() },
  { weight: 2, arbitrary: fc.constantFrom(...EDGE_NUMBERS) },
  { weight: 1, arbitrary: fc.integer({ min: -5, max: 5 }) },
);

/** Text in a cell: numbers stored as text, known words, arbitrary strings, spaces. */
export const anyText = fc.oneof(
  anyNumber.map((n) => String(n)),
  fc.constantFrom(...KNOWN_WORDS, "", " ", "  ", "n/a", "#N/A", "1,5", "1e400", "-1e400", "0x10", "Infinity", "NaN", "12 bar"),
  fc.string({ maxLength: 12 }),
  fc.string({ unit: "grapheme", maxLength: 6 }),
);

/** An error value inside a range (what a cell holding #DIV/0! passes). */
export const errorCell = fc.constantFrom("#DIV/0!", "#N/A", "#VALUE!", "#REF!", "#NUM!").map((code) => new FakeCustomFunctionError(code, ""));

/** Any single cell value: mostly numbers, then blanks, text, logicals and error values. */
export const anyCell: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: anyNumber },
  { weight: 2, arbitrary: fc.constantFrom(null, "", "   ") },
  { weight: 2, arbitrary: anyText },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: errorCell },
);

/** A mostly-valid cell: plausible numbers with now and then a blank or something odd. */
const mostlyPlausibleCell: fc.Arbitrary<unknown> = fc.oneof({ weight: 12, arbitrary: plausible }, { weight: 1, arbitrary: anyCell });

function shaped(cell: fc.Arbitrary<unknown>): fc.Arbitrary<unknown[][]> {
  return fc.oneof(
    cell.map((v) => [[v]]), // single cell
    fc.array(cell, { minLength: 1, maxLength: 14 }).map((vs) => vs.map((v) => [v])), // column
    fc.array(cell, { minLength: 1, maxLength: 14 }).map((vs) => [vs]), // row
    fc // a block (Excel ranges are rectangular)
      .tuple(fc.integer({ min: 2, max: 5 }), fc.integer({ min: 2, max: 4 }))
      .chain(([h, w]) => fc.array(fc.array(cell, { minLength: w, maxLength: w }), { minLength: h, maxLength: h })),
  );
}

/** A raw-data table with a `quantity [unit]` header, as RHEO.REDUCE reads (sometimes broken). */
export const rawTable: fc.Arbitrary<unknown[][]> = fc
  .tuple(
    fc.shuffledSubarray(
      ["die_diameter [mm]", "die_length [mm]", "flow_rate [mm3/s]", "pressure [bar]", "piston_speed [mm/min]", "barrel_diameter [mm]", "temperature [C]", "mass_rate [g/min]", "density [g/cm3]", "pressure [furlong]", "nonsense"],
      { minLength: 1 },
    ),
    fc.integer({ min: 0, max: 12 }),
  )
  .chain(([header, rows]) =>
    fc.array(fc.array(mostlyPlausibleCell, { minLength: header.length, maxLength: header.length }), { minLength: rows, maxLength: rows }).map((body) => [header, ...body]),
  );

/** Any range argument: every shape, plausible or junk contents, tables, nothing at all. */
export const anyRange: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 5, arbitrary: shaped(mostlyPlausibleCell) },
  { weight: 3, arbitrary: shaped(anyCell) },
  { weight: 2, arbitrary: rawTable },
  { weight: 1, arbitrary: fc.constantFrom<unknown>([], [[]], null, undefined, [[null]], [[""]]) },
  { weight: 1, arbitrary: anyCell }, // a bare value where a range was expected
);

/** An option argument (unit, method, choice, number, switch) or junk in its place. */
export const anyOption: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom<unknown>(...KNOWN_WORDS) },
  { weight: 3, arbitrary: fc.constantFrom<unknown>(null, undefined, "") },
  { weight: 1, arbitrary: anyText },
  { weight: 1, arbitrary: anyNumber },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: fc.constant<unknown>([["bar"]]) },
);
