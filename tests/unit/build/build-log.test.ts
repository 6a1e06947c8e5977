import { describe, expect, it } from "vitest";
import { buildWarnings } from "@/scripts/build-log";

// The start and end of a clean `next build` of this project (Next.js 16.4, Turbopack), as printed.
const CLEAN = [
  "▲ Next.js 16.4.6 (Turbopack)",
  "✓ Running next.config.ts took 279ms",
  "- Experiments (use with caution):",
  "  · serverActions",
  "",
  "  Creating an optimized production build ...",
  "✓ Compiled successfully in 5.9min",
  "  Running TypeScript ...",
  "Route (app)",
  "├ ƒ /api/stills/[id]/pixel",
  "└ ƒ /techniques/[slug]/warnings-in-a-route-name",
  "ƒ Proxy (Middleware)",
].join("\n");

describe("build warnings (a build must print none)", () => {
  it("finds nothing in a clean build, route names included", () => {
    expect(buildWarnings(CLEAN)).toEqual([]);
  });

  it("finds Next.js's ⚠ lines, with or without colour codes", () => {
    // Next.js prints warnings through Log.warn, prefixed "⚠" (yellow on a terminal: ECMA-48 SGR 33).
    const log = `${CLEAN}\n\u001b[33m\u001b[1m⚠\u001b[22m\u001b[39m Compiled with warnings in 12.0s\n`;
    expect(buildWarnings(log)).toEqual(["⚠ Compiled with warnings in 12.0s"]);
  });

  it("finds warnings said in words by Turbopack or Node.js", () => {
    const log = [
      CLEAN,
      "Turbopack build encountered 2 warnings:",
      "./lib/stills/storage.ts:40:3",
      "Dynamic filesystem access causes tracing of the whole project",
      "(node:4242) Warning: Setting the NODE_TLS_REJECT_UNAUTHORIZED environment variable to '0' makes TLS connections insecure.",
    ].join("\n");
    expect(buildWarnings(log)).toEqual([
      "Turbopack build encountered 2 warnings:",
      "(node:4242) Warning: Setting the NODE_TLS_REJECT_UNAUTHORIZED environment variable to '0' makes TLS connections insecure.",
    ]);
  });
});
