// @vitest-environment jsdom
import { act } from "react";
import { createRoot } from "react-dom/client";
import { describe, expect, it, vi } from "vitest";
import { UsesTable } from "@/components/shots/uses-table";
import type { UseResponse } from "@/lib/uses/schemas";

vi.mock("next/link", () => ({ default: ({ children, href }: { children: React.ReactNode; href: string }) => <a href={href}>{children}</a> }));

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

function uses(n: number): UseResponse[] {
  return Array.from({ length: n }, (_, i) => ({
    id: `u${i}`,
    technique: { id: "t", slug: "s", title: "T", status: "approved" },
    shot: { code: `SLM_010_${String(i).padStart(4, "0")}`, showCode: "SLM", sequence: "010" },
    outcome: i % 3 === 0 ? "failed" : "clean",
    note: `note ${i}`,
    user: { id: "p", name: "Person" },
    beforeStill: null,
    afterStill: null,
    revisionId: null,
    canEdit: false,
    createdAt: new Date(Date.UTC(2026, 0, 1 + i)).toISOString(),
    updatedAt: new Date(Date.UTC(2026, 0, 1 + i)).toISOString(),
  }));
}

describe("UsesTable", () => {
  it("settles when the page refreshes its data (new array, same rows) — no endless re-render", async () => {
    const host = document.createElement("div");
    const root = createRoot(host);
    const errors: unknown[] = [];
    const spy = vi.spyOn(console, "error").mockImplementation((...args) => errors.push(args));
    await act(async () => root.render(<UsesTable initial={uses(25)} />));
    for (let i = 0; i < 3; i++) await act(async () => root.render(<UsesTable initial={uses(25)} />));
    spy.mockRestore();
    expect(errors.filter((e) => String(e).includes("Maximum update depth"))).toEqual([]);
    // 10 rows a page, 25 rows: three pages.
    expect(host.querySelectorAll("tbody tr")).toHaveLength(10);
    expect(host.textContent).toContain("page 1 of 3");
    await act(async () => root.unmount());
  });
});
