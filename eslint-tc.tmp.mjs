import base from "./eslint.config.mjs";
import tseslint from "typescript-eslint";
export default [
  ...base,
  ...tseslint.configs.recommendedTypeChecked.map((c) => ({ ...c, files: ["**/*.{ts,tsx,mts,cts}"] })),
  { files: ["**/*.{ts,tsx,mts,cts}"], languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: "/work/wt/i14-house" } } },
];
