// ESLint flat config: typescript-eslint, React hooks, import cycles and the folder boundaries
// (DEVELOPERS.md "Layout"). Formatting is Prettier's job (`npm run format:check`), not ESLint's.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";
import { importX } from "eslint-plugin-import-x";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import prettier from "eslint-config-prettier";
import globals from "globals";

export default tseslint.config(
  {
    ignores: ["build/", ".react-router/", ".data/", "node_modules/", "test-results/", "playwright-report/", "public/"],
  },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    linterOptions: { reportUnusedDisableDirectives: "error" },
    plugins: { "import-x": importX },
    settings: { "import-x/resolver-next": [createTypeScriptImportResolver({ project: "tsconfig.json" })] },
    rules: {
      "import-x/no-cycle": "error",
      "import-x/no-self-import": "error",
      "import-x/no-restricted-paths": [
        "error",
        {
          zones: [
            {
              target: "./app/engine",
              from: "./app",
              except: ["./engine"],
              message: "The engine is pure: it imports nothing of the app.",
            },
            {
              target: "./app/lib",
              from: ["./app/components", "./app/routes"],
              message: "lib never imports components or routes.",
            },
            {
              target: "./app/components",
              from: "./app/routes",
              message: "Components never import routes.",
            },
          ],
        },
      ],
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none", ignoreRestSiblings: true },
      ],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    // React code lives in app/ only (tests' `useTestDatabase()` is not a hook).
    files: ["app/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "error",
    },
  },
  {
    // callRoute() folds any loader's or action's answer into one shape; tests read it loosely.
    files: ["tests/support/accounts.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  prettier,
);
