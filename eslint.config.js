import js from "@eslint/js";
import pluginQuery from "@tanstack/eslint-plugin-query";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["dist/", "node_modules/", ".data/", "test-output/", "coverage/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginQuery.configs["flat/recommended"],
  {
    files: ["**/*.{ts,tsx}"],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    files: ["client/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
  {
    // The physics engine stays pure: no web framework, database or UI imports.
    files: ["server/physics/**/*.ts"],
    rules: {
      "no-restricted-imports": ["error", { patterns: ["express", "knex", "pg", "react", "react-dom", "**/features/**", "**/db/**"] }],
    },
  },
  {
    // The client never imports server code (common/ is the shared ground).
    files: ["client/**/*.{ts,tsx}"],
    rules: { "no-restricted-imports": ["error", { patterns: ["**/server/**", "express", "knex"] }] },
  },
);
