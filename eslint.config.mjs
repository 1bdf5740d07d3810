import js from "@eslint/js";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["dist/**", "node_modules/**", "coverage/**", "bin/**", "test-output/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "no-eval": "error",
      "no-implied-eval": "error",
      "no-new-func": "error",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
    },
  },
  {
    files: ["scripts/**/*.mjs", "scripts/**/*.cjs", "scripts/**/*.js", "*.js", "*.mjs"],
    languageOptions: {
      globals: { process: "readonly", console: "readonly", Buffer: "readonly", URL: "readonly", setTimeout: "readonly", clearTimeout: "readonly", __dirname: "readonly", require: "readonly", module: "writable" },
    },
  },
  // CommonJS scripts load with require()
  { files: ["scripts/**/*.cjs"], rules: { "@typescript-eslint/no-require-imports": "off" } },
  {
    files: ["src/core/**/*.ts"],
    rules: {
      "no-restricted-globals": ["error", "document", "window", "Office", "Excel", "fetch", "XMLHttpRequest"],
      "no-restricted-imports": ["error", { patterns: ["fs", "path", "node:*", "*/functions/*", "*/taskpane/*", "*/cli/*"] }],
    },
  },
);
