/**
 * Text from a user's file quoted back in a message: control characters removed (a header holding
 * terminal escape sequences must not retitle or clear the terminal), bidirectional overrides
 * removed (they reorder what is shown), and at most a short excerpt, so that a runaway quoted cell
 * of many megabytes is never echoed whole.
 */

/** Longest excerpt quoted in a message, in characters. */
export const EXCERPT_LENGTH = 40;

/**
 * C0 and C1 control characters (tab and newlines included: a quoted excerpt is one line), DEL,
 * and the bidirectional embedding, override and isolate marks.
 */
// eslint-disable-next-line no-control-regex
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

/**
 * `text` made safe to print: control and bidirectional-override characters replaced by a space
 * (runs of them by one), at most `max` characters with "…" marking a cut.
 * @example excerpt("\u001b]0;owned\u0007pressure") // " ]0;owned pressure"
 * @example excerpt("x".repeat(100)).length // 41
 */
export function excerpt(text: string, max = EXCERPT_LENGTH): string {
  const head = text.length > max * 4 ? text.slice(0, max * 4) : text;
  const clean = head.replace(UNSAFE, " ").replace(/ {2,}/g, " ");
  if (clean.length <= max && head.length === text.length) return clean;
  return clean.slice(0, max) + "…";
}

/**
 * A whole message made safe for a terminal or a log: control characters other than the line
 * feed removed, bidirectional overrides removed. Length is kept (messages are built by us).
 */
export function safeMessage(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, " ");
}
