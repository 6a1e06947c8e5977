// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { act, type ReactNode } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { LogUseForm } from "@/components/shots/log-use-form";
import { patternAccepts } from "@/components/shots/show-forms";
import { frameRange } from "@/lib/shots/format";
import { ShotUses } from "@/components/shots/shot-uses";
import { matchesTechnique } from "@/components/shots/technique-picker";
import { DEFAULT_SHOT_PATTERN } from "@/lib/shows/schemas";
import type { ShotUseResponse } from "@/lib/uses/schemas";
import type { TechniqueListResponse } from "@/lib/techniques/schemas";

// The rules checked here are our own (shared/PRODUCT.md "Shows and shots" and issue 7): a use is
// logged from the shot page with the shot fixed and the technique picked; people edit or delete
// their own logs, and a delete happens only after it is confirmed. Only the network is replaced.

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;
const refresh = vi.fn();
vi.mock("next/navigation", () => ({ useRouter: () => ({ refresh, push: vi.fn() }) }));

type Call = { url: string; method: string; body: unknown };
let calls: Call[];
let container: HTMLDivElement;
let root: Root;

const TECHNIQUES: TechniqueListResponse = {
  items: [
    { slug: "marker-matrix", title: "Marker removal by channel matrix", summary: "Three-by-three matrix on the cleanest channel", status: "approved", tags: [], updatedAt: "2025-01-01T00:00:00Z", hasPendingRevision: false, isHouseMethodFor: [] },
    { slug: "wire-paint", title: "Wire removal with a clean plate", summary: "Patch from an offset frame", status: "approved", tags: [], updatedAt: "2025-01-01T00:00:00Z", hasPendingRevision: false, isHouseMethodFor: [] },
  ],
  total: 2,
};

beforeEach(() => {
  calls = [];
  refresh.mockReset();
  container = document.createElement("div");
  document.body.append(container);
  root = createRoot(container);
  // jsdom has <dialog> without the modal methods; these do what the browser does to `open`.
  HTMLDialogElement.prototype.showModal ??= function (this: HTMLDialogElement) {
    this.open = true;
  };
  HTMLDialogElement.prototype.close ??= function (this: HTMLDialogElement) {
    this.open = false;
  };
  vi.stubGlobal(
    "fetch",
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const method = init.method ?? "GET";
      calls.push({ url, method, body: typeof init.body === "string" ? JSON.parse(init.body) : undefined });
      const json = (status: number, body: unknown) => new Response(body === null ? null : JSON.stringify(body), { status, headers: { "Content-Type": "application/json" } });
      if (url.startsWith("/api/techniques?")) return json(200, TECHNIQUES);
      if (url.startsWith("/api/techniques/") && method === "POST") return json(201, { id: "u1" });
      if (url.startsWith("/api/uses/") && method === "PATCH") return json(200, { id: "u1" });
      if (url.startsWith("/api/uses/") && method === "DELETE") return json(204, null);
      return json(404, { error: { code: "not_found", message: "No such thing." } });
    }),
  );
});

afterEach(() => {
  act(() => root.unmount());
  container.remove();
  vi.unstubAllGlobals();
});

function render(node: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  act(() => root.render(<QueryClientProvider client={client}>{node}</QueryClientProvider>));
}
function typeInto(el: HTMLInputElement | HTMLTextAreaElement, value: string) {
  const proto = el instanceof HTMLTextAreaElement ? HTMLTextAreaElement.prototype : HTMLInputElement.prototype;
  Object.getOwnPropertyDescriptor(proto, "value")!.set!.call(el, value);
  el.dispatchEvent(new Event("input", { bubbles: true }));
}
const buttons = (label: RegExp) => [...container.querySelectorAll("button")].filter((b) => label.test(b.textContent ?? ""));
const button = (label: RegExp) => buttons(label)[0]!;
const flush = () => act(async () => new Promise((r) => setTimeout(r, 0)));

describe("LogUseForm on a shot page", () => {
  it("keeps the shot fixed, picks an approved technique by typing, and posts to that technique", async () => {
    render(<LogUseForm shot="SLM_040_0120" />);
    expect(container.querySelector('[data-testid="use-fixed-shot"]')?.textContent).toBe("SLM_040_0120");
    expect(container.querySelector("#use-shot")).toBeNull();
    expect(button(/Log use/).disabled).toBe(true);

    const picker = container.querySelector<HTMLInputElement>('input[role="combobox"]')!;
    await flush();
    expect(calls[0]).toMatchObject({ method: "GET", url: "/api/techniques?status=approved&limit=200" });
    act(() => typeInto(picker, "clean plate"));
    const options = [...container.querySelectorAll('[role="option"]')];
    expect(options.map((o) => o.textContent)).toEqual(["Wire removal with a clean platePatch from an offset frame"]);
    act(() => options[0]!.dispatchEvent(new MouseEvent("mousedown", { bubbles: true })));
    expect(picker.value).toBe("Wire removal with a clean plate");

    act(() => container.querySelector<HTMLInputElement>('input[type="radio"][value="touch-up"]')!.click());
    act(() => typeInto(container.querySelector("textarea")!, "needed a second pass on the wire"));
    await act(async () => button(/Log use/).click());
    const post = calls.find((c) => c.method === "POST")!;
    expect(post.url).toBe("/api/techniques/wire-paint/uses");
    expect(post.body).toEqual({ shot: "SLM_040_0120", outcome: "touch-up", note: "needed a second pass on the wire" });
    expect(refresh).toHaveBeenCalledOnce();
    expect(container.textContent).toContain("Logged.");
  });

  it("still takes a typed shot when used on a technique page", () => {
    render(<LogUseForm slug="marker-matrix" />);
    expect(container.querySelector("#use-shot")).not.toBeNull();
    // The technique comes from the page; only the shot field is a combobox.
    expect([...container.querySelectorAll("label")].map((l) => l.textContent)).not.toContain("Technique");
    expect(container.querySelectorAll('input[role="combobox"]')).toHaveLength(1);
  });

  it("matches every typed word in the title or summary, any case", () => {
    const t = TECHNIQUES.items[0]!;
    expect(matchesTechnique(t, "MATRIX marker")).toBe(true);
    expect(matchesTechnique(t, "cleanest")).toBe(true);
    expect(matchesTechnique(t, "matrix wire")).toBe(false);
  });
});

const use = (over: Partial<ShotUseResponse> = {}): ShotUseResponse => ({
  id: "11111111-1111-4111-8111-111111111111",
  technique: { id: "t1", slug: "marker-matrix", title: "Marker removal by channel matrix", status: "approved" },
  outcome: "touch-up",
  note: "first pass",
  user: { id: "p1", name: "Ann Artist" },
  beforeStill: "22222222-2222-4222-8222-222222222222",
  afterStill: null,
  beforeStillAlt: "Tracking markers on the green screen",
  afterStillAlt: null,
  revisionId: null,
  followUp: null,
  canEdit: true,
  createdAt: "2025-03-01T10:00:00Z",
  updatedAt: "2025-03-01T10:00:00Z",
  ...over,
});

describe("ShotUses", () => {
  it("shows still thumbnails with alt text linked to the preview", () => {
    render(<ShotUses uses={[use()]} />);
    const img = container.querySelector("img")!;
    expect(img.getAttribute("src")).toBe("/api/stills/22222222-2222-4222-8222-222222222222/thumb");
    expect(img.getAttribute("alt")).toBe("Tracking markers on the green screen");
    expect(img.closest("a")!.getAttribute("href")).toBe("/api/stills/22222222-2222-4222-8222-222222222222/preview");
  });

  it("highlights the follow-up for a retired technique with a link to its replacement", () => {
    render(
      <ShotUses
        uses={[
          use({
            technique: { id: "t2", slug: "old-clone", title: "Old clone-paint markers", status: "retired" },
            followUp: { note: "retired — see Marker removal, two-matrix method", replacement: { slug: "two-matrix", title: "Marker removal, two-matrix method" } },
          }),
        ]}
      />,
    );
    const note = container.querySelector('[data-testid="follow-up"]')!;
    expect(note.textContent).toContain("Old clone-paint markers is retired");
    expect(note.querySelector("a")!.getAttribute("href")).toBe("/techniques/two-matrix");
  });

  it("offers edit and delete only on logs the reader may change", () => {
    render(<ShotUses uses={[use({ canEdit: false })]} />);
    expect(buttons(/^Edit$|^Delete$/)).toHaveLength(0);
  });

  it("sends only what changed in an edit", async () => {
    render(<ShotUses uses={[use()]} />);
    act(() => button(/^Edit$/).click());
    expect(button(/Save changes/).disabled).toBe(true);
    act(() => container.querySelector<HTMLInputElement>('input[type="radio"][value="failed"]')!.click());
    act(() => container.querySelector<HTMLInputElement>('input[type="checkbox"]')!.click());
    await act(async () => button(/Save changes/).click());
    expect(calls).toEqual([{ url: "/api/uses/11111111-1111-4111-8111-111111111111", method: "PATCH", body: { outcome: "failed", beforeStill: null } }]);
    expect(refresh).toHaveBeenCalledOnce();
  });

  it("deletes only after confirmation", async () => {
    render(<ShotUses uses={[use()]} />);
    act(() => button(/^Delete$/).click());
    // Dialogs render into <body> (components/ui/modal.tsx), outside any form of the page.
    const dialog = document.querySelector("dialog")!;
    expect(dialog.open).toBe(true);
    expect(calls).toHaveLength(0);
    act(() => [...dialog.querySelectorAll("button")].find((b) => b.textContent === "Cancel")!.click());
    expect(calls).toHaveLength(0);

    act(() => button(/^Delete$/).click());
    await act(async () => [...dialog.querySelectorAll("button")].find((b) => /Delete log/.test(b.textContent ?? ""))!.click());
    expect(calls).toEqual([{ url: "/api/uses/11111111-1111-4111-8111-111111111111", method: "DELETE", body: undefined }]);
    expect(refresh).toHaveBeenCalledOnce();
  });
});

describe("show helpers", () => {
  it("counts a frame range with both ends included", () => {
    // An inclusive range n..m holds m − n + 1 frames (common practice, no published source).
    expect(frameRange({ frameStart: 1001, frameEnd: 1096 })).toBe("1001–1096 (96 frames)");
    expect(frameRange({ frameStart: 1001, frameEnd: 1001 })).toBe("1001–1001 (1 frame)");
    expect(frameRange({ frameStart: null, frameEnd: null })).toBe("—");
  });

  it("tries a code against the show's pattern, and reports a pattern that does not compile", () => {
    // SHOW_SEQ_SHOT with three-digit sequence and four-digit shot numbers (common practice, no published source).
    expect(patternAccepts(DEFAULT_SHOT_PATTERN, "SLM", "SLM_040_0120")).toBe(true);
    expect(patternAccepts(DEFAULT_SHOT_PATTERN, "SLM", "SLM_40_120")).toBe(false);
    expect(patternAccepts(DEFAULT_SHOT_PATTERN, "SLM", "LTH_040_0120")).toBe(false);
    expect(patternAccepts("(", "SLM", "SLM_040_0120")).toBeNull();
  });
});
