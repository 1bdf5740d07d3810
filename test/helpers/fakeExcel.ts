/**
 * A small stand-in for the Excel object model built from office-addin-mock objects: sheets,
 * ranges, charts, series and notes record what the pane's writer does to them; `load` then
 * `sync` behave as in Office.js (reading an unloaded property gives the mock's error text).
 * Operations take effect when called; failures can be injected at a given chart or sync.
 */
import { OfficeMockObject } from "office-addin-mock";

/* eslint-disable @typescript-eslint/no-explicit-any, @typescript-eslint/no-this-alias -- mocks built from closures over the fake */
type Mock = any;

export interface FakeRange {
  sheet: string;
  address: string;
  mock: Mock;
}

export interface FakeSeries {
  name: string;
  x: string | null;
  y: string | null;
  mock: Mock;
}

export interface FakeChart {
  type: string;
  source: string;
  series: FakeSeries[];
  mock: Mock;
}

export interface FakeSheet {
  /** the name given at creation (the mock's own `name` needs load + sync, or is reassigned by the code under test) */
  initialName: string;
  mock: Mock;
  ranges: FakeRange[];
  charts: FakeChart[];
  notes: { address: string; text: string }[];
  /** conditional formats added to ranges of this sheet: the range address, the type, and the format as set */
  conditionalFormats: { address: string; type: string; format: { textComparison: { format: { fill: { color: string }; font: { color: string; bold: boolean } }; rule: { operator: string; text: string } | null } } }[];
  deleted: boolean;
  /** cells preset by the test (existing data), address → value */
  preset: Map<string, unknown>;
}

export interface FakeOptions {
  /** throw from charts.add on this (1-based) call */
  failAtChart?: number;
  /** reject this (1-based) context.sync */
  failAtSync?: number;
}

export class FakeExcel {
  readonly sheets: FakeSheet[] = [];
  readonly comments: { address: string; text: string }[] = [];
  private readonly mocks: Mock[] = [];
  private chartCount = 0;
  private syncCount = 0;
  batches = 0;

  constructor(readonly options: FakeOptions = {}) {}

  private track<T>(m: T): T {
    this.mocks.push(m);
    return m;
  }

  /** A sheet's current name: reassigned by the code, else the name it was created with. */
  static nameOf(s: FakeSheet): string {
    const n = s.mock?.name;
    return typeof n === "string" && !n.startsWith("Error,") ? n : s.initialName;
  }

  /** Live (not deleted) sheet names. */
  names(): string[] {
    return this.sheets.filter((s) => !s.deleted).map(FakeExcel.nameOf);
  }

  sheet(name: string): FakeSheet {
    const s = this.sheets.find((x) => !x.deleted && FakeExcel.nameOf(x) === name);
    if (!s) throw new Error(`fake: no sheet "${name}"`);
    return s;
  }

  /** Adds a sheet as if the user had it already, with optional used-range content. */
  addSheet(name: string, used?: { formulas: unknown[][]; values: unknown[][]; rowIndex: number; columnIndex: number }): FakeSheet {
    if (this.names().some((n) => n.toLowerCase() === name.toLowerCase())) throw new Error(`fake: A sheet named "${name}" already exists`);
    const fake: FakeSheet = { initialName: name, mock: null, ranges: [], charts: [], notes: [], conditionalFormats: [], deleted: false, preset: new Map() };
    const self = this;
    const mock: Mock = this.track(
      new OfficeMockObject({
        name,
        getRange(address: string) {
          const r: Mock = self.track(
            new OfficeMockObject({
              address,
              select: () => undefined,
              format: { font: { bold: false, color: "", size: 11 }, fill: { color: "" }, columnWidth: 0, wrapText: false },
              conditionalFormats: {
                add: (type: string) => {
                  const format = { textComparison: { format: { fill: { color: "" }, font: { color: "", bold: false } }, rule: null } };
                  fake.conditionalFormats.push({ address, type, format });
                  return format;
                },
              },
            }),
          );
          r.fakeAddress = address; // for the fake's own records; the code under test must load `address`
          fake.ranges.push({ sheet: FakeExcel.nameOf(fake), address, mock: r });
          return r;
        },
        getUsedRangeOrNullObject() {
          const u: Mock = self.track(
            new OfficeMockObject({
              formulas: used?.formulas ?? [],
              values: used?.values ?? [],
              rowIndex: used?.rowIndex ?? 0,
              columnIndex: used?.columnIndex ?? 0,
              rowCount: used?.formulas.length ?? 0,
              columnCount: used?.formulas[0]?.length ?? 0,
            }),
          );
          u.isNullObject = used === undefined;
          return u;
        },
        charts: {
          add(type: string, source: Mock, seriesBy: string) {
            self.chartCount++;
            if (self.options.failAtChart === self.chartCount) throw new Error("fake: chart could not be created");
            const chart: FakeChart = { type, source: source.fakeAddress, series: [], mock: null };
            const newSeries = (name: string): Mock => {
              const s: FakeSeries = { name, x: null, y: null, mock: null };
              s.mock = self.track(
                new OfficeMockObject({
                  name,
                  chartType: type,
                  markerStyle: "Automatic",
                  markerSize: 7,
                  markerBackgroundColor: "",
                  markerForegroundColor: "",
                  format: { line: { color: "", lineStyle: "Automatic" } },
                  setXAxisValues: (r: Mock) => (s.x = r.fakeAddress),
                  setValues: (r: Mock) => (s.y = r.fakeAddress),
                }),
              );
              chart.series.push(s);
              return s.mock;
            };
            newSeries("Series1");
            const axis = () => ({ title: { text: "" }, logBase: 0, minimum: 0 });
            chart.mock = self.track(
              new OfficeMockObject({
                name: "",
                seriesBy,
                title: { text: "", format: { font: { size: 0 } } },
                legend: { position: "Right", visible: true },
                axes: { categoryAxis: axis(), valueAxis: axis() },
                series: { getItemAt: (i: number) => chart.series[i]?.mock, add: (n: string) => newSeries(n) },
                setPosition: () => undefined,
              }),
            );
            fake.charts.push(chart);
            return chart.mock;
          },
        },
        notes: { add: (address: string, text: string) => fake.notes.push({ address, text }) },
        activate: () => undefined,
        delete: () => (fake.deleted = true),
        copy: () => self.addSheet(`${FakeExcel.nameOf(fake)} (2)`, used).mock,
      }),
    );
    fake.mock = mock;
    this.sheets.push(fake);
    return fake;
  }

  /** The request context handed to a batch. */
  context(): Mock {
    const self = this;
    const worksheets = {
      // load("items/name") loads each sheet's name, as Office.js does
      load: (what: string) => {
        for (const s of self.sheets) if (!s.deleted && what === "items/name") s.mock.load("name");
      },
      get items() {
        return self.sheets.filter((s) => !s.deleted).map((s) => s.mock);
      },
      add: (name: string) => self.addSheet(name).mock,
      getItem: (name: string) => self.sheet(name).mock,
      getItemOrNullObject: (name: string) => {
        const found = self.sheets.find((x) => !x.deleted && FakeExcel.nameOf(x) === name);
        const m: Mock = self.track(new OfficeMockObject({ name, delete: () => found && (found.deleted = true) }));
        m.isNullObject = !found;
        return m;
      },
    };
    return {
      workbook: { worksheets, comments: { add: (address: string, text: string) => self.comments.push({ address, text }) } },
      sync: async () => {
        self.syncCount++;
        if (self.options.failAtSync === self.syncCount) throw new Error("fake: sync failed");
        for (const m of self.mocks) await m.sync();
      },
    };
  }

  /** An ExcelBatch over this fake, as `Excel.run` would be. */
  batch = <T>(fn: (context: Excel.RequestContext) => Promise<T>): Promise<T> => {
    this.batches++;
    return fn(this.context() as Excel.RequestContext);
  };

  /**
   * Number formats set on a sheet's cells: address (A1) → format (a later range wins, as in
   * Excel). The writer sets a range's formats before its values, so a cell's format here is the
   * one in force when its value arrived.
   */
  formats(sheetName: string): Map<string, unknown> {
    return this.written(sheetName, "numberFormat");
  }

  /** Cells written to a sheet: address (A1) → value (or formula, or number format), from every range where it was set. */
  written(sheetName: string, property: "values" | "formulas" | "numberFormat" = "values"): Map<string, unknown> {
    const out = new Map<string, unknown>();
    for (const r of this.sheet(sheetName).ranges) {
      const grid = r.mock[property];
      if (!Array.isArray(grid)) continue;
      const [start] = r.address.split(":");
      const m = /^([A-Z]+)(\d+)$/.exec(start as string);
      if (!m) continue;
      const col0 = (m[1] as string).split("").reduce((s, ch) => s * 26 + ch.charCodeAt(0) - 64, 0) - 1;
      const row0 = Number(m[2]) - 1;
      grid.forEach((row: unknown[], i: number) => row.forEach((v, j) => out.set(cellName(row0 + i, col0 + j), v)));
    }
    return out;
  }
}

/** A1 name of a 0-based cell. */
export function cellName(row: number, col: number): string {
  let n = col + 1;
  let s = "";
  while (n > 0) {
    s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
    n = Math.floor((n - 1) / 26);
  }
  return `${s}${row + 1}`;
}
