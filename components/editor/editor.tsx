"use client";

import type { EditorView } from "@tiptap/pm/view";
import { EditorContent, useEditor, type Editor } from "@tiptap/react";
import { useEffect, useId, useRef, useState } from "react";

import { DraftBanner } from "@/components/editor/draft-banner";
import { createEditorExtensions } from "@/components/editor/extensions";
import { imageFilesFrom } from "@/components/editor/image-files";
import { LinkDialog } from "@/components/editor/link-dialog";
import { StillDialog, type StillDialogValue } from "@/components/editor/still-dialog";
import { EditorToolbar } from "@/components/editor/toolbar";
import { useDraftRecovery } from "@/components/editor/use-draft-recovery";
import { techniqueDocumentSchema, type TechniqueDocument } from "@/lib/techniques/document";

export type UploadImage = (file: File) => Promise<{ stillId: string; alt: string }>;

type TechniqueEditorProps = {
  value: TechniqueDocument;
  onChange(doc: TechniqueDocument): void;
  /** Keeps an unsaved body in this browser and offers it back; leave unset when the whole form uses useDraftRecovery. */
  draftKey?: string;
  /** Uploads a dropped, pasted or chosen image as a still; without it images cannot be added. */
  onUploadImage?: UploadImage;
  /** id of the visible label of the body field */
  labelledBy?: string;
  placeholder?: string;
};

const NO_TEXT: StillDialogValue = { alt: "", caption: "" };

/** The rich-text editor for technique bodies (Tiptap), with its toolbar and dialogs. */
export function TechniqueEditor({ value, onChange, draftKey, onUploadImage, labelledBy, placeholder }: TechniqueEditorProps) {
  const contentId = useId();
  const emitted = useRef<TechniqueDocument>(value);
  const callbacks = useRef({ onChange, onUploadImage });
  useEffect(() => {
    callbacks.current = { onChange, onUploadImage };
  });
  const [dialog, setDialog] = useState<"link" | "still" | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [uploads, setUploads] = useState(0);
  const [loaded] = useState(value);
  const draft = useDraftRecovery({
    draftKey,
    value,
    loaded,
    schema: techniqueDocumentSchema,
    onRestore: (doc) => callbacks.current.onChange(doc),
  });

  const editorRef = useRef<Editor | null>(null);
  async function upload(files: File[], text?: StillDialogValue) {
    const uploadImage = callbacks.current.onUploadImage;
    if (!uploadImage) return setProblem("Images cannot be added here.");
    setProblem(null);
    for (const file of files) {
      setUploads((n) => n + 1);
      try {
        const still = await uploadImage(file);
        editorRef.current
          ?.chain()
          .focus()
          .insertStill({ stillId: still.stillId, alt: text?.alt || still.alt, caption: text?.caption ?? "" })
          .run();
      } catch (cause) {
        const message = cause instanceof Error ? cause.message : "unknown error";
        setProblem(`Could not upload ${file.name}: ${message}`);
        if (text) throw cause;
      } finally {
        setUploads((n) => n - 1);
      }
    }
  }

  const uploadRef = useRef(upload);
  useEffect(() => {
    uploadRef.current = upload;
  });

  // Built once: useEditor calls setOptions whenever these differ, and every handler below reads refs.
  const [options] = useState(() => ({
    immediatelyRender: false,
    extensions: createEditorExtensions({ placeholder: placeholder ?? "Describe the problem, the steps, and when it works or fails…" }),
    content: value,
    editorProps: {
      attributes: {
        id: contentId,
        role: "textbox",
        "aria-multiline": "true",
        ...(labelledBy ? { "aria-labelledby": labelledBy } : { "aria-label": "Technique body" }),
        class: "prose-plate plate-editor-content min-h-64 px-4 py-3 focus:outline-none",
      },
      handleDrop: (view: EditorView, event: DragEvent, _slice: unknown, moved: boolean) => {
        const files = moved ? [] : imageFilesFrom(event.dataTransfer);
        if (files.length === 0) return false;
        event.preventDefault();
        const at = view.posAtCoords({ left: event.clientX, top: event.clientY });
        if (at) editorRef.current?.commands.setTextSelection(at.pos);
        void uploadRef.current(files);
        return true;
      },
      handlePaste: (_view: EditorView, event: ClipboardEvent) => {
        const files = imageFilesFrom(event.clipboardData);
        if (files.length === 0) return false;
        event.preventDefault();
        void uploadRef.current(files);
        return true;
      },
      handleKeyDown: (_view: EditorView, event: KeyboardEvent) => {
        if ((event.metaKey || event.ctrlKey) && !event.altKey && event.key.toLowerCase() === "k") {
          event.preventDefault();
          setDialog("link");
          return true;
        }
        return false;
      },
    },
    onUpdate: ({ editor: e }: { editor: Editor }) => {
      const doc = e.getJSON() as TechniqueDocument;
      emitted.current = doc;
      callbacks.current.onChange(doc);
    },
  }));
  const editor = useEditor(options);
  useEffect(() => {
    editorRef.current = editor;
  }, [editor]);

  // A value that did not come from this editor (restored draft or revision) replaces the content.
  useEffect(() => {
    if (!editor || value === emitted.current) return;
    emitted.current = value;
    editor.commands.setContent(value, { emitUpdate: false });
  }, [editor, value]);

  const stillText: StillDialogValue =
    editor?.isActive("still") ? { alt: editor.getAttributes("still").alt ?? "", caption: editor.getAttributes("still").caption ?? "" } : NO_TEXT;

  return (
    <div className="flex flex-col gap-2">
      {draft.recoverable && (
        <DraftBanner subject="the body" savedAt={draft.savedAt} onRestore={draft.restore} onDiscard={draft.discard} />
      )}
      <div className="plate-editor overflow-hidden rounded border border-line bg-surface focus-within:border-accent focus-within:ring-1 focus-within:ring-accent">
        {editor && (
          <EditorToolbar
            editor={editor}
            controlsId={contentId}
            onOpenLink={() => setDialog("link")}
            onOpenStill={() => setDialog("still")}
            canAddStill={Boolean(onUploadImage)}
          />
        )}
        <EditorContent editor={editor} />
      </div>
      <p aria-live="polite" className="min-h-5 text-sm text-muted">
        {uploads > 0 ? "Uploading still…" : problem && <span className="text-bad">{problem}</span>}
      </p>
      {editor && (
        <>
          <LinkDialog
            open={dialog === "link"}
            currentHref={dialog === "link" ? (editor.getAttributes("link").href ?? null) : null}
            onApply={(href) => {
              const chain = editor.chain().focus().extendMarkRange("link");
              if (editor.state.selection.empty && !editor.isActive("link")) {
                chain.insertContent({ type: "text", text: href, marks: [{ type: "link", attrs: { href } }] }).run();
              } else {
                chain.setLink({ href }).run();
              }
              setDialog(null);
            }}
            onRemove={() => {
              editor.chain().focus().extendMarkRange("link").unsetLink().run();
              setDialog(null);
            }}
            onClose={() => setDialog(null)}
          />
          <StillDialog
            open={dialog === "still"}
            mode={editor.isActive("still") ? "edit" : "insert"}
            initial={stillText}
            onInsert={async (file, text) => {
              await upload([file], text);
              setDialog(null);
            }}
            onSave={(text) => {
              editor.chain().focus().updateAttributes("still", text).run();
              setDialog(null);
            }}
            onClose={() => setDialog(null)}
          />
        </>
      )}
    </div>
  );
}
