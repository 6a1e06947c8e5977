import { CodeBlock } from "@tiptap/extension-code-block";
import { Link } from "@tiptap/extension-link";
import { Placeholder } from "@tiptap/extension-placeholder";
import { TableKit } from "@tiptap/extension-table";
import type { Extensions } from "@tiptap/react";
import { StarterKit } from "@tiptap/starter-kit";

import { Callout } from "@/components/editor/callout";
import { StillImage } from "@/components/editor/still-image";
import { HEADING_LEVELS, safeHref } from "@/lib/techniques/document";

const LANGUAGE = /^[A-Za-z0-9][A-Za-z0-9+#._-]{0,31}$/;

// Only href is stored: rel/target come from the renderer, never from the document
// (lib/techniques/document.ts refuses any other link attribute).
const SafeLink = Link.extend({
  addAttributes() {
    return { href: { default: null, parseHTML: (element: HTMLElement) => element.getAttribute("href") } };
  },
});

// A pasted "language-…" class that our schema would refuse becomes no language instead of a 400.
const SafeCodeBlock = CodeBlock.extend({
  addAttributes() {
    return {
      language: {
        default: null,
        parseHTML: (element: HTMLElement) => {
          const cls = [...(element.firstElementChild?.classList ?? [])].find((c) => c.startsWith("language-"));
          const language = cls?.slice("language-".length);
          return language && LANGUAGE.test(language) ? language : null;
        },
        rendered: false,
      },
    };
  },
});

type EditorExtensionOptions = { placeholder?: string };

/** Everything the technique editor can make, and nothing the document schema would refuse. */
export function createEditorExtensions({ placeholder }: EditorExtensionOptions = {}): Extensions {
  return [
    StarterKit.configure({
      heading: { levels: [...HEADING_LEVELS] },
      strike: false,
      underline: false,
      link: false,
      codeBlock: false,
    }),
    SafeCodeBlock.configure({ defaultLanguage: null, languageClassPrefix: "language-" }),
    SafeLink.configure({
      openOnClick: false,
      autolink: true,
      linkOnPaste: true,
      defaultProtocol: "https",
      isAllowedUri: (url) => safeHref(url) !== null,
      HTMLAttributes: { rel: "noopener noreferrer nofollow", target: null, class: null },
    }),
    TableKit.configure({ table: { resizable: false } }),
    Callout,
    StillImage,
    ...(placeholder ? [Placeholder.configure({ placeholder })] : []),
  ];
}
