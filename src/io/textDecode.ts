/**
 * Bytes of an input file to text: what kind of file it is (a table as text, an xlsx workbook, or
 * something else named plainly: a PDF, a zip archive, an old .xls workbook, a picture...), and
 * the text encoding: a byte-order mark (UTF-8, UTF-16 LE/BE), else UTF-8 when every byte sequence
 * is valid UTF-8, else Windows-1252, the code page Excel uses for "CSV" on Western European
 * Windows (there `°` is the single byte 0xB0). The encoding used is named in a warning whenever it
 * is not plain UTF-8.
 */
import { RheoError, type Warning, warning } from "../core/errors";

/** What the first bytes of a file say it is. */
export type FileKind =
  | { kind: "text"; encoding: TextEncodingName; bomLength: number }
  | { kind: "xlsx" }
  | { kind: "other"; what: string };

/** The encodings read. */
export type TextEncodingName = "utf-8" | "utf-16le" | "utf-16be" | "windows-1252";

/** Plain names for messages. */
export const ENCODING_NAMES: Readonly<Record<TextEncodingName, string>> = Object.freeze({
  "utf-8": "UTF-8",
  "utf-16le": "UTF-16 (little-endian)",
  "utf-16be": "UTF-16 (big-endian)",
  "windows-1252": "Windows-1252 (Western European code page)",
});

function startsWith(bytes: Uint8Array, ...signature: number[]): boolean {
  if (bytes.length < signature.length) return false;
  for (let i = 0; i < signature.length; i++) if (bytes[i] !== signature[i]) return false;
  return true;
}

function ascii(bytes: Uint8Array, from: number, length: number): string {
  let s = "";
  const end = Math.min(bytes.length, from + length);
  for (let i = from; i < end; i++) s += String.fromCharCode(bytes[i] as number);
  return s;
}

/** True when `needle` (ASCII) occurs in the bytes. */
function containsAscii(bytes: Uint8Array, needle: string): boolean {
  const first = needle.charCodeAt(0);
  outer: for (let i = bytes.indexOf(first); i >= 0 && i <= bytes.length - needle.length; i = bytes.indexOf(first, i + 1)) {
    for (let k = 1; k < needle.length; k++) if (bytes[i + k] !== needle.charCodeAt(k)) continue outer;
    return true;
  }
  return false;
}

/**
 * What a zip archive holds, from its entry names (the whole file is needed: the names sit in
 * local headers throughout and in the central directory at the end).
 */
export function describeZip(bytes: Uint8Array): FileKind {
  if (containsAscii(bytes, "xl/workbook.xml") || containsAscii(bytes, "xl/workbook.bin")) {
    return containsAscii(bytes, "xl/workbook.bin")
      ? { kind: "other", what: "an Excel binary workbook (.xlsb); save it as .xlsx or CSV" }
      : { kind: "xlsx" };
  }
  if (containsAscii(bytes, "word/document.xml")) return { kind: "other", what: "a Word document (.docx)" };
  if (containsAscii(bytes, "ppt/presentation.xml")) return { kind: "other", what: "a PowerPoint presentation (.pptx)" };
  if (containsAscii(bytes, "application/vnd.oasis.opendocument.spreadsheet")) return { kind: "other", what: "an OpenDocument spreadsheet (.ods); save it as .xlsx or CSV" };
  if (containsAscii(bytes, "application/vnd.oasis.opendocument")) return { kind: "other", what: "an OpenDocument file" };
  return { kind: "other", what: "a zip archive" };
}

/**
 * The kind of a file from its first bytes (at least 4 KB when the file is that long). A zip
 * archive is only recognised as such here; call {@link describeZip} on the whole file to tell an
 * xlsx workbook from other zips.
 */
export function sniffFile(head: Uint8Array): FileKind | { kind: "zip" } {
  if (startsWith(head, 0xef, 0xbb, 0xbf)) return { kind: "text", encoding: "utf-8", bomLength: 3 };
  if (startsWith(head, 0xff, 0xfe)) return { kind: "text", encoding: "utf-16le", bomLength: 2 };
  if (startsWith(head, 0xfe, 0xff)) return { kind: "text", encoding: "utf-16be", bomLength: 2 };
  if (startsWith(head, 0x50, 0x4b, 0x03, 0x04) || startsWith(head, 0x50, 0x4b, 0x05, 0x06)) return { kind: "zip" };
  if (startsWith(head, 0x25, 0x50, 0x44, 0x46)) return { kind: "other", what: "a PDF document" };
  if (startsWith(head, 0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1)) {
    return { kind: "other", what: "an Excel 97–2003 workbook (.xls) or another legacy Office file; save it as .xlsx or CSV" };
  }
  if (startsWith(head, 0x1f, 0x8b)) return { kind: "other", what: "a gzip-compressed file; decompress it first" };
  if (startsWith(head, 0x89, 0x50, 0x4e, 0x47)) return { kind: "other", what: "a PNG image" };
  if (startsWith(head, 0xff, 0xd8, 0xff)) return { kind: "other", what: "a JPEG image" };
  if (startsWith(head, 0x47, 0x49, 0x46, 0x38)) return { kind: "other", what: "a GIF image" };
  if (startsWith(head, 0x37, 0x7a, 0xbc, 0xaf)) return { kind: "other", what: "a 7-Zip archive" };
  if (startsWith(head, 0x52, 0x61, 0x72, 0x21)) return { kind: "other", what: "a RAR archive" };
  if (startsWith(head, 0x7f, 0x45, 0x4c, 0x46) || startsWith(head, 0x4d, 0x5a)) return { kind: "other", what: "a program (executable)" };
  const start = ascii(head, 0, 512).replace(/^\s+/, "").toLowerCase();
  if (start.startsWith("{\\rtf")) return { kind: "other", what: "a rich-text (RTF) document" };
  if (start.startsWith("<!doctype html") || start.startsWith("<html")) return { kind: "other", what: "an HTML page (some programs save these with an .xls name); save the data as CSV or .xlsx" };
  if (start.startsWith("<?xml") && containsAscii(head, "urn:schemas-microsoft-com:office:spreadsheet")) {
    return { kind: "other", what: "an Excel 2003 XML spreadsheet; save it as .xlsx or CSV" };
  }
  const sample = head.subarray(0, 4096);
  const zeros = sample.reduce((n, b) => n + (b === 0 ? 1 : 0), 0);
  if (zeros > 0) {
    // UTF-16 without a byte-order mark: every other byte zero in ASCII text
    let evenZeros = 0;
    let oddZeros = 0;
    for (let i = 0; i < sample.length; i++) {
      if (sample[i] !== 0) continue;
      if (i % 2 === 0) evenZeros++;
      else oddZeros++;
    }
    const half = sample.length / 2;
    if (oddZeros > 0.4 * half && evenZeros < 0.05 * half) return { kind: "text", encoding: "utf-16le", bomLength: 0 };
    if (evenZeros > 0.4 * half && oddZeros < 0.05 * half) return { kind: "text", encoding: "utf-16be", bomLength: 0 };
    return { kind: "other", what: "a binary file, not text" };
  }
  return { kind: "text", encoding: "utf-8", bomLength: 0 };
}

/** The error for a file that is not a table. */
export function notATable(file: string, what: string): RheoError {
  return new RheoError("value", file, `is ${what}, not a table; give a CSV (or tab-separated) text file or an .xlsx workbook`, undefined, "NOT_A_TABLE");
}

/**
 * Streaming decoder: `decode(chunk)` returns the text of whole characters so far (a character
 * split between chunks is completed by the next chunk), `end()` the rest.
 * UTF-8 is decoded strictly: an invalid sequence throws {@link NotUtf8}, so the caller can start
 * again as Windows-1252.
 */
export class ChunkDecoder {
  private readonly decoder: TextDecoder;
  constructor(readonly encoding: TextEncodingName) {
    this.decoder = new TextDecoder(encoding, { fatal: encoding === "utf-8", ignoreBOM: true });
  }
  decode(chunk: Uint8Array): string {
    try {
      return this.decoder.decode(chunk, { stream: true });
    } catch {
      throw new NotUtf8();
    }
  }
  end(): string {
    try {
      return this.decoder.decode();
    } catch {
      throw new NotUtf8();
    }
  }
}

/** Thrown by a UTF-8 {@link ChunkDecoder} at the first invalid byte sequence. */
export class NotUtf8 extends Error {
  constructor() {
    super("not UTF-8");
    this.name = "NotUtf8";
  }
}

/** The warning that names a non-UTF-8 encoding (null for UTF-8). */
export function encodingWarning(encoding: TextEncodingName, bom: boolean): Warning | null {
  if (encoding === "utf-8") return null;
  if (encoding === "windows-1252") {
    return warning("INPUT_ENCODING", `The file is not UTF-8; it was read as ${ENCODING_NAMES[encoding]}, the code page Excel uses for CSV on Western European Windows (byte 0xB0 is "°"). Check that units and labels read right.`, "input");
  }
  return warning("INPUT_ENCODING", `The file was read as ${ENCODING_NAMES[encoding]}${bom ? " (byte-order mark)" : " (no byte-order mark; detected from its zero bytes)"}.`, "input");
}

/**
 * Decodes a whole byte array (see the module comment); used for small inputs and tests.
 * @throws RheoError naming `file` when the bytes are not text
 */
export function decodeBytes(bytes: Uint8Array, file = "input"): { text: string; encoding: TextEncodingName; warnings: Warning[] } {
  const kind = sniffFile(bytes.subarray(0, 4096));
  if (kind.kind === "zip") {
    const z = describeZip(bytes);
    throw notATable(file, z.kind === "xlsx" ? "an xlsx workbook (read it as one)" : (z as { what: string }).what);
  }
  if (kind.kind === "other") throw notATable(file, kind.what);
  if (kind.kind === "xlsx") throw notATable(file, "an xlsx workbook");
  const body = bytes.subarray(kind.bomLength);
  let encoding = kind.encoding;
  let text: string;
  try {
    const d = new ChunkDecoder(encoding);
    text = d.decode(body) + d.end();
  } catch (e) {
    if (!(e instanceof NotUtf8)) throw e;
    encoding = "windows-1252";
    text = new TextDecoder(encoding).decode(body);
  }
  const w = encodingWarning(encoding, kind.bomLength > 0);
  return { text, encoding, warnings: w ? [w] : [] };
}
