"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useMemo, useRef, useState } from "react";
import { DraftBanner } from "@/components/editor/draft-banner";
import { TechniqueEditor } from "@/components/editor/editor";
import { techniqueDraftSchema, useDraftRecovery, type TechniqueDraft } from "@/components/editor/use-draft-recovery";
import { TagPicker } from "@/components/techniques/tag-picker";
import { RecipeStillsProvider, type RecipeStill } from "@/components/lab/recipe/denoised-still-picker";
import { RecipeField } from "@/components/techniques/recipe-field";
import { Button } from "@/components/ui/button";
import { describedBy, Field, TextArea, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { RecipeStep } from "@/lib/lab/recipe";
import type { TechniqueDocument } from "@/lib/techniques/document";
import type { TagRef } from "@/lib/techniques/schemas";
import { uploadStillForEditor } from "@/components/techniques/upload-still";
import { formatDateTime } from "@/lib/utils";

type TechniqueFormValue = TechniqueDraft & { recipe: RecipeStep[] };

type Props = {
  mode: "create" | "edit";
  slug?: string;
  baseRevision?: number;
  initial: TechniqueFormValue;
  tags: TagRef[];
  requestId?: string;
  isEditOfApproved?: boolean;
  /** The technique's stills, for recipe steps that name one (the grain step's denoised plate). */
  stills?: RecipeStill[];
};

type Conflict = { message: string; latest?: { number: number; author: string | null; savedAt: string } };

const FIRST_STILL_NOTE = "Adding a still saves this new technique as a draft first (only writers and leads see drafts).";
/** Change note of the save that follows a draft saved for its first still. */
const CONTINUED_NOTE = "Continued the first draft.";

/** The write/edit form: fields, rich-text body, recipe, change note; 409s are shown, never overwritten. */
export function TechniqueForm({ mode, slug, baseRevision, initial, tags, requestId, isEditOfApproved, stills = [] }: Props) {
  const router = useRouter();
  const ids = { title: useId(), summary: useId(), aliases: useId(), body: useId(), note: useId(), saveNote: useId() };
  const [value, setValue] = useState<TechniqueFormValue>(initial);
  const [aliasText, setAliasText] = useState(initial.aliases.join(", "));
  const [changeNote, setChangeNote] = useState("");
  const [base, setBase] = useState(baseRevision);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [saving, setSaving] = useState(false);
  // A new technique saved as a draft when its first still was added: from then on saves update it.
  const [savedSlug, setSavedSlug] = useState(slug);
  const firstSave = useRef<Promise<string> | null>(null);
  const isUnsaved = mode === "create" && !savedSlug;
  const draftKey = savedSlug ? `technique:${savedSlug}` : "technique:new";
  const draftValue = useMemo<TechniqueDraft>(() => ({ title: value.title, summary: value.summary, aliases: value.aliases, tags: value.tags, body: value.body }), [value]);
  const loaded = useMemo<TechniqueDraft>(() => ({ title: initial.title, summary: initial.summary, aliases: initial.aliases, tags: initial.tags, body: initial.body }), [initial]);
  const draft = useDraftRecovery<TechniqueDraft>({
    draftKey,
    value: draftValue,
    loaded,
    schema: techniqueDraftSchema,
    onRestore: (d) => {
      setValue((v) => ({ ...v, ...d }));
      setAliasText(d.aliases.join(", "));
    },
  });

  function update<K extends keyof TechniqueFormValue>(key: K, next: TechniqueFormValue[K]) {
    setValue((v) => ({ ...v, [key]: next }));
  }

  function payload() {
    return { ...value, aliases: aliasText.split(",").map((a) => a.trim()).filter(Boolean) };
  }

  /** Saves a new technique as a draft so a still can be stored with it; once only, however many stills arrive. */
  function saveFirstDraft(): Promise<string> {
    if (savedSlug) return Promise.resolve(savedSlug);
    firstSave.current ??= (async () => {
      setErrors({});
      try {
        const result = await apiFetch<{ slug: string; revision: number }>("/api/techniques", { method: "POST", json: { ...payload(), requestId } });
        draft.clear();
        setSavedSlug(result.slug);
        setBase(result.revision);
        // The address now names the saved draft, so a reload opens it rather than an empty form.
        window.history.replaceState(null, "", `/techniques/${result.slug}/edit`);
        setMessage("Saved as a draft so the still could be stored. Save draft again when you have written more.");
        return result.slug;
      } catch (error) {
        firstSave.current = null;
        if (error instanceof ApiError) {
          setErrors(error.fields ?? {});
          throw new Error(`The draft could not be saved for the still: ${error.message} Fill in the fields marked on the form, then add the still again.`);
        }
        throw error;
      }
    })();
    return firstSave.current;
  }

  async function save(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const alsoSubmit = (event.nativeEvent as SubmitEvent).submitter?.getAttribute("value") === "submit";
    setSaving(true);
    setErrors({});
    setMessage(null);
    try {
      const result = isUnsaved
        ? await apiFetch<{ slug: string; revision: number }>("/api/techniques", { method: "POST", json: { ...payload(), requestId } })
        : await apiFetch<{ slug: string; revision: number }>(`/api/techniques/${savedSlug}`, {
            method: "PUT",
            json: { ...payload(), baseRevision: base, changeNote: mode === "create" ? CONTINUED_NOTE : changeNote },
          });
      draft.clear();
      // Saved either way; a refused submit leaves the page's own "Submit for review" button to try again.
      if (alsoSubmit) await apiFetch(`/api/techniques/${result.slug}/submit`, { method: "POST" }).catch(() => undefined);
      router.push(`/techniques/${result.slug}`);
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) {
        const latest = (error.body as { error?: { latest?: Conflict["latest"] } })?.error?.latest;
        setConflict({ message: error.message, latest });
      } else if (error instanceof ApiError) {
        setErrors(error.fields ?? {});
        setMessage(error.message);
      } else setMessage("Saving failed. Your text is kept in this browser; try again.");
    } finally {
      setSaving(false);
    }
  }

  return (
    <form onSubmit={save} className="space-y-5" noValidate>
      {draft.recoverable ? <DraftBanner savedAt={draft.savedAt} onRestore={() => draft.restore()} onDiscard={draft.discard} subject="this technique" /> : null}
      {isEditOfApproved ? (
        <p className="rounded border border-accent/50 bg-accent/10 px-3 py-2 text-sm" role="note">
          This technique is approved. Saving makes a new revision; readers keep seeing the approved text until a lead approves the new one.
        </p>
      ) : null}
      {conflict ? (
        <div role="alert" className="space-y-2 rounded border border-bad/60 bg-bad/10 p-3 text-sm">
          <p className="font-medium">Someone else saved first — nothing was overwritten.</p>
          {/* The API's message carries a raw ISO time; say the same in readable words when we know who and when. */}
          <p>
            {conflict.latest
              ? `${conflict.latest.author ?? "Someone"} saved revision ${conflict.latest.number} on ${formatDateTime(conflict.latest.savedAt)}, after the revision ${base} you started from. Compare and re-apply your changes.`
              : conflict.message}
          </p>
          <div className="flex flex-wrap gap-2">
            {conflict.latest && savedSlug ? (
              <Link className="underline" href={`/techniques/${savedSlug}/history?from=${base}&to=${conflict.latest.number}`} target="_blank">
                Compare their revision {conflict.latest.number} with your base ({base})
              </Link>
            ) : null}
            {conflict.latest ? (
              <Button
                onClick={() => {
                  setBase(conflict.latest!.number);
                  setConflict(null);
                  setMessage(`Your changes are now based on revision ${conflict.latest!.number}. Check the comparison, then save again to re-apply them.`);
                }}
              >
                Re-apply my changes on top
              </Button>
            ) : null}
          </div>
        </div>
      ) : null}
      <Field id={ids.title} label="Title" error={errors.title}>
        <TextInput id={ids.title} value={value.title} onChange={(e) => update("title", e.target.value)} aria-describedby={describedBy(ids.title, errors.title)} required />
      </Field>
      <Field id={ids.summary} label="One-line summary" error={errors.summary} hint="What it fixes and when to reach for it.">
        <TextInput id={ids.summary} value={value.summary} onChange={(e) => update("summary", e.target.value)} aria-describedby={describedBy(ids.summary, errors.summary, "hint")} required />
      </Field>
      <Field id={ids.aliases} label="Other phrasings" error={errors.aliases} hint="Comma-separated: the words people search with, e.g. tracker dots, tape crosses.">
        <TextInput id={ids.aliases} value={aliasText} onChange={(e) => { setAliasText(e.target.value); update("aliases", e.target.value.split(",").map((a) => a.trim()).filter(Boolean)); }} aria-describedby={describedBy(ids.aliases, errors.aliases, "hint")} />
      </Field>
      <div>
        <p className="mb-1 text-sm font-medium">Tags</p>
        <TagPicker tags={tags} value={value.tags} onChange={(next) => update("tags", next)} />
        {errors.tags ? <p className="mt-1 text-xs text-bad">{errors.tags}</p> : null}
      </div>
      <div>
        <p id={ids.body} className="mb-1 text-sm font-medium">
          Write-up
        </p>
        <TechniqueEditor
          value={value.body}
          onChange={(doc: TechniqueDocument) => update("body", doc)}
          labelledBy={ids.body}
          onUploadImage={async (file, alt) => uploadStillForEditor(file, alt, await saveFirstDraft())}
          stillNote={isUnsaved ? FIRST_STILL_NOTE : undefined}
        />
        {isUnsaved ? <p className="mt-1 text-xs text-muted">{FIRST_STILL_NOTE}</p> : null}
        {errors.body || Object.keys(errors).find((k) => k.startsWith("body")) ? <p className="mt-1 text-xs text-bad">{errors.body ?? "The write-up contains something that cannot be stored."}</p> : null}
      </div>
      <RecipeStillsProvider stills={stills}>
        <RecipeField value={value.recipe} onChange={(recipe) => update("recipe", recipe)} errors={errors} />
      </RecipeStillsProvider>
      {mode === "edit" ? (
        <Field id={ids.note} label="What changed, and why" error={errors.changeNote}>
          <TextArea id={ids.note} value={changeNote} onChange={(e) => setChangeNote(e.target.value)} aria-describedby={describedBy(ids.note, errors.changeNote)} required />
        </Field>
      ) : null}
      {message ? (
        <p role="status" className="text-sm text-muted">
          {message}
        </p>
      ) : null}
      <p id={ids.saveNote} className="text-sm text-muted">
        Every saved revision is a draft that only writers and leads see. <strong className="font-medium text-ink">Save and submit for review</strong> also asks
        the leads to review it; a draft can be submitted later from its page.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" name="then" value="submit" variant="primary" disabled={saving} aria-describedby={ids.saveNote}>
          {saving ? "Saving…" : "Save and submit for review"}
        </Button>
        <Button type="submit" name="then" value="keep" disabled={saving} aria-describedby={ids.saveNote}>
          Save draft
        </Button>
        <Link href={savedSlug ? `/techniques/${savedSlug}` : "/techniques"} className="rounded px-3 py-1.5 text-sm text-muted hover:text-ink">
          Cancel
        </Link>
      </div>
    </form>
  );
}
