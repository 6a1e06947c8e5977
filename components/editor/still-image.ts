import { Node } from "@tiptap/react";

declare module "@tiptap/core" {
  interface Commands<ReturnType> {
    still: {
      /** Insert one of Plateroom's own stills (uploaded first; never an outside image URL). */
      insertStill: (attrs: { stillId: string; alt: string; caption?: string }) => ReturnType;
    };
  }
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const PREVIEW_PATH = /^\/api\/stills\/([0-9a-f-]{36})\/preview$/i;

function stillPreviewUrl(stillId: string): string {
  return `/api/stills/${encodeURIComponent(stillId)}/preview`;
}

function stillIdFrom(figure: HTMLElement): string | null {
  const fromData = figure.getAttribute("data-still-id");
  if (fromData && UUID.test(fromData)) return fromData.toLowerCase();
  const src = figure.querySelector("img")?.getAttribute("src") ?? "";
  const match = PREVIEW_PATH.exec(src);
  return match?.[1] && UUID.test(match[1]) ? match[1].toLowerCase() : null;
}

/**
 * A still from Plateroom's own store, by id. There is no src attribute to set: the preview URL
 * is built from the id, so a document cannot point an image anywhere else.
 */
export const StillImage = Node.create({
  name: "still",
  group: "block",
  atom: true,
  draggable: true,
  selectable: true,

  addAttributes() {
    return {
      stillId: { default: null, rendered: false },
      alt: { default: "", rendered: false },
      caption: { default: "", rendered: false },
    };
  },

  parseHTML() {
    const getAttrs = (element: HTMLElement) => {
      const stillId = stillIdFrom(element);
      if (stillId === null) return false;
      return {
        stillId,
        alt: element.querySelector("img")?.getAttribute("alt") ?? "",
        caption: element.querySelector("figcaption")?.textContent?.trim() ?? "",
      };
    };
    return [
      { tag: "figure[data-still-id]", getAttrs },
      { tag: "figure.still", getAttrs },
    ];
  },

  renderHTML({ node }) {
    const { stillId, alt, caption } = node.attrs as { stillId: string; alt: string; caption: string };
    const img = ["img", { src: stillPreviewUrl(stillId), alt, loading: "lazy", draggable: "false" }] as const;
    return caption
      ? ["figure", { class: "still", "data-still-id": stillId }, img, ["figcaption", {}, caption]]
      : ["figure", { class: "still", "data-still-id": stillId }, img];
  },

  addCommands() {
    return {
      insertStill:
        ({ stillId, alt, caption = "" }) =>
        ({ commands }) =>
          UUID.test(stillId)
            ? commands.insertContent({ type: this.name, attrs: { stillId: stillId.toLowerCase(), alt, caption } })
            : false,
    };
  },
});
