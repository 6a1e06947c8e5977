// @vitest-environment jsdom
import { act } from "react";
import { createRoot } from "react-dom/client";
import { describe, expect, it, vi } from "vitest";
import { UsesTable } from "@/components/shots/uses-table";
import type { UseResponse } from "@/lib/uses/schemas";
import { logRow } from "@/tests/unit/shots/use-rows";

vi.mock("next/link", () => ({ default: ({ children, href }: { children: React.ReactNode; href: string }) => <a href={href}>{children}</a> }));

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

function uses(n: number): UseResponse[] {
  return Array.from({ length: n }, (_, i) => logRow(i, { outcome: i % 3 === 0 ? "failed" : "clean" }));
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
