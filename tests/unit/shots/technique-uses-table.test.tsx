// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { act } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { TechniqueUsesTable } from "@/components/shots/technique-uses-table";
import type { TechniqueUsesResponse } from "@/lib/uses/schemas";
import { mountEachTest } from "@/tests/unit/dom-root";
import { logRow } from "@/tests/unit/shots/use-rows";

// Our own behaviour (issue 19): a technique page's server render carries only the outcome counts;
// the shot table reads its rows from GET /api/techniques/{slug}/uses (shared/API.md), whose pages
// hold at most 200 rows. Only the network is replaced.

vi.mock("next/link", () => ({ default: ({ children, href }: { children: React.ReactNode; href: string }) => <a href={href}>{children}</a> }));
const dom = mountEachTest();
afterEach(() => vi.unstubAllGlobals());

function serve(total: number, fail = false) {
  const urls: string[] = [];
  vi.stubGlobal("fetch", async (url: string) => {
    urls.push(url);
    if (fail) return new Response(JSON.stringify({ error: { code: "internal", message: "The database did not answer." } }), { status: 500 });
    const q = new URL(url, "http://x").searchParams;
    const [limit, offset] = [Number(q.get("limit")), Number(q.get("offset"))];
    const items = Array.from({ length: Math.max(0, Math.min(limit, total - offset)) }, (_, k) => logRow(offset + k));
    const body: TechniqueUsesResponse = { items, total, counts: { clean: total, "touch-up": 0, failed: 0, total } };
    return new Response(JSON.stringify(body), { status: 200 });
  });
  return urls;
}

// Until the table (or its error) is on the page: the reads are chained, and a loaded machine is slow.
async function settle() {
  for (let waited = 0; waited < 5000; waited += 20) {
    await act(async () => new Promise((r) => setTimeout(r, 20)));
    if (!dom.host.querySelector('[aria-label="Loading the shot table"]')) return;
  }
}
const showTable = () =>
  dom.render(
    <QueryClientProvider client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}>
      <TechniqueUsesTable slug="dot-paint-out" />
    </QueryClientProvider>,
  );

describe("TechniqueUsesTable", () => {
  it("reads every row of a long shot log page by page from the API, then shows the first ten", async () => {
    const urls = serve(450);
    showTable();
    expect(dom.host.querySelector('[role="status"]')?.getAttribute("aria-label")).toBe("Loading the shot table");
    await settle();
    expect(urls).toEqual([0, 200, 400].map((o) => `/api/techniques/dot-paint-out/uses?limit=200&offset=${o}`));
    expect(dom.host.querySelectorAll("tbody tr")).toHaveLength(10);
    expect(dom.host.textContent).toContain("page 1 of 45");
  });

  it("says so when a log is longer than the table holds, and reads no further", async () => {
    const urls = serve(1234);
    showTable();
    await settle();
    expect(urls).toHaveLength(5);
    expect(dom.host.textContent).toContain("The newest 1,000 of 1,234 logged uses");
    expect(dom.host.textContent).toContain("page 1 of 100");
  });

  it("asks once for a short log", async () => {
    const urls = serve(3);
    showTable();
    await settle();
    expect(urls).toHaveLength(1);
    expect(dom.host.querySelectorAll("tbody tr")).toHaveLength(3);
  });

  it("says what failed and offers to try again", async () => {
    serve(3, true);
    showTable();
    await settle();
    const alert = dom.host.querySelector('[role="alert"]');
    expect(alert?.textContent).toContain("Could not load the shot table: The database did not answer.");
    expect(alert?.querySelector("button")?.textContent).toBe("Try again");
  });
});
