/**
 * The small text rules every writer shares: significant figures (src/io/numberFormat.ts; the rule
 * itself is common practice, no source: 4 figures by default, whole numbers whole, scientific
 * notation outside 10⁻³…10⁶; rounding half away from zero as spreadsheets display), text that
 * stays text in cells and CSV fields (src/io/cellText.ts; the apostrophe defence is OWASP's
 * "CSV Injection" advice), the report items of --meta (src/io/reportItems.ts), and the charts
 * read from table descriptions (src/io/resultCharts.ts).
 */
import { csvField, csvText, looksLikeFormula, xmlSafeText } from "../src/io/cellText";
import { excelNumberFormat, fixedDecimals, formatSignificant } from "../src/io/numberFormat";
import { REPORT_ITEMS, readReportMeta, reportItems } from "../src/io/reportItems";
import { LEGEND_LIMIT, resultCharts } from "../src/io/resultCharts";
import type { ResultTable } from "../src/io/resultTables";
import { RheoError } from "../src/core/errors";

describe("excelNumberFormat(value, digits) and formatSignificant(value, digits)", () => {
  it.each([
    // value, digits, Excel format, shown
    [24.131330976438928, 4, "0.00", "24.13"],
    [1337.9908481436228, 4, "0", "1338"],
    [0.42327719924935686, 3, "0.000", "0.423"],
    [9.99961, 4, "0.00", "10.00"], // rounds up into the next decade: one decimal fewer
    [999.96, 4, "0", "1000"],
    [0.0001234, 4, "0.000E+00", "1.234E-04"],
    [0.00099996, 4, "0.000E+00", "1.000E-03"],
    [1.5e7, 4, "0.000E+00", "1.500E+07"],
    [-3.14159, 4, "0.000", "-3.142"],
    [190, 4, "0", "190"], // whole numbers are shown whole
    [0, 4, "0", "0"],
    [0.0015, 2, "0.0000", "0.0015"],
    [61.025, 4, "0.00", "61.03"], // half away from zero on the decimal digits (binary toFixed gives 61.02)
    [2.675, 3, "0.00", "2.68"],
    [-0.0123456, 3, "0.0000", "-0.0123"],
    [0.95, 1, "0", "1"],
  ])("%p to %p figures: format %p, shown %p", (value, digits, format, shown) => {
    expect(excelNumberFormat(value, digits)).toBe(format);
    expect(formatSignificant(value, digits)).toBe(shown);
  });

  it("the format's decimals and the shown text agree for 2000 random values over 20 decades", () => {
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    for (let i = 0; i < 2000; i++) {
      const v = (random() < 0.5 ? -1 : 1) * Math.pow(10, random() * 20 - 10);
      const digits = 1 + Math.floor(random() * 6);
      const format = excelNumberFormat(v, digits);
      const shown = formatSignificant(v, digits);
      if (format.includes("E")) {
        expect(shown).toMatch(new RegExp(`^-?\\d${digits > 1 ? `\\.\\d{${digits - 1}}` : ""}E[+-]\\d\\d$`));
      } else {
        expect(shown.split(".")[1]?.length ?? 0).toBe(fixedDecimals(v, digits));
        // the shown text is the value to within half a unit of its last place
        expect(Math.abs(Number(shown) - v)).toBeLessThanOrEqual(0.5 * Math.pow(10, -fixedDecimals(v, digits)) * (1 + 1e-9));
      }
    }
  });

  it("NaN and infinities have no format and no text (writers leave such cells empty)", () => {
    expect(excelNumberFormat(NaN)).toBe("General");
    expect(formatSignificant(Infinity)).toBe("");
  });
});

describe("text that stays text", () => {
  it("looksLikeFormula: = + - @ tab and CR at the start", () => {
    for (const t of ["=1+1", "+1", "-L20", "@P50", "\tx", "\rx"]) expect(looksLikeFormula(t)).toBe(true);
    for (const t of ["L20", " =1", "a=b", ""]) expect(looksLikeFormula(t)).toBe(false);
  });

  it("csvField: formula-like text gets an apostrophe and is quoted when needed; numbers stay numbers", () => {
    expect(csvField('=HYPERLINK("http://x","y")')).toBe(`"'=HYPERLINK(""http://x"",""y"")"`);
    expect(csvField("-L20")).toBe("'-L20");
    expect(csvField("@P50")).toBe("'@P50");
    expect(csvField("\tTAB")).toBe("'\tTAB");
    expect(csvField(-5)).toBe("-5");
    expect(csvField(NaN)).toBe("");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvText(["die", "pressure [bar]"], [["=cmd", 12.5], ["L20", null]])).toBe("die,pressure [bar]\n'=cmd,12.5\nL20,\n");
  });

  it("xmlSafeText removes what XML 1.0 cannot hold and makes CR a line feed", () => {
    expect(xmlSafeText("a\u0000b\u0007c\u001Fd\uFFFEe")).toBe("abcde");
    expect(xmlSafeText("tab\tnew\nline\r\nCR\rend")).toBe("tab\tnew\nline\nCR\nend");
    expect(xmlSafeText("lone \uD800 surrogate, pair \uD83D\uDE00 kept")).toBe("lone  surrogate, pair \uD83D\uDE00 kept");
  });
});

describe("readReportMeta(json, argument) and reportItems(facts, meta)", () => {
  it("accepts the report item keys with text or numbers; refuses anything else naming the key", () => {
    expect(readReportMeta({ material: "grade X", preheatTime: 6, remarks: "  " }, "--meta m.json")).toEqual({ material: "grade X", preheatTime: "6" });
    const error = (raw: unknown) => {
      try {
        readReportMeta(raw, "--meta m.json");
      } catch (e) {
        return (e as RheoError).message;
      }
      return "accepted";
    };
    expect(error({ colour: "red" })).toBe(`--meta m.json: unknown key "colour"; accepted: ${REPORT_ITEMS.map((i) => i.id).join(", ")}`);
    expect(error({ material: { a: 1 } })).toBe('--meta m.json: "material" must be text or a number, got object');
    expect(error({ material: null })).toBe('--meta m.json: "material" must be text or a number, got null');
    expect(error([1])).toContain("expected a JSON object of report items");
    expect(error({ remarks: "x".repeat(2001) })).toBe('--meta m.json: "remarks" is 2001 characters long; at most 2000 are accepted');
  });

  it("fills items from the data, then from the metadata, and leaves the rest for the user; both kept when both speak", () => {
    const rows = reportItems({ testTemperatures: { value: "190, 210 °C", source: "data" } }, { testTemperatures: "190 and 210 °C", material: "grade X" });
    const by = Object.fromEntries(rows.map((r) => [r.id, r]));
    expect(rows.map((r) => r.id)).toEqual(REPORT_ITEMS.map((i) => i.id));
    expect(by.testTemperatures).toMatchObject({ value: "190, 210 °C (metadata: 190 and 210 °C)", source: "data" });
    expect(by.material).toMatchObject({ value: "grade X", source: "metadata" });
    expect(by.dieEntryAngle).toMatchObject({ value: null, source: "to be filled in" });
  });
});

describe("resultCharts(tables)", () => {
  const points = (id: string, scope: string, rows: (number | string | null)[][], chart: ResultTable["chart"]): ResultTable => ({
    id,
    title: id,
    scope,
    columns: [{ key: "rate", header: "Rate", unit: "1/s", kind: "number" }, { key: "eta", header: "Viscosity", unit: "Pa·s", kind: "number" }, { key: "etaModel", header: "Model", unit: "Pa·s", kind: "number" }],
    rows,
    chart,
  });

  it("one chart per kind over the groups, markers for points and a line in the same colour for a model column", () => {
    const chart = { kind: "viscosity" as const, x: "rate", y: ["eta", "etaModel"], logX: true, logY: true };
    const charts = resultCharts([points("v", "190 °C", [[1, 100, 99], [10, 50, 51]], chart), points("v", "210 °C", [[1, 80, 81], [10, 40, null]], chart)]);
    expect(charts).toHaveLength(1);
    const c = charts[0] as NonNullable<(typeof charts)[0]>;
    expect(c).toMatchObject({ title: "Viscosity", xTitle: "Rate [1/s]", yTitle: "Viscosity [Pa·s]", xLog: true, yLog: true });
    expect(c.series.map((s) => [s.name, s.style, s.points.length])).toEqual([["190 °C, Viscosity", "markers", 2], ["190 °C, Model", "line", 2], ["210 °C, Viscosity", "markers", 2], ["210 °C, Model", "line", 1]]);
    expect(c.series[0]?.colour).toBe(c.series[1]?.colour);
    expect(c.series[0]?.colour).not.toBe(c.series[2]?.colour);
  });

  it("a log axis with a value at or below zero is drawn linear and says so; a Bagley plot is one chart per group split by seriesBy", () => {
    const flow = resultCharts([points("f", "g", [[1, 0, 1], [10, 5, 1]], { kind: "flowCurve", x: "rate", y: ["eta"], logX: true, logY: true })])[0];
    expect(flow).toMatchObject({ xLog: true, yLog: false, note: "y axis linear: some values are zero or negative" });
    const rows = Array.from({ length: 12 }, (_, i) => [i % 6, i, i + 1]);
    const bagley = resultCharts([points("b", "190 °C", rows, { kind: "bagley", x: "eta", y: ["rate", "etaModel"], seriesBy: "rate" }), points("b", "210 °C", rows, { kind: "bagley", x: "eta", y: ["rate"], seriesBy: "rate" })]);
    expect(bagley.map((c) => c.title)).toEqual(["Bagley plot, 190 °C", "Bagley plot, 210 °C"]);
    const first = bagley[0] as NonNullable<(typeof bagley)[0]>;
    expect(first.series).toHaveLength(12);
    expect(first.series.length).toBeGreaterThan(LEGEND_LIMIT);
    expect(first.series.filter((s) => s.inLegend).map((s) => s.style)).toEqual(Array(6).fill("markers"));
  });
});
