import { parseCsv } from "../src/io/csv";
import { readHeader } from "../src/io/headers";
import { readRawTable } from "../src/io/rawTable";
import { expectClose } from "./helpers/expectClose";

describe("parseCsv(text)", () => {
  test("comma file with BOM, CRLF, comments, quotes and blank lines keeps file line numbers", () => {
    const csv = parseCsv('\uFEFF# note\r\na,b\r\n\r\n"1,5",2\r\n3,"say ""hi"""\r\n');
    expect(csv.delimiter).toBe(",");
    expect(csv.lines).toEqual([
      { line: 2, cells: ["a", "b"] },
      { line: 4, cells: ["1,5", "2"] },
      { line: 5, cells: ["3", 'say "hi"'] },
    ]);
  });
  test("semicolon and tab files are detected (the decimal mark is the number reader's business)", () => {
    expect(parseCsv("a;b\n1,5;2\n")).toMatchObject({ delimiter: ";" });
    expect(parseCsv("a\tb\n1\t2\n").delimiter).toBe("\t");
  });
});

describe("readHeader(cell)", () => {
  test("quantity [unit] and quantity (unit), any case and spacing", () => {
    expect(readHeader("Die diameter [mm]", 0)).toMatchObject({ name: "die_diameter", unit: "mm", problem: null });
    expect(readHeader("pressure (bar)", 1)).toMatchObject({ name: "pressure", unit: "bar", problem: null });
    expect(readHeader("piston-speed [mm/min]", 2)).toMatchObject({ name: "piston_speed", unit: "mm/min" });
  });
  test("problems are described, not thrown", () => {
    expect(readHeader("comment", 0).problem).toMatch(/"comment" is not a known quantity/);
    expect(readHeader("pressure", 0).problem).toMatch(/has no unit/);
    expect(readHeader("pressure [psia]", 0).problem).toMatch(/unknown pressure unit "psia"; accepted: Pa, kPa/);
  });
});

const HEADER = ["die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", "pressure [bar]", "temperature [C]"];

describe("readRawTable(cells)", () => {
  test("converts to SI (NIST SP 811 factors) and derives Q from piston speed", () => {
    const t = readRawTable([HEADER, [1, 20, 15, "60", 100, 200]]);
    const m = t.measurements[0]!;
    expectClose(m.dieDiameter as number, 1e-3, { rel: 1e-15 });
    expectClose(m.dieLength, 20e-3, { rel: 1e-15 });
    expectClose(m.pressure, 1e7, { rel: 1e-15 });
    expectClose(m.temperature as number, 473.15, { rel: 1e-15 });
    expectClose(m.flowRate, (1e-3 * Math.PI * 15e-3 ** 2) / 4, { rel: 1e-14 });
  });
  test("mass rate with a density column", () => {
    const t = readRawTable([["die_diameter [mm]", "die_length [mm]", "mass_rate [g/min]", "density [g/cm3]", "pressure [MPa]"], [1, 20, 6, 0.75, 10]]);
    expectClose(t.measurements[0]!.flowRate, 8e-6 / 60, { rel: 1e-14 });
  });
  test("blank rows are skipped; partly blank rows are skipped with a warning", () => {
    const t = readRawTable([HEADER, [1, 20, 15, 60, 100, 200], [null, "", null, null, null, null], [1, 20, 15, 60, "", 200]]);
    expect(t.measurements).toHaveLength(1);
    expect(t.skippedRows).toEqual([4]);
    expect(t.warnings).toEqual([
      { code: "ROWS_BLANK", message: "row 3 is blank and skipped.", severity: "info" },
      { code: "ROW_SKIPPED_BLANK", message: "row 4 skipped: blank pressure.", severity: "info" },
    ]);
    expect(t.rows).toEqual({ rowsRead: 3, rowsUsed: 1, rowsSkipped: { blank: 1, incomplete: 1 } });
  });
  test("unknown columns are ignored with a warning", () => {
    const t = readRawTable([[...HEADER, "operator"], [1, 20, 15, 60, 100, 200, "J"]]);
    expect(t.warnings.map((w) => w.code)).toEqual(["COLUMN_IGNORED"]);
  });
  test("decimal commas are read wherever they are unambiguous", () => {
    expectClose(readRawTable([HEADER, ["1,5", 20, 15, 60, 100, 200]]).measurements[0]!.dieDiameter as number, 1.5e-3, { rel: 1e-15 });
  });
});

describe("readRawTable errors name the column and the row", () => {
  const err = (cells: unknown[][], opts = {}) => {
    try {
      readRawTable(cells, opts);
    } catch (e) {
      return (e as Error).message;
    }
    return "no error";
  };
  test("text in a numeric cell", () => {
    expect(err([HEADER, [1, 20, 15, 60, "n/a", 200]], { rowWord: "line" })).toBe('pressure [bar] (column 5): line 2 is text "n/a", not a number');
  });
  test("boolean cell", () => expect(err([HEADER, [true, 20, 15, 60, 100, 200]])).toBe("die_diameter [mm] (column 1): row 2 is a TRUE/FALSE value, not a number"));
  test("negative pressure, stated in the user's unit", () => expect(err([HEADER, [1, 20, 15, 60, -3, 200]])).toBe("pressure [bar] (column 5): row 2 must be greater than zero, got -3 bar"));
  test("missing column", () => expect(err([HEADER.slice(1), [20, 15, 60, 100, 200]])).toMatch(/^die_diameter: no "die_diameter \[unit\]" column; found: /));
  test("unknown unit", () => expect(err([["die_diameter [furlong]", ...HEADER.slice(1)], [1, 20, 15, 60, 100, 200]])).toMatch(/^column 1: "die_diameter \[furlong\]": unknown length unit "furlong"; accepted: m, cm, mm, um, in$/));
  test("no flow column", () => expect(err([["die_diameter [mm]", "die_length [mm]", "pressure [bar]"], [1, 20, 100]])).toMatch(/^flow_rate: no flow column/));
  test("piston speed without a bore", () => expect(err([["die_diameter [mm]", "die_length [mm]", "piston_speed [mm/min]", "pressure [bar]"], [1, 20, 5, 100]])).toMatch(/^barrel_diameter: piston_speed needs the barrel bore/));
  test("header only", () => expect(err([HEADER])).toBe("data: no data rows below the header"));
  test("empty first row", () => expect(err([[null, ""]])).toMatch(/^header: the first row must hold the column headers/));
  test("a repeated quantity", () => expect(err([[...HEADER, "pressure [MPa]"], [1, 20, 15, 60, 100, 200, 10]])).toMatch(/repeats the quantity pressure/));
});
