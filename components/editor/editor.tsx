"use client";

import { NodeSelection } from "@tiptap/pm/state";
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

/** Stores an image as a still; the description was asked for in the still dialog. */
export type UploadImage = (file: File, alt: string) => Promise<{ stillId: string }>;

type TechniqueEditorProps = {
  value: TechniqueDocument;
  onChange(doc: TechniqueDocument): void;
  /** Keeps an unsaved body in this browser and offers it back; leave unset when the whole form uses useDraftRecovery. */
  draftKey?: string;
  /** Uploads a dropped, pasted or chosen image as a still; without it images cannot be added. */
  onUploadImage?: UploadImage;
  /** Said in the still dialog before uploading, e.g. that the first still saves the draft. */
  stillNote?: string;
  /** id of the visible label of the body field */
  labelledBy?: string;
  placeholder?: string;
};

const NO_TEXT: StillDialogValue = { alt: "", caption: "" };
const NO_STILLS = "Stills can be added to a technique's write-up only.";

/** The rich-text editor for technique bodies (Tiptap), with its toolbar and dialogs. */
export function TechniqueEditor({ value, onChange, draftKey, onUploadImage, stillNote, labelledBy, placeholder }: TechniqueEditorProps) {
  const contentId = useId();
  const emitted = useRef<TechniqueDocument>(value);
  const callbacks = useRef({ onChange, onUploadImage });
  useEffect(() => {
    callbacks.current = { onChange, onUploadImage };
  });
  const [dialog, setDialog] = useState<"link" | "still" | null>(null);
  // Images dropped or pasted into the body wait here, one still dialog each, for their description.
  const [queue, setQueue] = useState<{ files: File[]; total: number }>({ files: [], total: 0 });
  const queued = queue.files;
  const [problem, setProblem] = useState<string | null>(null);
  const [loaded] = useState(value);
  const draft = useDraftRecovery({
    draftKey,
    value,
    loaded,
    schema: techniqueDocumentSchema,
    onRestore: (doc) => callbacks.current.onChange(doc),
  });

  const editorRef = useRef<Editor | null>(null);
  async function upload(file: File, text: StillDialogValue) {
    const uploadImage = callbacks.current.onUploadImage;
    if (!uploadImage) throw new Error(NO_STILLS);
    setProblem(null);
    const still = await uploadImage(file, text.alt);
    const editor = editorRef.current;
    if (!editor) return;
    editor.chain().focus().insertStill({ stillId: still.stillId, alt: text.alt, caption: text.caption }).run();
    // Leave the cursor after the still, not on it: typing on with the still selected would replace it.
    const { selection, doc } = editor.state;
    if (selection instanceof NodeSelection && selection.node.type.name === "still") {
      const after = selection.to;
      if (doc.resolve(after).nodeAfter?.isTextblock) editor.commands.setTextSelection(after + 1);
      else editor.chain().insertContentAt(after, { type: "paragraph" }).setTextSelection(after + 1).run();
    }
  }

  /** Dropped or pasted images: ask for each one's description before uploading it. */
  function ask(files: File[]) {
    if (!callbacks.current.onUploadImage) return setProblem(NO_STILLS);
    setProblem(null);
    setQueue({ files, total: files.length });
    setDialog("still");
  }
  const askRef = useRef(ask);
  useEffect(() => {
    askRef.current = ask;
  });
  function nextQueued() {
    const rest = queued.slice(1);
    setQueue({ files: rest, total: rest.length ? queue.total : 0 });
    if (rest.length === 0) setDialog(null);
  }

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
        askRef.current(files);
        return true;
      },
      handlePaste: (_view: EditorView, event: ClipboardEvent) => {
        const files = imageFilesFrom(event.clipboardData);
        if (files.length === 0) return false;
        event.preventDefault();
        askRef.current(files);
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
        {problem && <span className="text-bad">{problem}</span>}
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
            // A new key per queued file: each dropped image gets a fresh form.
            key={queued[0] ? `${queued.length}:${queued[0].name}` : "chosen"}
            open={dialog === "still"}
            mode={queued.length === 0 && editor.isActive("still") ? "edit" : "insert"}
            file={queued[0] ?? null}
            position={queue.total > 1 ? `Still ${queue.total - queued.length + 1} of ${queue.total}` : undefined}
            note={stillNote}
            initial={queued.length ? NO_TEXT : stillText}
            onInsert={async (file, text) => {
              await upload(file, text);
              if (queued.length) nextQueued();
              else setDialog(null);
            }}
            onSave={(text) => {
              editor.chain().focus().updateAttributes("still", text).run();
              setDialog(null);
            }}
            onClose={() => {
              setQueue({ files: [], total: 0 });
              setDialog(null);
            }}
          />
        </>
      )}
    </div>
  );
}
