/**
 * `npm run docs`: rewrites the generated blocks of docs/ (scripts/docs/generated.ts), then the
 * worksheet-function reference (scripts/gen-function-reference.mjs, from dist/functions.json).
 */
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { generatedBlocks, replaceBlock } from "./docs/generated";

const ROOT = path.join(__dirname, "..");
for (const { file, name, content } of generatedBlocks()) {
  const p = path.join(ROOT, file);
  const before = readFileSync(p, "utf8");
  const after = replaceBlock(before, name, content);
  if (after !== before) {
    writeFileSync(p, after);
    console.log(`${file}: ${name} rewritten`);
  } else console.log(`${file}: ${name} up to date`);
}
