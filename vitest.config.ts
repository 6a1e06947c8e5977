import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL("./", import.meta.url));

export default defineConfig({
  resolve: {
    alias: [
      { find: /^server-only$/, replacement: `${root}tests/server-only.mock.ts` },
      { find: /^@\//, replacement: root },
    ],
  },
  test: {
    environment: "node",
    // next-auth imports "next/server" without an extension, which Node refuses outside a bundler.
    server: { deps: { inline: ["next-auth"] } },
    globalSetup: ["tests/global-setup.ts"],
    testTimeout: 30_000,
    hookTimeout: 120_000,
    projects: [
      { extends: true, test: { name: "unit", include: ["tests/unit/**/*.test.{ts,tsx}"] } },
      {
        extends: true,
        test: { name: "integration", include: ["tests/integration/**/*.test.ts"], setupFiles: ["tests/integration/setup.ts"] },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          // The build and the seeded data, side by side, before any file (tests/e2e/global-setup.ts).
          globalSetup: ["tests/e2e/global-setup.ts"],
          // Two files at a time: each starts its own app on its own copy of the data, and a file
          // spends much of its time waiting on its app or its browser, so two keep 2 cores busy.
          maxWorkers: 2,
          testTimeout: 90_000,
        },
      },
    ],
  },
});
