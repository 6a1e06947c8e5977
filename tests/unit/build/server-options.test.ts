import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { SERVER_V8_OPTIONS, serverNodeOptions } from "@/scripts/server-options";

// Our own rule: every way of starting the server (demo, tests and benchmarks, `npm start`) runs it
// with the same V8 options, so the measured render speed is the speed people get.
describe("the server's V8 options", () => {
  it("are the ones `npm start` passes", () => {
    const start = (JSON.parse(fs.readFileSync("package.json", "utf8")) as { scripts: Record<string, string> }).scripts.start ?? "";
    for (const option of SERVER_V8_OPTIONS) expect(start).toContain(option);
    expect(start).toContain("$NODE_OPTIONS");
  });

  it("keep the caller's own NODE_OPTIONS", () => {
    expect(serverNodeOptions("--max-old-space-size=2048")).toBe(`--max-old-space-size=2048 ${SERVER_V8_OPTIONS.join(" ")}`);
    expect(serverNodeOptions()).toBe(SERVER_V8_OPTIONS.join(" "));
  });
});
