/**
 * RawTableReader.addLine reads plain-decimal lines straight from their text (no cell strings); it
 * must give exactly what the general path (the line split into cells, RawTableReader.add) gives:
 * the same measurements bit for bit, the same row account, warnings and error messages. The
 * values' reference is JavaScript's own Number() of the cell text (correctly rounded decimal
 * input, ECMA-262 §7.1.4.1.1), which the general path uses.
 */
import { bytesSource, readRawFile, type RawCsv } from "../src/io/rawInput";
import { RawTableReader } from "../src/io/rawTable";
import { seededRandom } from "../src/core/random";

const HEADER = "die_diameter [mm],die_length [mm],note,piston_speed [mm/min],barrel_diameter [mm],pressure [bar],temperature [C]";

/** Reads `text` as the command line does; the table or the error message. */
function read(text: string) {
  try {
    const r = readRawFile(bytesSource(new TextEncoder().encode(text)), "t.csv", {});
    return r.kind === "csv" ? r.table : "not a CSV";
  } catch (e) {
    return (e as Error).message;
  }
}

/**
 * The same text read twice: as it is (unquoted lines take the line path) and with the third cell
 * of every data line quoted (a line with a quote goes through the CSV parser's cells and
 * RawTableReader.add, the general path; the third column is not read).
 */
function bothWays(text: string, delimiter = ",") {
  const quoted = text
    .split("\n")
    .map((line, i) => {
      if (i === 0 || line.includes('"') || line.startsWith("#")) return line;
      const cells = line.split(delimiter);
      if (cells.length < 3) return line;
      cells[2] = `"${cells[2]}"`;
      return cells.join(delimiter);
    })
    .join("\n");
  return { streamed: read(text), general: read(quoted) };
}

function expectSame(text: string, delimiter = ",") {
  const { streamed, general } = bothWays(text, delimiter);
  expect(typeof streamed).toBe(typeof general);
  if (typeof general === "string" || typeof streamed === "string") {
    expect(streamed).toEqual(general);
    return;
  }
  const s = streamed as RawCsv;
  const g0 = general as RawCsv;
  expect(s.measurements.length).toBe(g0.measurements.length);
  s.measurements.forEach((m, i) => {
    const g = g0.measurements[i]!;
    expect(Object.keys(m)).toEqual(Object.keys(g));
    for (const k of Object.keys(g) as (keyof typeof g)[]) expect(Object.is(m[k], g[k])).toBe(true);
  });
  expect(s.rows).toEqual(g0.rows);
  expect(s.skippedRows).toEqual(g0.skippedRows);
  expect(s.warnings).toEqual(g0.warnings);
  expect(s.decimalMark).toBe(g0.decimalMark);
}

/** A random plain decimal of `digits` digits with the mark somewhere (or none). */
function plainDecimal(random: () => number, mark: string): string {
  const digits = 1 + Math.floor(random() * 14);
  let text = "";
  for (let i = 0; i < digits; i++) text += String(Math.floor(random() * 10));
  const at = Math.floor(random() * (digits + 2)) - 1; // -1: no mark; 0: ".5"; digits: "12."
  if (at >= 0) text = text.slice(0, at) + mark + text.slice(at);
  return text;
}

describe("RawTableReader.addLine: the line path equals the general path", () => {
  test("2,000 random plain decimals up to 15 characters, point and comma tables, bit for bit", () => {
    const random = seededRandom(2026);
    for (const [delimiter, mark] of [[",", "."], [";", ","]] as const) {
      const rows = [HEADER.split(",").join(delimiter)];
      // the first row decides the decimal mark; the rest go through the line path
      rows.push(["1", "10", "x", `0${mark}5`, "15", `10${mark}25`, "190"].join(delimiter));
      for (let i = 0; i < 1000; i++) {
        const pressure = plainDecimal(random, mark);
        const speed = plainDecimal(random, mark);
        rows.push(["1", String(5 + (i % 4) * 5), "note", Number(speed.replace(",", ".")) > 0 ? speed : "1", "15", Number(pressure.replace(",", ".")) > 0 ? pressure : "2", "-0"].join(delimiter));
      }
      expectSame(rows.join("\n") + "\n", delimiter);
    }
  });

  test("lines the line path declines read the general way: spaces, exponents, signs, grouping, 16 characters, quotes", () => {
    const lines = [
      HEADER,
      "1,10,,0.5,15,100,190",
      " 1,10,,0.5,15,100,190",
      "1,10,,5e-1,15,1.0E2,190",
      "1,10,,+0.5,15,100,190",
      "1,10,,0.5,15,\"1,000.5\",190",
      "1,10,,0.5,15,123456789012.345,190",
      "1,10,,0.5,15,1234567890123456,190",
      "1,10,,0.5,15,100,",
      "1,10,free text,0.5,15,100",
      "1,10,,0.5,15",
    ];
    expectSame(lines.join("\n") + "\n");
  });

  test("blank and partly blank lines, comments and CRLF are counted the same way", () => {
    expectSame([HEADER, "1,10,,0.5,15,100,190", ",,,,,,", "# paused", "", "1,,,0.5,15,100,190", "1,20,,1,15,150,190"].join("\r\n") + "\r\n");
  });

  test("bad cells give the same message naming the column and line", () => {
    const { streamed, general } = bothWays([HEADER, "1,10,,0.5,15,100,190", "1,10,,0.5,15,n/a,190"].join("\n"));
    expect(typeof streamed).toBe("string");
    expect(streamed).toEqual(general);
    expect(streamed).toMatch(/pressure \[bar\] \(column 6\).*line 3/);
    const negative = bothWays([HEADER, "1,10,,0.5,15,100,190", "1,10,,0.5,15,-3,190"].join("\n"));
    expect(negative.streamed).toEqual(negative.general);
    expect(negative.streamed).toMatch(/line 3 must be greater than zero/);
  });

  test("a line read before the decimal mark is known goes the general way", () => {
    const reader = new RawTableReader(HEADER.split(","), { rowWord: "line", headerNumber: 1, barrelDiameter: 0.015 });
    reader.addLine("1,10,,1,15,100,190", ",", 2); // no mark shown yet: the general path
    reader.addLine("1,20,,1.5,15,150.5,190", ",", 3);
    const table = reader.finish();
    expect(table.decimalMark).toBe(".");
    expect(table.measurements.map((m) => m.pressure)).toEqual([100e5, 150.5e5]);
  });
});
