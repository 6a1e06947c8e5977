// @vitest-environment jsdom
import { act } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, expect, test, vi } from "vitest";

import { TechniqueEditor } from "@/components/editor/editor";
import { documentFromText } from "@/lib/techniques/document";

/* The toolbar follows the WAI-ARIA Authoring Practices toolbar pattern: role=toolbar, one tab
   stop, arrow keys / Home / End move focus between enabled buttons, toggles report aria-pressed. */

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

let root: Root;
let host: HTMLDivElement;

beforeEach(async () => {
  // jsdom has no layout; ProseMirror asks for these while focusing and scrolling.
  Range.prototype.getClientRects = () => [] as unknown as DOMRectList;
  Range.prototype.getBoundingClientRect = () => new DOMRect();
  document.elementFromPoint = () => null;
  host = document.createElement("div");
  document.body.append(host);
  root = createRoot(host);
  await act(async () => root.render(<TechniqueEditor value={documentFromText("Sample the marker.")} onChange={vi.fn()} labelledBy="body-label" />));
});
afterEach(() => {
  act(() => root.unmount());
  host.remove();
});

const buttons = () => [...host.querySelectorAll<HTMLButtonElement>('[role="toolbar"] button')];
const press = (key: string) =>
  act(() => {
    document.activeElement?.dispatchEvent(new KeyboardEvent("keydown", { key, bubbles: true }));
  });

test("toolbar: labelled buttons, a single tab stop, arrow-key movement", () => {
  const toolbar = host.querySelector('[role="toolbar"]');
  expect(toolbar?.getAttribute("aria-label")).toBe("Formatting");
  const all = buttons();
  expect(all.length).toBeGreaterThan(20);
  for (const b of all) expect(b.getAttribute("aria-label")).toBeTruthy();
  expect(all.filter((b) => b.tabIndex === 0)).toHaveLength(1);

  const enabled = all.filter((b) => !b.disabled);
  act(() => enabled[0]!.focus());
  press("ArrowRight");
  expect(document.activeElement).toBe(enabled[1]);
  press("End");
  expect(document.activeElement).toBe(enabled.at(-1));
  press("ArrowRight");
  expect(document.activeElement).toBe(enabled[0]);
  press("ArrowLeft");
  expect(document.activeElement).toBe(enabled.at(-1));
  expect(buttons().filter((b) => b.tabIndex === 0)).toEqual([enabled.at(-1)]);
});

test("the editable area is a labelled multi-line textbox the toolbar controls", () => {
  const area = host.querySelector('[contenteditable="true"]');
  expect(area?.getAttribute("role")).toBe("textbox");
  expect(area?.getAttribute("aria-labelledby")).toBe("body-label");
  expect(host.querySelector('[role="toolbar"]')?.getAttribute("aria-controls")).toBe(area?.id);
  expect(area?.textContent).toBe("Sample the marker.");
});

test("table tools are disabled outside a table; callout buttons are toggles", () => {
  const byLabel = (label: string) => buttons().find((b) => b.getAttribute("aria-label") === label);
  expect(byLabel("Add row below")?.disabled).toBe(true);
  expect(byLabel("Insert table")?.disabled).toBe(false);
  expect(byLabel("Works when note")?.getAttribute("aria-pressed")).toBe("false");
  expect(byLabel("Works when note")?.getAttribute("aria-keyshortcuts")).toBe("Control+Alt+W");
  expect(byLabel("Add a still")?.disabled).toBe(true); // no upload handler given
});
