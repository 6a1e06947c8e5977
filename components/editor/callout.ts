import { mergeAttributes, Node } from "@tiptap/react";

import { CALLOUT_KINDS, CALLOUT_LABELS, type CalloutKind } from "@/lib/techniques/document";

declare module "@tiptap/core" {
  interface Commands<ReturnType> {
    callout: {
      /** Wrap the selection in a callout, or change the kind of the one it is in. */
      setCallout: (kind: CalloutKind) => ReturnType;
      /** Same as setCallout, but lifts the content out when it already is this kind. */
      toggleCallout: (kind: CalloutKind) => ReturnType;
      unsetCallout: () => ReturnType;
    };
  }
}

/** Keyboard shortcuts for the three kinds, shown in the toolbar too. */
export const CALLOUT_SHORTCUTS: Record<CalloutKind, string> = {
  works: "Mod-Alt-w",
  fails: "Mod-Alt-f",
  caution: "Mod-Alt-u",
};

function kindFrom(element: HTMLElement): CalloutKind {
  const data = element.getAttribute("data-callout");
  if (CALLOUT_KINDS.includes(data as CalloutKind)) return data as CalloutKind;
  const fromClass = CALLOUT_KINDS.find((k) => element.classList.contains(`callout-${k}`));
  return fromClass ?? "caution";
}

/**
 * A boxed note with a kind — works when / fails when / caution — that holds ordinary blocks.
 * The same markup as lib/techniques/render.ts, so pasting a rendered page back in keeps it.
 */
export const Callout = Node.create({
  name: "callout",
  group: "block",
  content: "block+",
  defining: true,

  addAttributes() {
    return {
      kind: {
        default: "works" satisfies CalloutKind,
        parseHTML: kindFrom,
        rendered: false,
      },
    };
  },

  parseHTML() {
    return [
      // The label is derived from the kind; never read it back in as text.
      { tag: "p.callout-label", ignore: true, priority: 60 },
      { tag: "aside[data-callout]" },
      { tag: "aside.callout" },
    ];
  },

  renderHTML({ node, HTMLAttributes }) {
    const kind: CalloutKind = CALLOUT_KINDS.includes(node.attrs.kind) ? node.attrs.kind : "caution";
    return [
      "aside",
      mergeAttributes(HTMLAttributes, { "data-callout": kind, class: `callout callout-${kind}`, role: "note" }),
      ["p", { class: "callout-label", contenteditable: "false" }, CALLOUT_LABELS[kind]],
      ["div", { class: "callout-body" }, 0],
    ];
  },

  addCommands() {
    return {
      setCallout:
        (kind) =>
        ({ commands, editor }) =>
          editor.isActive(this.name)
            ? commands.updateAttributes(this.name, { kind })
            : commands.wrapIn(this.name, { kind }),
      toggleCallout:
        (kind) =>
        ({ commands, editor }) => {
          if (editor.isActive(this.name, { kind })) return commands.lift(this.name);
          if (editor.isActive(this.name)) return commands.updateAttributes(this.name, { kind });
          return commands.wrapIn(this.name, { kind });
        },
      unsetCallout:
        () =>
        ({ commands }) =>
          commands.lift(this.name),
    };
  },

  addKeyboardShortcuts() {
    return Object.fromEntries(
      CALLOUT_KINDS.map((kind) => [CALLOUT_SHORTCUTS[kind], () => this.editor.commands.toggleCallout(kind)]),
    );
  },
});
