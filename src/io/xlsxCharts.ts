/**
 * Native spreadsheet charts in an xlsx file. exceljs writes cells but no charts, so the charts are
 * added to the file it wrote: one DrawingML chart part per chart (xl/charts/chartN.xml, an XY
 * scatter chart whose axes may be logarithmic), one drawing part anchoring them on a sheet
 * (xl/drawings/drawingN.xml), the relationships between sheet, drawing and charts, and their
 * content types ([Content_Types].xml). Series read their values from cell ranges of the workbook
 * (so a chart follows edits) and carry the same values as a cache, so a reader that does not
 * recalculate still draws them. Parts and elements follow ECMA-376 Part 1 (DrawingML charts §21.2,
 * SpreadsheetML drawing §20.5), in the schema's element order.
 */
import JSZip from "jszip";
import { escapeXml } from "./svgChart";

/** A series: its name, how it is drawn, and where its x and y values are (with the values). */
export interface XlsxChartSeries {
  name: string;
  style: "markers" | "line" | "dashed";
  /** #rrggbb */
  colour: string;
  /** listed in the legend (default true) */
  inLegend?: boolean;
  /** absolute range reference, e.g. 'Flow curve'!$C$3:$C$11, and the values in it (null: empty) */
  x: { ref: string; values: (number | null)[] };
  y: { ref: string; values: (number | null)[] };
}

export interface XlsxChart {
  title: string;
  xTitle: string;
  yTitle: string;
  xLog: boolean;
  yLog: boolean;
  xMin?: number;
  yMin?: number;
  /** alternative text (what the chart shows), for screen readers */
  description: string;
  series: XlsxChartSeries[];
  /** 0-based top-left cell and size in cells */
  anchor: { col: number; row: number; cols: number; rows: number };
}

/** Element text: &, < and > escaped (quotes need no escape outside attributes). */
function xmlText(text: string): string {
  return text.replace(/[&<>]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;" })[c] as string);
}

const NS = {
  c: "http://schemas.openxmlformats.org/drawingml/2006/chart",
  a: "http://schemas.openxmlformats.org/drawingml/2006/main",
  r: "http://schemas.openxmlformats.org/officeDocument/2006/relationships",
  xdr: "http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing",
  rel: "http://schemas.openxmlformats.org/package/2006/relationships",
};
const REL_DRAWING = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/drawing";
const REL_CHART = "http://schemas.openxmlformats.org/officeDocument/2006/relationships/chart";
const CT_DRAWING = "application/vnd.openxmlformats-officedocument.drawing+xml";
const CT_CHART = "application/vnd.openxmlformats-officedocument.drawingml.chart+xml";

/** A range reference to a sheet: 'Name'!$C$3:$C$11 (quotes doubled inside the name). */
export function sheetRange(sheet: string, col: number, firstRow: number, lastRow: number): string {
  const letters = columnName(col);
  return `'${sheet.replace(/'/g, "''")}'!$${letters}$${firstRow + 1}:$${letters}$${lastRow + 1}`;
}

/** Column letters of a 0-based index. */
export function columnName(col: number): string {
  let s = "";
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

function richText(text: string, size: number, bold: boolean): string {
  return `<c:tx><c:rich><a:bodyPr/><a:lstStyle/><a:p><a:pPr><a:defRPr sz="${size}" b="${bold ? 1 : 0}"/></a:pPr><a:r><a:rPr lang="en-GB" sz="${size}" b="${bold ? 1 : 0}"/><a:t>${xmlText(text)}</a:t></a:r></a:p></c:rich></c:tx>`;
}

function numCache(values: (number | null)[]): string {
  const pts = values.map((v, i) => (v === null || !Number.isFinite(v) ? "" : `<c:pt idx="${i}"><c:v>${v}</c:v></c:pt>`)).join("");
  return `<c:numCache><c:formatCode>General</c:formatCode><c:ptCount val="${values.length}"/>${pts}</c:numCache>`;
}

function seriesXml(s: XlsxChartSeries, i: number): string {
  const rgb = s.colour.replace(/^#/, "").toUpperCase();
  const fill = `<a:solidFill><a:srgbClr val="${rgb}"/></a:solidFill>`;
  const line =
    s.style === "markers"
      ? `<c:spPr><a:ln w="19050"><a:noFill/></a:ln></c:spPr><c:marker><c:symbol val="circle"/><c:size val="5"/><c:spPr>${fill}<a:ln w="9525">${fill}</a:ln></c:spPr></c:marker>`
      : `<c:spPr><a:ln w="22225" cap="rnd">${fill}${s.style === "dashed" ? `<a:prstDash val="dash"/>` : ""}<a:round/></a:ln></c:spPr><c:marker><c:symbol val="none"/></c:marker>`;
  return (
    `<c:ser><c:idx val="${i}"/><c:order val="${i}"/><c:tx><c:v>${xmlText(s.name)}</c:v></c:tx>${line}` +
    `<c:xVal><c:numRef><c:f>${xmlText(s.x.ref)}</c:f>${numCache(s.x.values)}</c:numRef></c:xVal>` +
    `<c:yVal><c:numRef><c:f>${xmlText(s.y.ref)}</c:f>${numCache(s.y.values)}</c:numRef></c:yVal>` +
    `<c:smooth val="0"/></c:ser>`
  );
}

/** A round axis minimum at or below `min` (the axis starts at a tick, not at −7.1658…). */
function niceMin(min: number): number {
  if (min >= 0) return 0;
  const step = Math.pow(10, Math.floor(Math.log10(-min)));
  return -Math.ceil(-min / step) * step;
}

function axisXml(id: number, cross: number, position: "b" | "l", title: string, log: boolean, min: number | undefined): string {
  const scaling = `<c:scaling>${log ? `<c:logBase val="10"/>` : ""}<c:orientation val="minMax"/>${min !== undefined && !log ? `<c:min val="${niceMin(min)}"/>` : ""}</c:scaling>`;
  const gridline = `<c:majorGridlines><c:spPr><a:ln w="6350"><a:solidFill><a:srgbClr val="D9D9D9"/></a:solidFill></a:ln></c:spPr></c:majorGridlines>`;
  return (
    `<c:valAx><c:axId val="${id}"/>${scaling}<c:delete val="0"/><c:axPos val="${position}"/>${gridline}` +
    `<c:title>${richText(title, 1000, false)}<c:overlay val="0"/></c:title>` +
    `<c:numFmt formatCode="General" sourceLinked="0"/><c:majorTickMark val="out"/><c:minorTickMark val="none"/><c:tickLblPos val="low"/>` +
    `<c:crossAx val="${cross}"/><c:crosses val="autoZero"/><c:crossBetween val="midCat"/></c:valAx>`
  );
}

/** The chart part (c:chartSpace) of one XY scatter chart. */
export function chartXml(chart: XlsxChart): string {
  return (
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n` +
    `<c:chartSpace xmlns:c="${NS.c}" xmlns:a="${NS.a}" xmlns:r="${NS.r}"><c:roundedCorners val="0"/>` +
    `<c:chart><c:title>${richText(chart.title, 1200, true)}<c:overlay val="0"/></c:title><c:autoTitleDeleted val="0"/>` +
    `<c:plotArea><c:layout/><c:scatterChart><c:scatterStyle val="lineMarker"/><c:varyColors val="0"/>` +
    chart.series.map(seriesXml).join("") +
    `<c:axId val="500100"/><c:axId val="500200"/></c:scatterChart>` +
    axisXml(500100, 500200, "b", chart.xTitle, chart.xLog, chart.xMin) +
    axisXml(500200, 500100, "l", chart.yTitle, chart.yLog, chart.yMin) +
    `</c:plotArea><c:legend><c:legendPos val="r"/>${chart.series.map((s, i) => (s.inLegend === false ? `<c:legendEntry><c:idx val="${i}"/><c:delete val="1"/></c:legendEntry>` : "")).join("")}<c:overlay val="0"/></c:legend><c:plotVisOnly val="1"/><c:dispBlanksAs val="gap"/></c:chart>` +
    `</c:chartSpace>`
  );
}

/** The drawing part anchoring charts rId1…rIdN on a sheet. */
export function drawingXml(charts: readonly XlsxChart[]): string {
  const anchors = charts.map((c, i) => {
    const a = c.anchor;
    return (
      `<xdr:twoCellAnchor editAs="oneCell">` +
      `<xdr:from><xdr:col>${a.col}</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>${a.row}</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:from>` +
      `<xdr:to><xdr:col>${a.col + a.cols}</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>${a.row + a.rows}</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:to>` +
      `<xdr:graphicFrame macro=""><xdr:nvGraphicFramePr><xdr:cNvPr id="${i + 2}" name="Chart ${i + 1}" descr="${escapeXml(c.description)}"/><xdr:cNvGraphicFramePr/></xdr:nvGraphicFramePr>` +
      `<xdr:xfrm><a:off x="0" y="0"/><a:ext cx="0" cy="0"/></xdr:xfrm>` +
      `<a:graphic><a:graphicData uri="${NS.c}"><c:chart xmlns:c="${NS.c}" xmlns:r="${NS.r}" r:id="rId${i + 1}"/></a:graphicData></a:graphic></xdr:graphicFrame>` +
      `<xdr:clientData/></xdr:twoCellAnchor>`
    );
  });
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<xdr:wsDr xmlns:xdr="${NS.xdr}" xmlns:a="${NS.a}">${anchors.join("")}</xdr:wsDr>`;
}

function relationshipsXml(rels: { id: string; type: string; target: string }[]): string {
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="${NS.rel}">${rels.map((r) => `<Relationship Id="${r.id}" Type="${r.type}" Target="${escapeXml(r.target)}"/>`).join("")}</Relationships>`;
}

function attr(tag: string, name: string): string | undefined {
  return new RegExp(`\\s${name}="([^"]*)"`).exec(tag)?.[1];
}

const unescapeXml = (s: string) => s.replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&amp;/g, "&");

/** The worksheet part (e.g. "xl/worksheets/sheet2.xml") of the sheet named `sheet`. */
async function worksheetPart(zip: JSZip, sheet: string): Promise<string> {
  const workbook = await text(zip, "xl/workbook.xml");
  const tag = [...workbook.matchAll(/<sheet\b[^>]*\/?>/g)].map((m) => m[0]).find((t) => unescapeXml(attr(t, "name") ?? "") === sheet);
  const rid = tag ? attr(tag, "r:id") : undefined;
  if (!rid) throw new Error(`xlsx charts: no sheet named "${sheet}"`);
  const rels = await text(zip, "xl/_rels/workbook.xml.rels");
  const rel = [...rels.matchAll(/<Relationship\b[^>]*\/?>/g)].map((m) => m[0]).find((t) => attr(t, "Id") === rid);
  const target = rel ? attr(rel, "Target") : undefined;
  if (!target) throw new Error(`xlsx charts: sheet "${sheet}" has no part`);
  return target.startsWith("/") ? target.slice(1) : `xl/${target}`;
}

async function text(zip: JSZip, name: string): Promise<string> {
  const f = zip.file(name);
  if (!f) throw new Error(`xlsx charts: the file has no ${name}`);
  return f.async("string");
}

function nextFree(zip: JSZip, pattern: (n: number) => string): number {
  let n = 1;
  while (zip.file(pattern(n))) n++;
  return n;
}

/** Elements that follow <drawing> in a worksheet (ECMA-376 CT_Worksheet order). */
const AFTER_DRAWING = ["legacyDrawing", "legacyDrawingHF", "drawingHF", "picture", "oleObjects", "controls", "webPublishItems", "tableParts", "extLst"];

/**
 * Adds `charts` to the sheet named `sheet` of the xlsx `bytes`; returns the new file.
 * @throws Error when the sheet is missing or already has a drawing (exceljs images).
 */
export async function addChartsToXlsx(bytes: Uint8Array, sheet: string, charts: readonly XlsxChart[]): Promise<Uint8Array> {
  if (charts.length === 0) return bytes;
  const zip = await JSZip.loadAsync(bytes);
  const sheetPart = await worksheetPart(zip, sheet);
  let sheetXml = await text(zip, sheetPart);
  if (/<drawing\b/.test(sheetXml)) throw new Error(`xlsx charts: sheet "${sheet}" already has a drawing`);
  const drawingNo = nextFree(zip, (n) => `xl/drawings/drawing${n}.xml`);
  const firstChart = nextFree(zip, (n) => `xl/charts/chart${n}.xml`);
  const drawingPart = `xl/drawings/drawing${drawingNo}.xml`;

  charts.forEach((c, i) => zip.file(`xl/charts/chart${firstChart + i}.xml`, chartXml(c)));
  zip.file(drawingPart, drawingXml(charts));
  zip.file(`xl/drawings/_rels/drawing${drawingNo}.xml.rels`, relationshipsXml(charts.map((_, i) => ({ id: `rId${i + 1}`, type: REL_CHART, target: `../charts/chart${firstChart + i}.xml` }))));

  // the sheet's relationships: keep exceljs's, add the drawing under a fresh id
  const sheetDir = sheetPart.slice(0, sheetPart.lastIndexOf("/"));
  const sheetFile = sheetPart.slice(sheetPart.lastIndexOf("/") + 1);
  const relsPath = `${sheetDir}/_rels/${sheetFile}.rels`;
  const existing = zip.file(relsPath) ? await text(zip, relsPath) : null;
  const rels = existing ? [...existing.matchAll(/<Relationship\b[^>]*\/?>/g)].map((m) => ({ id: attr(m[0], "Id") ?? "", type: unescapeXml(attr(m[0], "Type") ?? ""), target: unescapeXml(attr(m[0], "Target") ?? ""), mode: attr(m[0], "TargetMode") })) : [];
  let k = rels.length + 1;
  while (rels.some((r) => r.id === `rId${k}`)) k++;
  const drawingRel = `rId${k}`;
  const relsXml = existing
    ? existing.replace("</Relationships>", `<Relationship Id="${drawingRel}" Type="${REL_DRAWING}" Target="../drawings/drawing${drawingNo}.xml"/></Relationships>`)
    : relationshipsXml([{ id: drawingRel, type: REL_DRAWING, target: `../drawings/drawing${drawingNo}.xml` }]);
  zip.file(relsPath, relsXml);

  // <drawing r:id> in its place in the worksheet
  if (!/xmlns:r="/.test(sheetXml.slice(0, sheetXml.indexOf(">", sheetXml.indexOf("<worksheet"))))) {
    sheetXml = sheetXml.replace(/<worksheet\b/, `<worksheet xmlns:r="${NS.r}"`);
  }
  const drawingTag = `<drawing r:id="${drawingRel}"/>`;
  const after = AFTER_DRAWING.map((name) => sheetXml.search(new RegExp(`<${name}\\b`))).filter((i) => i >= 0);
  const at = after.length > 0 ? Math.min(...after) : sheetXml.lastIndexOf("</worksheet>");
  sheetXml = sheetXml.slice(0, at) + drawingTag + sheetXml.slice(at);
  zip.file(sheetPart, sheetXml);

  let types = await text(zip, "[Content_Types].xml");
  const overrides = [`<Override PartName="/${drawingPart}" ContentType="${CT_DRAWING}"/>`, ...charts.map((_, i) => `<Override PartName="/xl/charts/chart${firstChart + i}.xml" ContentType="${CT_CHART}"/>`)];
  types = types.replace("</Types>", `${overrides.join("")}</Types>`);
  zip.file("[Content_Types].xml", types);

  return zip.generateAsync({ type: "uint8array", compression: "DEFLATE", compressionOptions: { level: 6 } });
}
