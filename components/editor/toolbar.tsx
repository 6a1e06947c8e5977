import { useEditorState, type Editor } from "@tiptap/react";
import { Fragment, useLayoutEffect, useRef, useSyncExternalStore, type KeyboardEvent, type ReactNode } from "react";

import { CALLOUT_SHORTCUTS } from "@/components/editor/callout";
import { isApplePlatform } from "@/components/editor/shortcuts";
import { ToolbarButton } from "@/components/editor/toolbar-button";
import { CALLOUT_KINDS, CALLOUT_LABELS, HEADING_LEVELS } from "@/lib/techniques/document";

type EditorToolbarProps = {
  editor: Editor;
  /** id of the editable area, for aria-controls */
  controlsId: string;
  onOpenLink(): void;
  onOpenStill(): void;
  canAddStill: boolean;
};

type Item = {
  key: string;
  label: string;
  text: ReactNode;
  run(): void;
  shortcut?: string;
  isActive?: boolean;
  isDisabled?: boolean;
};

const noSubscription = () => () => {};

const CALLOUT_GLYPH = { works: "✓ Works", fails: "✗ Fails", caution: "! Caution" } as const;

/**
 * Formatting toolbar: one tab stop, arrow keys move between buttons (WAI-ARIA Authoring
 * Practices, Toolbar pattern).
 */
export function EditorToolbar({ editor, controlsId, onOpenLink, onOpenStill, canAddStill }: EditorToolbarProps) {
  const ref = useRef<HTMLDivElement>(null);
  const stop = useRef<HTMLButtonElement | null>(null);
  // false on the server and during hydration, the real platform afterwards.
  const isApple = useSyncExternalStore(noSubscription, isApplePlatform, () => false);

  const s = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      headings: HEADING_LEVELS.map((level) => e.isActive("heading", { level })),
      bold: e.isActive("bold"),
      italic: e.isActive("italic"),
      code: e.isActive("code"),
      link: e.isActive("link"),
      bulletList: e.isActive("bulletList"),
      orderedList: e.isActive("orderedList"),
      blockquote: e.isActive("blockquote"),
      codeBlock: e.isActive("codeBlock"),
      callouts: CALLOUT_KINDS.map((kind) => e.isActive("callout", { kind })),
      still: e.isActive("still"),
      inTable: e.can().addRowAfter(),
      canUndo: e.can().undo(),
      canRedo: e.can().redo(),
    }),
  });

  // Roving tabindex: exactly one enabled button is reachable with Tab, the one last focused.
  function placeStop(next: HTMLButtonElement | null) {
    const buttons = [...(ref.current?.querySelectorAll<HTMLButtonElement>("button") ?? [])];
    const enabled = buttons.filter((b) => !b.disabled);
    stop.current = next && enabled.includes(next) ? next : (enabled[0] ?? null);
    for (const b of buttons) b.tabIndex = b === stop.current ? 0 : -1;
  }
  useLayoutEffect(() => placeStop(stop.current));

  function onKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    const enabled = [...(ref.current?.querySelectorAll<HTMLButtonElement>("button:not([disabled])") ?? [])];
    const at = enabled.indexOf(document.activeElement as HTMLButtonElement);
    const last = enabled.length - 1;
    const next = { ArrowRight: at + 1 > last ? 0 : at + 1, ArrowLeft: at - 1 < 0 ? last : at - 1, Home: 0, End: last }[
      event.key
    ];
    if (next === undefined || at < 0) return;
    event.preventDefault();
    enabled[next]?.focus();
  }

  if (!s) return null;
  const chain = () => editor.chain().focus();
  const groups: Item[][] = [
    HEADING_LEVELS.map((level, i) => ({
      key: `h${level}`,
      // The accessible name holds the visible label (WCAG 2.1 SC 2.5.3, Label in Name).
      label: `H${level} heading`,
      text: `H${level}`,
      shortcut: `Mod-Alt-${level}`,
      isActive: s.headings[i],
      run: () => chain().toggleHeading({ level }).run(),
    })),
    [
      { key: "bold", label: "Bold", text: <b>B</b>, shortcut: "Mod-b", isActive: s.bold, run: () => chain().toggleBold().run() },
      { key: "italic", label: "Italic", text: <i>I</i>, shortcut: "Mod-i", isActive: s.italic, run: () => chain().toggleItalic().run() },
      { key: "code", label: "Inline code", text: <code>{"<>"}</code>, shortcut: "Mod-e", isActive: s.code, run: () => chain().toggleCode().run() },
      { key: "link", label: "Link", text: "Link", shortcut: "Mod-k", isActive: s.link, run: onOpenLink },
    ],
    [
      { key: "ul", label: "Bulleted list", text: "• List", shortcut: "Mod-Shift-8", isActive: s.bulletList, run: () => chain().toggleBulletList().run() },
      { key: "ol", label: "1. List (numbered)", text: "1. List", shortcut: "Mod-Shift-7", isActive: s.orderedList, run: () => chain().toggleOrderedList().run() },
      { key: "quote", label: "Block quote", text: "❝ Quote", shortcut: "Mod-Shift-b", isActive: s.blockquote, run: () => chain().toggleBlockquote().run() },
      { key: "pre", label: "Code block", text: "{ } Code", shortcut: "Mod-Alt-c", isActive: s.codeBlock, run: () => chain().toggleCodeBlock().run() },
      { key: "hr", label: "Divider line", text: "―", run: () => chain().setHorizontalRule().run() },
    ],
    CALLOUT_KINDS.map((kind, i) => ({
      key: `callout-${kind}`,
      label: `${CALLOUT_LABELS[kind]} note`,
      text: CALLOUT_GLYPH[kind],
      shortcut: CALLOUT_SHORTCUTS[kind],
      isActive: s.callouts[i],
      run: () => chain().toggleCallout(kind).run(),
    })),
    [
      { key: "table", label: "Insert table", text: "Table", isDisabled: s.inTable, run: () => chain().insertTable({ rows: 3, cols: 3, withHeaderRow: true }).run() },
      { key: "row+", label: "Add row below", text: "+Row", isDisabled: !s.inTable, run: () => chain().addRowAfter().run() },
      { key: "col+", label: "Add column to the right", text: "+Column", isDisabled: !s.inTable, run: () => chain().addColumnAfter().run() },
      { key: "row-", label: "Delete row", text: "−Row", isDisabled: !s.inTable, run: () => chain().deleteRow().run() },
      { key: "col-", label: "Delete column", text: "−Column", isDisabled: !s.inTable, run: () => chain().deleteColumn().run() },
      { key: "thead", label: "Header row on or off", text: "Header", isDisabled: !s.inTable, run: () => chain().toggleHeaderRow().run() },
      { key: "table-", label: "Delete table", text: "✕ Table", isDisabled: !s.inTable, run: () => chain().deleteTable().run() },
    ],
    [
      { key: "still", label: s.still ? "Edit still description" : "Add a still", text: "Still", isDisabled: !canAddStill && !s.still, run: onOpenStill },
    ],
    [
      { key: "undo", label: "Undo", text: "↶", shortcut: "Mod-z", isDisabled: !s.canUndo, run: () => chain().undo().run() },
      { key: "redo", label: "Redo", text: "↷", shortcut: "Mod-Shift-z", isDisabled: !s.canRedo, run: () => chain().redo().run() },
    ],
  ];

  return (
    <div
      ref={ref}
      role="toolbar"
      aria-label="Formatting"
      aria-controls={controlsId}
      onKeyDown={onKeyDown}
      onFocus={(event) => {
        if (event.target instanceof HTMLButtonElement) placeStop(event.target);
      }}
      className="sticky top-0 z-10 flex flex-wrap items-center gap-0.5 border-b border-line bg-surface-2 p-1"
    >
      {groups.map((group, g) => (
        <Fragment key={group[0]?.key ?? g}>
          {g > 0 && <div role="separator" aria-orientation="vertical" className="mx-1 h-5 w-px bg-line" />}
          {group.map(({ key, text, run, ...item }) => (
            <ToolbarButton key={key} isApple={isApple} onClick={run} {...item}>
              {text}
            </ToolbarButton>
          ))}
        </Fragment>
      ))}
    </div>
  );
}
