// @vitest-environment jsdom
import { act } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { CompareView } from "@/components/stills/compare-view";
import type { StillResponse } from "@/lib/stills/schemas";

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

function still(id: string, alt: string, role: StillResponse["role"]): StillResponse {
  return {
    id,
    width: 64,
    height: 36,
    format: "png",
    bitDepth: 8,
    sha256: "0".repeat(64),
    channels: 3,
    alt,
    caption: "",
    credit: "",
    role,
    owner: "technique",
    techniqueId: null,
    uploaderId: null,
    colourSpace: "srgb",
    pixelAspectRatio: 1,
    exr: null,
    sizeBytes: 1000,
    createdAt: "2026-01-01T00:00:00.000Z",
  };
}

let host: HTMLDivElement;
let root: Root;
beforeEach(() => {
  host = document.createElement("div");
  document.body.append(host);
  root = createRoot(host);
  act(() => { root.render(<CompareView before={still("b", "Screen with markers", "before")} after={still("a", "Screen after marker removal", "after")} />); });
});
afterEach(() => {
  act(() => { root.unmount(); });
  host.remove();
});

const slider = () => host.querySelector<HTMLElement>('[role="slider"]')!;
const press = (key: string, shiftKey = false) => act(() => { slider().dispatchEvent(new KeyboardEvent("keydown", { key, shiftKey, bubbles: true })); });

// Expected keys: WAI-ARIA Authoring Practices 1.2, Slider pattern, "Keyboard Interaction":
// Right/Up one step up, Left/Down one step down, Page Up/Down a larger step, Home/End the ends.
describe("compare divider keyboard (WAI-ARIA APG slider pattern)", () => {
  it("is a focusable slider from 0 to 100 starting in the middle", () => {
    expect(slider().tabIndex).toBe(0);
    expect(slider().getAttribute("aria-valuemin")).toBe("0");
    expect(slider().getAttribute("aria-valuemax")).toBe("100");
    expect(slider().getAttribute("aria-valuenow")).toBe("50");
  });

  it("arrow keys move one step, Page keys ten, Home and End to the ends", () => {
    press("ArrowRight");
    expect(slider().getAttribute("aria-valuenow")).toBe("51");
    press("ArrowDown");
    press("ArrowDown");
    expect(slider().getAttribute("aria-valuenow")).toBe("49");
    press("PageUp");
    expect(slider().getAttribute("aria-valuenow")).toBe("59");
    press("Home");
    expect(slider().getAttribute("aria-valuenow")).toBe("0");
    press("ArrowLeft");
    expect(slider().getAttribute("aria-valuenow")).toBe("0");
    press("End");
    expect(slider().getAttribute("aria-valuenow")).toBe("100");
  });

  it("the after image is clipped at the divider; both images carry alt text", () => {
    press("Home");
    const imgs = [...host.querySelectorAll("img")];
    expect(imgs.map((i) => i.alt)).toEqual(["Before: Screen with markers", "After: Screen after marker removal"]);
    expect(imgs[1]!.style.clipPath).toBe("inset(0 0 0 0%)");
    expect(imgs[0]!.getAttribute("src")).toBe("/api/stills/b/preview");
  });
});

describe("compare modes", () => {
  it("toggle shows one still at a time and switches on request", () => {
    const button = (text: string) => [...host.querySelectorAll("button")].find((b) => b.textContent?.startsWith(text))!;
    act(() => { button("Toggle").click(); });
    expect(host.querySelector('[role="slider"]')).toBeNull();
    expect([...host.querySelectorAll("img")].map((i) => i.alt)).toEqual(["Before: Screen with markers"]);
    act(() => { button("Showing before").click(); });
    expect([...host.querySelectorAll("img")].map((i) => i.alt)).toEqual(["After: Screen after marker removal"]);
  });

  it("100 % uses the original for PNG stills; the luminance view applies the BT.709 filter", () => {
    const button = (text: string) => [...host.querySelectorAll("button")].find((b) => b.textContent === text)!;
    act(() => { button("100 %").click(); });
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/b/original");
    act(() => { button("Luminance (BT.709)").click(); });
    const filter = host.querySelector("img")!.style.filter;
    const id = /url\("?#([^")]+)"?\)/.exec(filter)?.[1];
    expect(id).toBeTruthy();
    const matrix = host.querySelector(`[id="${id}"] feColorMatrix`)!.getAttribute("values")!.split(" ").map(Number);
    // ITU-R BT.709-6 item 3.2 weights in the first row.
    expect(matrix.slice(0, 3)).toEqual([0.2126, 0.7152, 0.0722]);
  });
});

describe("zoom, display and full screen", () => {
  const button = (text: string) => [...host.querySelectorAll("button")].find((b) => b.textContent === text)!;

  it("200 % and up draw each image pixel as a block of screen pixels (nearest neighbour), twice the 100 % size", () => {
    act(() => button("100 %").click());
    const at100 = host.querySelector<HTMLElement>("img")!.parentElement!.style.width;
    act(() => button("200 %").click());
    const img = host.querySelector<HTMLImageElement>("img")!;
    // CSS Images Level 3 §5.4: image-rendering: pixelated scales with nearest neighbour.
    expect(img.style.imageRendering).toBe("pixelated");
    expect(parseFloat(img.parentElement!.style.width)).toBe(2 * parseFloat(at100));
    expect(img.getAttribute("src")).toBe("/api/stills/b/original");
  });

  it("exposure and the out-of-range view change the image the server renders, once the controls settle", async () => {
    const settle = () => act(async () => void (await new Promise((r) => setTimeout(r, 400))));
    act(() => button("Values outside 0–1").click());
    await settle();
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/b/preview?view=range");
    const up = host.querySelector<HTMLButtonElement>('[aria-label="Exposure up 0.5 stop"]')!;
    act(() => up.click());
    act(() => up.click());
    // Two quick clicks: one render asked for, not two.
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/b/preview?view=range");
    await settle();
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/b/preview?exposure=1&view=range");
    act(() => button("100 %").click());
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/b/display?exposure=1&view=range");
  });

  it("says it is rendering from a change of image until the new one has loaded", async () => {
    const loadAll = () => act(() => host.querySelectorAll("img").forEach((i) => i.dispatchEvent(new Event("load"))));
    const status = () => [...host.querySelectorAll('[role="status"]')].map((e) => e.textContent);
    loadAll();
    expect(status()).not.toContain("Rendering…");
    act(() => host.querySelector<HTMLButtonElement>('[aria-label="Exposure down 0.5 stop"]')!.click());
    await act(async () => void (await new Promise((r) => setTimeout(r, 400))));
    expect(status()).toContain("Rendering…");
    loadAll();
    expect(status()).not.toContain("Rendering…");
  });

  it("the full-screen button asks the browser to show the compare view full screen, and leaves again", () => {
    act(() => root.unmount());
    Object.defineProperty(document, "fullscreenEnabled", { value: true, configurable: true });
    const request = vi.fn(() => Promise.resolve());
    HTMLElement.prototype.requestFullscreen = request;
    root = createRoot(host);
    act(() => root.render(<CompareView before={still("b", "Screen with markers", "before")} after={still("a", "Screen after marker removal", "after")} />));
    const full = button("Full screen");
    expect(full.getAttribute("aria-pressed")).toBe("false");
    act(() => full.click());
    expect(request.mock.contexts[0]).toBe(host.querySelector("figure"));
  });
});

describe("stills a browser cannot show as stored", () => {
  it("OpenEXR at 100 % loads the full-size display image, not the original", () => {
    const exr: StillResponse = { ...still("e", "Linear plate", "before"), format: "exr", bitDepth: 16, colourSpace: "acescg" };
    act(() => root.render(<CompareView before={exr} after={{ ...exr, id: "f" }} />));
    act(() => [...host.querySelectorAll("button")].find((b) => b.textContent === "100 %")!.click());
    expect(host.querySelector("img")!.getAttribute("src")).toBe("/api/stills/e/display");
    expect(host.textContent).toContain("ACEScg (linear, AP1)");
  });
});
