/**
 * SHA-256 for the method record's input digest. node:crypto is loaded on the first digest, not
 * when the command line starts: loading it costs several milliseconds of every start (measured
 * 7.7 ms on the bench machine), and only commands that write a workbook or report need a digest.
 */
import type { Hash } from "node:crypto";

/** A new SHA-256 hash (node:crypto loaded on first use). */
export function sha256(): Hash {
  // a synchronous, deferred load of a Node built-in; the bundle keeps it as require("node:crypto")
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const crypto = require("node:crypto") as typeof import("node:crypto");
  return crypto.createHash("sha256");
}
