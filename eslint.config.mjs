import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";
import drizzle from "eslint-plugin-drizzle";

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
    },
  },
  { ignores: [".next/**", "node_modules/**", ".data/**", "uploads/**", "tests/.tmp/**", ".next-*/**", "next-env.d.ts", "db/migrations/**"] },
];

export default config;
