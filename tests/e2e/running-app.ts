import type { Browser } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { launchBrowser, startApp, type RunningApp } from "@/tests/e2e/harness";

/**
 * For one describe block: a fresh copy of the seeded app and a Chromium, started before its
 * tests and stopped after them. Read `.app` and `.browser` inside tests (they are set in beforeAll).
 * Kept apart from harness.ts, which the benchmarks import outside vitest.
 */
export function useAppAndBrowser(): { app: RunningApp; browser: Browser } {
  const running = {} as { app: RunningApp; browser: Browser };
  beforeAll(async () => {
    running.app = await startApp();
    running.browser = await launchBrowser();
  }, 600_000);
  afterAll(async () => {
    await running.browser?.close();
    await running.app?.stop();
  });
  return running;
}
