// Writes test/fixtures/number-formats.json: numbers as the Unicode CLDR locale data (through the
// ICU library built into Node, Intl.NumberFormat) writes them in a dozen locales: decimal point or
// comma; thousands grouped by comma, dot, no-break space, narrow no-break space or apostrophe;
// the minus sign U+2212 where a locale uses it. test/numberText.test.ts reads every text back.
// Run: node scripts/gen-number-formats.mjs
import { writeFileSync } from "node:fs";

const LOCALES = ["en-US", "en-GB", "de-DE", "de-CH", "fr-FR", "it-IT", "es-ES", "pt-BR", "nl-NL", "sv-SE", "pl-PL", "ja-JP"];
const VALUES = [1234.5, 1160, 0.001, 1234567.891, 190.3, 12, -1234.5, 0.5, 999.999, 20000, 7.25, -0.125];

const locales = LOCALES.map((locale) => {
  const format = new Intl.NumberFormat(locale, { useGrouping: true, maximumFractionDigits: 6 });
  const parts = format.formatToParts(1234567.5);
  const decimal = parts.find((p) => p.type === "decimal")?.value;
  const group = parts.find((p) => p.type === "group")?.value;
  return { locale, decimal, group, texts: VALUES.map((value) => ({ value, text: format.format(value) })) };
});
const doc = {
  source: `Intl.NumberFormat (ICU ${process.versions.icu}, CLDR ${process.versions.cldr ?? "?"}, Unicode ${process.versions.unicode ?? "?"}) in Node ${process.version}`,
  generator: "scripts/gen-number-formats.mjs",
  locales,
};
writeFileSync("test/fixtures/number-formats.json", JSON.stringify(doc, null, 2) + "\n");
console.log("wrote test/fixtures/number-formats.json");
