// @vitest-environment jsdom
import { act } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, describe, expect, test, vi } from "vitest";

import {
  draftStorageKey,
  techniqueDraftSchema,
  useDraftRecovery,
  type DraftRecovery,
  type TechniqueDraft,
} from "@/components/editor/use-draft-recovery";
import { documentFromText } from "@/lib/techniques/document";

/* Local draft recovery: offered, never applied on its own, and not overwritten while on offer. */

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const KEY = "technique:marker-removal";
const loaded: TechniqueDraft = {
  title: "Marker removal",
  summary: "Hide markers in the cleanest channel.",
  aliases: ["dot removal"],
  tags: ["tracking markers"],
  body: documentFromText("Sample the marker."),
};
const edited: TechniqueDraft = { ...loaded, summary: "Hide markers, then restore grain." };

let root: Root;
let current: DraftRecovery<TechniqueDraft>;
const onRestore = vi.fn();

function Harness({ value, report }: { value: TechniqueDraft; report(r: DraftRecovery<TechniqueDraft>): void }) {
  report(useDraftRecovery({ draftKey: KEY, value, loaded, schema: techniqueDraftSchema, onRestore, debounceMs: 500 }));
  return null;
}

function render(value: TechniqueDraft) {
  act(() => { root.render(<Harness value={value} report={(r) => (current = r)} />); });
}

function store(value: unknown) {
  localStorage.setItem(draftStorageKey(KEY), JSON.stringify({ v: 1, savedAt: "2025-03-04T10:00:00.000Z", value }));
}

const stored = () => {
  const raw = localStorage.getItem(draftStorageKey(KEY));
  return raw === null ? null : (JSON.parse(raw) as { value: TechniqueDraft }).value;
};

beforeEach(() => {
  vi.useFakeTimers();
  localStorage.clear();
  onRestore.mockReset();
  root = createRoot(document.createElement("div"));
});
afterEach(() => {
  act(() => { root.unmount(); });
  vi.useRealTimers();
});

describe("saving", () => {
  test("edits are stored after the debounce, and removed when the form is back to what was loaded", () => {
    render(loaded);
    render(edited);
    expect(stored()).toBeNull();
    act(() => { vi.advanceTimersByTime(500); });
    expect(stored()).toEqual(edited);
    render(loaded);
    act(() => { vi.advanceTimersByTime(500); });
    expect(stored()).toBeNull();
  });

  test("clear() after a successful save removes the draft and keeps it removed", () => {
    render(loaded);
    render(edited);
    act(() => { vi.advanceTimersByTime(500); });
    act(() => { current.clear(); });
    render(edited);
    act(() => { vi.advanceTimersByTime(1000); });
    expect(stored()).toBeNull();
  });
});

describe("offering", () => {
  test("a different stored draft is offered, not applied, and not overwritten while on offer", () => {
    store(edited);
    render(loaded);
    expect(current.recoverable).toEqual(edited);
    expect(current.savedAt?.toISOString()).toBe("2025-03-04T10:00:00.000Z");
    expect(onRestore).not.toHaveBeenCalled();
    render({ ...loaded, title: "Typing before deciding" });
    act(() => { vi.advanceTimersByTime(2000); });
    expect(stored()).toEqual(edited);
  });

  test("restore() hands the draft over once", () => {
    store(edited);
    render(loaded);
    act(() => { void current.restore(); });
    expect(onRestore).toHaveBeenCalledExactlyOnceWith(edited);
    expect(current.recoverable).toBeNull();
  });

  test("discard() deletes it", () => {
    store(edited);
    render(loaded);
    act(() => { current.discard(); });
    expect(current.recoverable).toBeNull();
    expect(stored()).toBeNull();
  });

  test("a stored draft equal to the loaded form (keys in another order) is not offered", () => {
    const reordered = Object.fromEntries(Object.entries(loaded).reverse());
    store(reordered);
    render(loaded);
    expect(current.recoverable).toBeNull();
    expect(stored()).toBeNull();
  });

  test.each([
    ["not JSON", "{"],
    ["an unknown version", JSON.stringify({ v: 2, savedAt: "x", value: edited })],
    ["a body the schema refuses", JSON.stringify({ v: 1, savedAt: "x", value: { ...edited, body: { type: "doc", content: [{ type: "script" }] } } })],
  ])("%s is ignored", (_name, raw) => {
    localStorage.setItem(draftStorageKey(KEY), raw);
    render(loaded);
    expect(current.recoverable).toBeNull();
  });
});
