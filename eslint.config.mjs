import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";
import drizzle from "eslint-plugin-drizzle";

/*
 * The layers (DEVELOPERS.md "Layers"): app -> components -> lib -> db, never upward, and nothing
 * the product runs imports tests, scripts or bench. eslint-plugin-import's no-restricted-paths
 * (the `import` plugin eslint-config-next registers, resolving "@/…" through tsconfig paths)
 * checks every import, type-only ones included.
 */
const NOT_PRODUCT = ["./scripts", "./tests", "./bench"];
const layerZones = [
  {
    target: "./db",
    from: ["./lib", "./components", "./app", ...NOT_PRODUCT],
    message: "db/ is the bottom layer: it imports nothing from lib, components, app, scripts or tests (its configuration is db/config.ts).",
  },
  {
    target: "./lib",
    from: ["./components", "./app", ...NOT_PRODUCT],
    message: "lib/ may import db/ and other lib modules only (app -> components -> lib -> db).",
  },
  {
    target: "./components",
    from: "./app",
    message: "components/ never import app/: data and types come through lib.",
  },
  {
    target: "./components",
    from: ["./db", ...NOT_PRODUCT],
    message: "components/ may import lib/ and other components only; data comes through lib.",
  },
  {
    target: ["./app", "./proxy.ts", "./instrumentation.ts"],
    from: ["./db", ...NOT_PRODUCT],
    message: "app/ reaches the database through lib/ (STYLE.md: only DAL files import db) and imports no scripts, tests or bench.",
  },
];

/*
 * typescript-eslint's type-checked rules (they read the TypeScript program through the project
 * service). Chosen from `recommendedTypeChecked` because they find real bugs and the code is at
 * zero on them; the others of that set are not on yet: unbound-method (reports destructured React
 * props and route contexts, not `this` bugs), no-unsafe-* (tests read JSON answers as any),
 * restrict-template-expressions, no-base-to-string (FormData values), no-implied-eval (the lab
 * generates its blur code on purpose).
 */
const typeChecked = {
  files: ["**/*.{ts,tsx,mts,cts}"],
  languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname } },
  rules: {
    "@typescript-eslint/await-thenable": "error",
    "@typescript-eslint/no-floating-promises": "error",
    // JSX event props take async handlers (React's idiom); every other void-returning callback may not.
    "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
    "@typescript-eslint/no-unnecessary-type-assertion": "error",
    "@typescript-eslint/require-await": "error",
    "@typescript-eslint/no-for-in-array": "error",
    "@typescript-eslint/no-array-delete": "error",
    "@typescript-eslint/no-duplicate-type-constituents": "error",
    "@typescript-eslint/no-redundant-type-constituents": "error",
    "@typescript-eslint/only-throw-error": "error",
    "@typescript-eslint/prefer-promise-reject-errors": "error",
    "@typescript-eslint/no-unsafe-unary-minus": "error",
  },
};

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    plugins: { drizzle },
    rules: {
      // An update or delete without a where clause touches every row.
      "drizzle/enforce-delete-with-where": ["error", { drizzleObjectName: ["db", "tx", "getDb()"] }],
      "drizzle/enforce-update-with-where": ["error", { drizzleObjectName: ["db", "tx", "getDb()"] }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "import/no-restricted-paths": ["error", { zones: layerZones }],
    },
  },
  typeChecked,
  // React's `await act(async () => …)` flushes pending work even when the callback awaits nothing.
  { files: ["tests/**/*.tsx"], rules: { "@typescript-eslint/require-await": "off" } },
  { ignores: [".next/**", "node_modules/**", ".data/**", "uploads/**", "tests/.tmp/**", ".next-*/**", "next-env.d.ts", "db/migrations/**"] },
];

export default config;
