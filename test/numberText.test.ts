/**
 * The one number reader (src/io/numberText.ts). Check texts come from the Unicode CLDR locale
 * data as ICU writes them (test/fixtures/number-formats.json, made by
 * scripts/gen-number-formats.mjs with Intl.NumberFormat), and from the examples.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { RheoError } from "../src/core/errors";
import { TableNumberReader, numberReadings, readFieldQuantity, readNumberText, readWithMark, splitNumberAndUnit } from "../src/io/numberText";
import { expectClose } from "./helpers/expectClose";

interface Formats {
  source: string;
  locales: { locale: string; decimal: string; group: string; texts: { value: number; text: string }[] }[];
}
const FORMATS = JSON.parse(readFileSync(join(__dirname, "fixtures", "number-formats.json"), "utf8")) as Formats;

function thrown(f: () => unknown): RheoError {
  try {
    f();
  } catch (e) {
    if (e instanceof RheoError) return e;
    throw e;
  }
  throw new Error("no error");
}

const place = (column: number, row: number) => ({ column: `col ${column}`, row: `line ${row}` });

describe("readWithMark(text, mark)", () => {
  test.each([
    ["1.234,5", ",", 1234.5],
    ["1,234.5", ".", 1234.5],
    ["1.160", ",", 1160],
    ["1.160", ".", 1.16],
    ["190,3", ",", 190.3],
    ["0,001", ",", 0.001],
    ["1 234 567,891", ",", 1234567.891],
    ["1'234.5", ".", 1234.5],
    ["−1 234,5", ",", -1234.5],
    ["1,5E+03", ",", 1500],
    ["-3e-4", ".", -3e-4],
    [".5", ".", 0.5],
    [",5", ",", 0.5],
    ["12", ",", 12],
  ])("%s with %s reads %d", (text, mark, value) => {
    expectClose(readWithMark(text, mark as "." | ",") as number, value, { rel: 1e-15 });
  });
  test.each([
    ["1.234,5", "."],
    ["1,234.5", ","],
    ["190,3", "."],
    ["0,001", "."], // a leading zero group is never a thousands group
    ["12.5", ","], // a group of one digit is not a thousands group
    ["1.234e3", ","], // an exponent is never grouped
    ["1.23.4", ","],
    ["1,2,3", "."],
    ["n/a", "."],
    ["", "."],
    ["1e400", "."], // not a finite number
    ["--1", "."],
    ["1 2", "."],
  ])("%s is not a number with %s", (text, mark) => {
    expect(readWithMark(text, mark as "." | ",")).toBeNull();
  });
});

describe("numberReadings(text) over CLDR locale formats", () => {
  for (const l of FORMATS.locales) {
    test(`${l.locale} (decimal "${l.decimal}", group "${l.group}"): the locale's reading is one of the text's readings`, () => {
      const mark = l.decimal as "." | ",";
      for (const { value, text } of l.texts) {
        const r = numberReadings(text);
        const mine = mark === "." ? r.point : r.comma;
        expectClose(mine as number, value, { rel: 1e-15 }, `${l.locale} "${text}"`);
      }
    });
  }
  test("each locale's table decides its mark and reads every cell right (the locale's own texts only)", () => {
    for (const l of FORMATS.locales) {
      const reader = new TableNumberReader({ describe: place });
      const values = l.texts.map((t, i) => reader.read(t.text, 0, i + 1, i));
      for (const c of reader.finish()) values[c.key] = c.comma;
      l.texts.forEach((t, i) => expectClose(values[i] as number, t.value, { rel: 1e-15 }, `${l.locale} "${t.text}"`));
      expect(reader.mark).toBe(l.decimal);
    }
  });
});

describe("TableNumberReader", () => {
  test("issue example: semicolon file, decimal comma and dot thousands: 1.160 is 1160 once a decimal comma is seen, even later", () => {
    const r = new TableNumberReader({ describe: place });
    expect(r.read("1.160", 5, 2, 0)).toBe(1.16); // pending: the point reading for now
    expect(r.undecided).toBe(1);
    expect(r.read("190,3", 0, 3, 1)).toBe(190.3);
    expect(r.mark).toBe(",");
    expect(r.takeCorrections()).toEqual([{ column: 5, row: 2, key: 0, text: "1.160", point: 1.16, comma: 1160 }]);
    expect(r.read("2.350", 5, 4, 2)).toBe(2350);
    expect(r.finish()).toEqual([]);
  });
  test("decimal point decided: 1,160 is 1160 and 1.160 is 1.16", () => {
    const r = new TableNumberReader({ describe: place });
    expect(r.read("12.5", 0, 2, 0)).toBe(12.5);
    expect(r.read("1,160", 0, 3, 1)).toBe(1160);
    expect(r.read("1.160", 0, 4, 2)).toBe(1.16);
  });
  test("a genuinely ambiguous table is refused naming the column, a row and both readings", () => {
    const r = new TableNumberReader({ describe: (c, row) => ({ column: "pressure [kPa] (column 6)", row: `line ${row}` }) });
    r.read("850", 5, 2, 0);
    r.read("1.160", 5, 3, 1);
    r.read("1.420", 5, 4, 2);
    const e = thrown(() => r.finish());
    expect(e.code).toBe("AMBIGUOUS_NUMBER");
    expect(e.message).toMatch(/^pressure \[kPa\] \(column 6\): line 3 "1\.160" could be 1\.16 \(decimal point\) or 1160 \("\." grouping thousands\)/);
  });
  test("a fallback mark settles an undecided table (a comma-delimited file reads 1.160 as 1.16)", () => {
    const r = new TableNumberReader({ describe: place, fallback: "." });
    expect(r.read("1.160", 0, 2, 0)).toBe(1.16);
    expect(r.finish()).toEqual([]);
    expect(r.mark).toBe(".");
  });
  test("mixed decimal marks are refused naming both cells", () => {
    const r = new TableNumberReader({ describe: (c, row) => ({ column: `c${c}`, row: `line ${row}` }) });
    r.read("190,3", 0, 2, 0);
    const e = thrown(() => r.read("12.5", 1, 7, 1));
    expect(e.code).toBe("MIXED_DECIMAL_MARKS");
    expect(e.message).toBe('c1: line 7 "12.5" has a decimal point, but line 2 (c0) "190,3" has a decimal comma; a table must use one decimal mark');
  });
  test("text that is no number either way names the cell, quoting a short clean excerpt", () => {
    const r = new TableNumberReader({ describe: place });
    const e = thrown(() => r.read("\u001b[2J" + "x".repeat(5000), 3, 9, 0));
    expect(e.code).toBe("NOT_A_NUMBER");
    // eslint-disable-next-line no-control-regex
    expect(e.message).not.toMatch(/\u001b/);
    expect(e.message.length).toBeLessThan(120);
  });
  test("the pending list is bounded: past it an undecided table without fallback is refused at once", () => {
    const r = new TableNumberReader({ describe: place, maxPending: 3 });
    for (let i = 0; i < 3; i++) r.read("1.160", 0, i + 2, i);
    expect(() => r.read("1.160", 0, 5, 3)).toThrow(/in its first 3 such cells/);
  });
});

describe("readNumberText(text) and readFieldQuantity(text, quantity, unit): one field on its own", () => {
  test("unambiguous forms are read", () => {
    expect(readNumberText("1,5", "x")).toBe(1.5);
    expect(readNumberText("1.234,5", "x")).toBe(1234.5);
    expect(readNumberText(" 700 ", "x")).toBe(700);
    expect(readNumberText("1.5e3", "x")).toBe(1500); // an exponent is never grouped
    expect(() => readNumberText("", "x")).toThrow(/^x: expected a number/);
  });
  test("issue example: the transducer full scale '1,000' is refused (1 or 1000?), not read as 1 bar", () => {
    const e = thrown(() => readFieldQuantity("1,000", "pressure", "bar", "transducerFullScale"));
    expect(e.message).toMatch(/^transducerFullScale: "1,000" can be read as 1 or as 1000 \(","/);
    expect(readFieldQuantity("1000", "pressure", "bar", "fullScale")).toBe(1e8);
    expect(readFieldQuantity("1 000 bar", "pressure", "bar", "fullScale")).toBe(1e8);
  });
  test("a field labelled [mm] and the transducer field accept the same spellings: 15, 15 mm, 700 bar", () => {
    expectClose(readFieldQuantity("15", "length", "mm") as number, 0.015, { rel: 1e-15 });
    expectClose(readFieldQuantity("15 mm", "length", "mm") as number, 0.015, { rel: 1e-15 });
    expectClose(readFieldQuantity("15mm", "length", "mm") as number, 0.015, { rel: 1e-15 });
    expectClose(readFieldQuantity("1,5 cm", "length", "mm") as number, 0.015, { rel: 1e-15 });
    expect(readFieldQuantity("700 bar", "pressure", "bar")).toBe(7e7);
    expect(readFieldQuantity("   ", "pressure", "bar")).toBeNull();
  });
  test("a unit of another quantity or no number is refused naming the field", () => {
    expect(() => readFieldQuantity("15 bar", "length", "mm", "barrelDiameter")).toThrow(/^barrelDiameter: unknown length unit "bar"/);
    expect(() => readFieldQuantity("fifteen", "length", "mm", "barrelDiameter")).toThrow(/^barrelDiameter: expected a number with a unit, e\.g\. "15 mm", got "fifteen"/);
  });
  test("splitNumberAndUnit keeps '1/s' whole and groups only before three digits", () => {
    expect(splitNumberAndUnit("100 1/s")).toEqual({ number: "100", unit: "1/s" });
    expect(splitNumberAndUnit("1 000 1/s")).toEqual({ number: "1 000", unit: "1/s" });
    expect(splitNumberAndUnit("-1,5e3 Pa")).toEqual({ number: "-1,5e3", unit: "Pa" });
    expect(splitNumberAndUnit("230C")).toEqual({ number: "230", unit: "C" });
    expect(splitNumberAndUnit("mm 15")).toBeNull();
  });
});
