// office-addin-lint's rules (its recommended Office add-in set) on TypeScript sources.
// Formatting is left to authors (prettier's rule is not enforced).
import officeAddins from "eslint-plugin-office-addins";
import tsParser from "@typescript-eslint/parser";

export default [
  ...officeAddins.configs.recommended,
  {
    plugins: { "office-addins": officeAddins },
    languageOptions: { parser: tsParser },
    // no-undef is off for TypeScript: the compiler checks names (typescript-eslint advice).
    rules: { "prettier/prettier": "off", "no-undef": "off" },
  },
  {
    // Faces, the input layer and the benchmarks reach the engine only through its public index
    // (src/engine/index.ts, docs/engine-api.md); test/engine/sources.test.ts checks the same.
    files: ["src/**/*.ts", "bench/**/*.ts"],
    ignores: ["src/engine/**"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              regex: "(^|/)engine/.+",
              message: "Import the engine from its public index (src/engine/index.ts), not from its files.",
            },
          ],
        },
      ],
    },
  },
];
