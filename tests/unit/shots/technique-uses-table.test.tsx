// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { act } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { TechniqueUsesTable } from "@/components/shots/technique-uses-table";
import type { TechniqueUsesResponse, UseResponse } from "@/lib/uses/schemas";
import { mountEachTest } from "@/tests/unit/dom-root";

// Our own behaviour (issue 19): a technique page's server render carries only the outcome counts;
// the shot table reads its rows from GET /api/techniques/{slug}/uses (shared/API.md), whose pages
// hold at most 200 rows. Only the network is replaced.

vi.mock("next/link", () => ({ default: ({ children, href }: { children: React.ReactNode; href: string }) => <a href={href}>{children}</a> }));
const dom = mountEachTest();
afterEach(() => vi.unstubAllGlobals());

function use(i: number): UseResponse {
  return {
    id: `u${i}`,
    technique: { id: "t", slug: "dot-paint-out", title: "Dot paint-out", status: "approved" },
    shot: { code: `KYR_010_${String(i).padStart(4, "0")}`, showCode: "KYR", sequence: "010" },
    outcome: "clean",
    note: `note ${i}`,
    user: { id: "p", name: "Person" },
    beforeStill: null,
    afterStill: null,
    revisionId: null,
    canEdit: false,
    createdAt: new Date(Date.UTC(2026, 0, 1, 0, i)).toISOString(),
    updatedAt: new Date(Date.UTC(2026, 0, 1, 0, i)).toISOString(),
  };
}

function serve(total: number, fail = false) {
  const urls: string[] = [];
  vi.stubGlobal("fetch", async (url: string) => {
    urls.push(url);
    if (fail) return new Response(JSON.stringify({ error: { code: "internal", message: "The database did not answer." } }), { status: 500 });
    const q = new URL(url, "http://x").searchParams;
    const [limit, offset] = [Number(q.get("limit")), Number(q.get("offset"))];
    const items = Array.from({ length: Math.max(0, Math.min(limit, total - offset)) }, (_, k) => use(offset + k));
    const body: TechniqueUsesResponse = { items, total, counts: { clean: total, "touch-up": 0, failed: 0, total } };
    return new Response(JSON.stringify(body), { status: 200 });
  });
  return urls;
}

const settle = () => act(async () => new Promise((r) => setTimeout(r, 20)));
const client = () => new QueryClient({ defaultOptions: { queries: { retry: false } } });

describe("TechniqueUsesTable", () => {
  it("reads every row of a long shot log page by page from the API, then shows the first ten", async () => {
    const urls = serve(450);
    dom.render(
      <QueryClientProvider client={client()}>
        <TechniqueUsesTable slug="dot-paint-out" />
      </QueryClientProvider>,
    );
    expect(dom.host.querySelector('[role="status"]')?.getAttribute("aria-label")).toBe("Loading the shot table");
    await settle();
    expect(urls).toEqual([0, 200, 400].map((o) => `/api/techniques/dot-paint-out/uses?limit=200&offset=${o}`));
    expect(dom.host.querySelectorAll("tbody tr")).toHaveLength(10);
    expect(dom.host.textContent).toContain("page 1 of 45");
  });

  it("asks once for a short log", async () => {
    const urls = serve(3);
    dom.render(
      <QueryClientProvider client={client()}>
        <TechniqueUsesTable slug="dot-paint-out" />
      </QueryClientProvider>,
    );
    await settle();
    expect(urls).toHaveLength(1);
    expect(dom.host.querySelectorAll("tbody tr")).toHaveLength(3);
  });

  it("says what failed and offers to try again", async () => {
    serve(3, true);
    dom.render(
      <QueryClientProvider client={client()}>
        <TechniqueUsesTable slug="dot-paint-out" />
      </QueryClientProvider>,
    );
    await settle();
    const alert = dom.host.querySelector('[role="alert"]');
    expect(alert?.textContent).toContain("Could not load the shot table: The database did not answer.");
    expect(alert?.querySelector("button")?.textContent).toBe("Try again");
  });
});
