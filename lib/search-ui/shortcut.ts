/**
 * Whether a key press should open the quick finder: Ctrl+K / ⌘K anywhere except where people type
 * (inputs, text areas, selects, editable content and the rich-text editor, which uses Mod-K for
 * links), and "/" under the same rule.
 */
export function isFinderShortcut(e: Pick<KeyboardEvent, "key" | "ctrlKey" | "metaKey" | "altKey" | "shiftKey" | "isComposing" | "defaultPrevented" | "target">): boolean {
  if (e.defaultPrevented || e.isComposing) return false;
  const isModK = (e.ctrlKey || e.metaKey) && !e.altKey && !e.shiftKey && e.key.toLowerCase() === "k";
  const isSlash = e.key === "/" && !e.ctrlKey && !e.metaKey && !e.altKey;
  if (!isModK && !isSlash) return false;
  return !isTypingTarget(e.target);
}

type MaybeElement = { closest?(selector: string): unknown; isContentEditable?: boolean } | null;

// Inputs that take no typed text; a focused checkbox should not swallow the "/" shortcut.
const NON_TEXT_INPUTS = new Set(["checkbox", "radio", "button", "submit", "reset", "range", "color", "file", "image"]);

export function isTypingTarget(target: EventTarget | null): boolean {
  const el = target as MaybeElement;
  if (!el || typeof el.closest !== "function") return false;
  if (el.isContentEditable) return true;
  if (el.closest('textarea, select, [contenteditable=""], [contenteditable="true"], .ProseMirror')) return true;
  const input = el.closest("input") as { type?: string } | null;
  return Boolean(input && !NON_TEXT_INPUTS.has((input.type || "text").toLowerCase()));
}
