/*
 * Shortcut text in Tiptap's notation ("Mod-Alt-w") turned into what people read in a tooltip
 * and what aria-keyshortcuts expects (WAI-ARIA 1.2: "Control+Alt+W", "Meta+B").
 */

type ShortcutText = { label: string; aria: string };

export function isApplePlatform(): boolean {
  if (typeof navigator === "undefined") return false;
  return /Mac|iPhone|iPad/i.test(navigator.platform || navigator.userAgent);
}

export function describeShortcut(shortcut: string, isApple: boolean): ShortcutText {
  const parts = shortcut.split("-");
  const key = (parts.pop() ?? "").toUpperCase();
  const label: string[] = [];
  const aria: string[] = [];
  for (const part of parts) {
    if (part === "Mod") {
      label.push(isApple ? "⌘" : "Ctrl");
      aria.push(isApple ? "Meta" : "Control");
    } else if (part === "Alt") {
      label.push(isApple ? "⌥" : "Alt");
      aria.push("Alt");
    } else if (part === "Shift") {
      label.push(isApple ? "⇧" : "Shift");
      aria.push("Shift");
    }
  }
  label.push(key);
  aria.push(key);
  return { label: label.join(isApple ? "" : "+"), aria: aria.join("+") };
}
