"use client";

import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { describedBy, Field, Select, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { ThesaurusEntryDto } from "@/lib/thesaurus/schemas";

const SHOWN_FIELDS = ["terms", "broader", "note"];

type Draft = { kind: "synonyms" | "narrower"; broader: string; terms: string; note: string };

const toDraft = (e?: ThesaurusEntryDto): Draft =>
  e ? { kind: e.kind, broader: e.broader ?? "", terms: e.terms.join(", "), note: e.note } : { kind: "synonyms", broader: "", terms: "", note: "" };

/** Add or edit one thesaurus entry (leads). Terms are comma-separated; field errors come from the server's checks. */
export function ThesaurusEntryForm({ entry, onSaved, onCancel }: { entry?: ThesaurusEntryDto; onSaved(message: string): void; onCancel?(): void }) {
  const [draft, setDraft] = useState<Draft>(toDraft(entry));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const id = entry ? `edit-${entry.id}` : "new";

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setErrors({});
    const terms = draft.terms.split(",").map((t) => t.trim()).filter(Boolean);
    const body = draft.kind === "narrower" ? { kind: "narrower", broader: draft.broader, terms, note: draft.note } : { kind: "synonyms", terms, note: draft.note };
    try {
      await apiFetch(entry ? `/api/thesaurus/${entry.id}` : "/api/thesaurus", { method: entry ? "PUT" : "POST", json: body });
      if (!entry) setDraft(toDraft());
      onSaved(entry ? "Saved. Search uses the new words from now on." : "Added. Search uses the new words from now on.");
    } catch (err) {
      if (!(err instanceof ApiError)) return setErrors({ form: "That did not work. Try again." });
      // Errors on one term ("terms.2") have no field of their own: they show under the form.
      const fields = err.fields ?? {};
      const other = Object.entries(fields).filter(([k]) => !SHOWN_FIELDS.includes(k));
      setErrors({ ...fields, form: err.fields ? other.map(([, v]) => v).join(" ") : err.message });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-[10rem_1fr]" aria-label={entry ? "Edit thesaurus entry" : "New thesaurus entry"}>
      <Field id={`${id}-kind`} label="Kind">
        <Select id={`${id}-kind`} value={draft.kind} onChange={(e) => setDraft({ ...draft, kind: e.target.value as Draft["kind"] })}>
          <option value="synonyms">Same meaning</option>
          <option value="narrower">Narrower terms</option>
        </Select>
      </Field>
      <div className="space-y-3">
        {draft.kind === "narrower" ? (
          <Field id={`${id}-broader`} label="Broader term" error={errors.broader} hint="What the narrower terms should also find, e.g. marker.">
            <TextInput id={`${id}-broader`} value={draft.broader} onChange={(e) => setDraft({ ...draft, broader: e.target.value })} aria-describedby={describedBy(`${id}-broader`, errors.broader, "hint")} />
          </Field>
        ) : null}
        <Field
          id={`${id}-terms`}
          label={draft.kind === "narrower" ? "Narrower terms" : "Terms that mean the same"}
          error={errors.terms}
          hint={
            (draft.kind === "narrower" ? "Comma-separated, e.g. tracker, tape cross, dot." : "Comma-separated, e.g. regrain, grain restore, put grain back.") +
            ' A term also meets its other forms (markers, marking); in quotes ("backing") only its exact words and their plurals, so "back" does not reach it.'
          }
        >
          <TextInput id={`${id}-terms`} value={draft.terms} onChange={(e) => setDraft({ ...draft, terms: e.target.value })} aria-describedby={describedBy(`${id}-terms`, errors.terms, "hint")} />
        </Field>
        <Field id={`${id}-note`} label="Note (optional)" error={errors.note}>
          <TextInput id={`${id}-note`} value={draft.note} onChange={(e) => setDraft({ ...draft, note: e.target.value })} />
        </Field>
        {errors.form ? (
          <p role="alert" className="text-sm text-bad">
            {errors.form}
          </p>
        ) : null}
        <div className="flex gap-2">
          <Button type="submit" variant="primary" disabled={busy}>
            {busy ? "Saving…" : entry ? "Save" : "Add entry"}
          </Button>
          {onCancel ? <Button onClick={onCancel}>Cancel</Button> : null}
        </div>
      </div>
    </form>
  );
}
