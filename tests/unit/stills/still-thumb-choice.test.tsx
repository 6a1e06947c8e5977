// @vitest-environment jsdom
import { act } from "react";
import { describe, expect, it, vi } from "vitest";
import { DenoisedStillPicker, RecipeStillsProvider } from "@/components/lab/recipe/denoised-still-picker";
import { PairEditor } from "@/components/stills/pair-editor";
import { mountEachTest } from "@/tests/unit/dom-root";

/* The still thumbnails both pickers offer are one card: a radio button named by the still's alt text. */

const STILLS = [
  { id: "11111111-1111-4111-8111-111111111111", alt: "Sky with dust", role: "before" as const, width: 64, height: 36 },
  { id: "22222222-2222-4222-8222-222222222222", alt: "Sky after dust lift", role: "after" as const, width: 64, height: 36 },
  { id: "33333333-3333-4333-8333-333333333333", alt: "Denoised sky", role: "reference" as const, width: 64, height: 36 },
];

const dom = mountEachTest();

const radios = (within: Element = dom.host) => [...within.querySelectorAll<HTMLInputElement>('input[type="radio"]')];
const labelOf = (input: HTMLInputElement) => input.closest("label")!;

describe("still thumbnail choice", () => {
  it("in the pair editor: one card a still in each group, with thumbnail, alt text and size; picking one checks it", () => {
    dom.render(<PairEditor technique="dust-lift" stills={STILLS} />);
    const [before, after] = [...dom.host.querySelectorAll("fieldset")];
    expect(radios(before)).toHaveLength(3);
    expect(radios(after)).toHaveLength(3);
    // Starting choices follow the stills' roles.
    expect(radios(before).map((r) => r.checked)).toEqual([true, false, false]);
    expect(radios(after).map((r) => r.checked)).toEqual([false, true, false]);
    const card = labelOf(radios(before)[2]!);
    expect(card.querySelector("img")!.getAttribute("src")).toBe(`/api/stills/${STILLS[2]!.id}/thumb`);
    expect(card.querySelector("img")!.getAttribute("alt")).toBe("Denoised sky");
    expect(card.textContent).toContain("64×36 · reference");
    act(() => radios(before)[2]!.click());
    expect(radios(before).map((r) => r.checked)).toEqual([false, false, true]);
    expect(labelOf(radios(before)[2]!).className).toContain("border-accent");
  });

  it("in the recipe's denoised-plate picker: the same cards, and a pick reports the still's id", () => {
    const onChange = vi.fn();
    dom.render(
      <RecipeStillsProvider stills={STILLS}>
        <DenoisedStillPicker id="grain" value={STILLS[0]!.id} onChange={onChange} />
      </RecipeStillsProvider>,
    );
    expect(radios().map((r) => r.checked)).toEqual([true, false, false]);
    expect(radios().map((r) => labelOf(r).querySelector("img")!.getAttribute("alt"))).toEqual(["Sky with dust", "Sky after dust lift", "Denoised sky"]);
    act(() => radios()[2]!.click());
    expect(onChange).toHaveBeenCalledWith(STILLS[2]!.id);
  });
});
