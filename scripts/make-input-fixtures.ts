/**
 * Writes the input-reading fixtures under test/fixtures/input/: one invented capillary run
 * written the ways labs and Excel write raw files. Every file holds the same measurements, so the
 * tests check that each reads exactly like the plain one.
 *
 *   plain.csv                   comma-separated, decimal point, UTF-8: the reference
 *   semicolon-thousands.csv     semicolon, decimal comma, dot grouping thousands ("1.160" = 1160),
 *                               as Excel writes a CSV on a German or Italian Windows
 *   windows-1252.csv            the same in the Windows code page ("°C" as byte 0xB0), CRLF
 *   unicode-text.txt            Excel's "Unicode text": UTF-16 LE with byte-order mark, tab-separated
 *   comma-grouped.csv           comma-separated, decimal point, comma grouping in quoted cells ("1,160")
 *   bom-comments.csv            UTF-8 with byte-order mark, a preamble comment, a blank line,
 *                               an all-blank row and a comment line among the data
 *   run.xlsx                    sheet "Raw" (numbers, a formula with its saved result, a number stored
 *                               as text with a decimal comma) and sheet "230 C only"
 *   jittered.csv                measured melt temperatures jittering around 190 and 210 °C
 *   ambiguous.csv               semicolon file whose only marked numbers read two ways ("1.160")
 *
 * Run: node scripts/run-ts.mjs scripts/make-input-fixtures.ts
 * The run is invented (no real material or instrument): a power-law melt, K = 8000 Pa·s^n,
 * n = 0.4, Bagley entrance loss e = 3 radii, dies of 1 mm bore and 10/20/30 mm length, 15 mm
 * barrel; pressures rounded to whole kPa so that every format carries exactly the same digits.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import ExcelJS from "exceljs";

const OUT = path.join("test", "fixtures", "input");

/** The invented run (see the module comment). */
export const INPUT_RUN = Object.freeze({
  consistency: 8000,
  flowIndex: 0.4,
  entranceRadii: 3,
  dieDiameterMm: 1,
  dieLengthsMm: [10, 20, 30],
  barrelMm: 15,
  speedsMmMin: [0.5, 1, 2.5, 5, 12.5, 25, 50],
  temperaturesC: [190, 230],
});

/** One data row: temperature °C, die D mm, L mm, barrel mm, speed mm/min, pressure kPa (whole). */
type Row = [number, number, number, number, number, number];

export function inputRows(temperature: (setPoint: number, die: number, step: number) => number = (t) => t): Row[] {
  const r = INPUT_RUN;
  const rows: Row[] = [];
  for (const setPoint of r.temperaturesC) {
    // a simple temperature shift: 2 % lower consistency per kelvin (invented)
    const k = r.consistency * Math.exp(-0.02 * (setPoint - 190));
    r.dieLengthsMm.forEach((L, die) => {
      r.speedsMmMin.forEach((v, step) => {
        const q = (v / 60) * ((Math.PI * r.barrelMm ** 2) / 4); // mm³/s
        const rateApp = (32 * q) / (Math.PI * r.dieDiameterMm ** 3);
        const rateWall = rateApp * ((3 * r.flowIndex + 1) / (4 * r.flowIndex));
        const tau = k * rateWall ** r.flowIndex; // Pa
        const pressure = 2 * tau * ((2 * L) / r.dieDiameterMm + r.entranceRadii); // Pa
        rows.push([temperature(setPoint, die, step), r.dieDiameterMm, L, r.barrelMm, v, Math.round(pressure / 1000)]);
      });
    });
  }
  return rows;
}

const HEADER = ["temperature [°C]", "die_diameter [mm]", "die_length [mm]", "barrel_diameter [mm]", "piston_speed [mm/min]", "pressure [kPa]"];

/** A number with a decimal comma and dot thousands, as a German Excel shows it ("1.160", "0,5"). */
function german(x: number): string {
  const [int, frac] = String(x).split(".");
  const grouped = (int as string).replace(/\B(?=(\d{3})+(?!\d))/g, ".");
  return frac === undefined ? grouped : `${grouped},${frac}`;
}

/** A number with comma thousands, quoted when it holds a comma ("1,160"). */
function english(x: number): string {
  const [int, frac] = String(x).split(".");
  const grouped = (int as string).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const text = frac === undefined ? grouped : `${grouped}.${frac}`;
  return text.includes(",") ? `"${text}"` : text;
}

function windows1252(text: string): Buffer {
  const bytes: number[] = [];
  for (const ch of text) {
    const c = ch.codePointAt(0) as number;
    if (c < 0x80 || (c >= 0xa0 && c <= 0xff)) bytes.push(c);
    else throw new Error(`no Windows-1252 byte for U+${c.toString(16)}`);
  }
  return Buffer.from(bytes);
}

function utf16le(text: string): Buffer {
  return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, "utf16le")]);
}

async function main() {
  mkdirSync(OUT, { recursive: true });
  const rows = inputRows();
  const note = "# Invented run for the input-reading tests (scripts/make-input-fixtures.ts)";
  const write = (name: string, data: string | Buffer) => writeFileSync(path.join(OUT, name), data);

  write("plain.csv", [note, HEADER.join(","), ...rows.map((r) => r.join(","))].join("\n") + "\n");
  write("semicolon-thousands.csv", [HEADER.join(";"), ...rows.map((r) => r.map(german).join(";"))].join("\n") + "\n");
  write("windows-1252.csv", windows1252([HEADER.join(";"), ...rows.map((r) => r.map(german).join(";"))].join("\r\n") + "\r\n"));
  write("unicode-text.txt", utf16le([HEADER.join("\t"), ...rows.map((r) => r.join("\t"))].join("\r\n") + "\r\n"));
  write("comma-grouped.csv", [HEADER.join(","), ...rows.map((r) => r.map(english).join(","))].join("\n") + "\n");
  const withGaps = rows.map((r) => r.join(","));
  withGaps.splice(5, 0, "");
  withGaps.splice(9, 0, ",,,,,");
  withGaps.splice(14, 0, "# die changed here");
  write("bom-comments.csv", "\uFEFF" + [note, "# operator: invented", HEADER.join(","), ...withGaps].join("\n") + "\n");

  // measured melt temperatures jittering ±0.4 K around the set-points, drifting nowhere
  const jitter = [0.3, -0.2, 0.1, -0.4, 0.2, 0.0, -0.1];
  const jittered = inputRows((t, die, step) => Number((t + (jitter[(step + 2 * die) % jitter.length] as number)).toFixed(1)));
  write("jittered.csv", ["# Invented: measured melt temperatures around the set-points 190 and 230 °C", HEADER.join(","), ...jittered.map((r) => r.join(","))].join("\n") + "\n");

  // every marked number could be read two ways: whole kPa with a dot grouping, nothing else marked
  const ambiguous = rows.filter((r) => Number.isInteger(r[4]) && r[5] >= 1000 && r[5] < 1000000);
  write("ambiguous.csv", [HEADER.join(";"), ...ambiguous.map((r) => r.map(german).join(";"))].join("\n") + "\n");

  const wb = new ExcelJS.Workbook();
  wb.created = new Date(Date.UTC(2024, 0, 1));
  wb.modified = wb.created;
  const raw = wb.addWorksheet("Raw");
  raw.addRow(HEADER);
  rows.forEach((r, i) => {
    const row = raw.addRow(r);
    // a pressure written as a formula with its saved result, and a speed stored as text with a decimal comma
    if (i === 3) row.getCell(6).value = { formula: `${r[5]}*1`, result: r[5] };
    if (i === 4) row.getCell(5).value = german(r[4]);
  });
  const other = wb.addWorksheet("230 C only");
  other.addRow(["Sheet of the 230 °C rows only"]);
  other.addRow([]);
  other.addRow(HEADER);
  rows.filter((r) => r[0] === 230).forEach((r) => other.addRow(r));
  write("run.xlsx", Buffer.from(await wb.xlsx.writeBuffer()));
  process.stdout.write(`wrote ${OUT}/\n`);
}

void main();
