"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { Select, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";

type Tag = { slug: string; name: string; kind: "problem" | "plate"; description: string; aliases: string[] };

/** Leads keep the tag lists: add, rename, describe, alias, merge. */
export function TagManager({ tags }: { tags: Tag[] }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [draft, setDraft] = useState({ kind: "problem" as Tag["kind"], name: "", description: "", aliases: "" });
  const [editing, setEditing] = useState<Tag | null>(null);
  const [merge, setMerge] = useState<{ from: Tag; into: string } | null>(null);

  async function call(path: string, method: string, json: unknown, done: string) {
    setMessage(null);
    try {
      await apiFetch(path, { method, json });
      setMessage(done);
      router.refresh();
      return true;
    } catch (e) {
      setMessage(e instanceof ApiError ? e.message : "That did not work.");
      return false;
    }
  }
  const aliasList = (s: string) => s.split(",").map((a) => a.trim()).filter(Boolean);

  return (
    <Card>
      <CardTitle>Manage tags</CardTitle>
      <form
        className="grid gap-2 sm:grid-cols-[8rem_1fr_2fr_2fr_auto]"
        onSubmit={async (e) => {
          e.preventDefault();
          if (await call("/api/tags", "POST", { ...draft, aliases: aliasList(draft.aliases) }, `Added “${draft.name}”.`)) setDraft({ ...draft, name: "", description: "", aliases: "" });
        }}
      >
        <Select aria-label="Kind" value={draft.kind} onChange={(e) => setDraft({ ...draft, kind: e.target.value as Tag["kind"] })}>
          <option value="problem">Problem</option>
          <option value="plate">Plate</option>
        </Select>
        <TextInput aria-label="Name" placeholder="Name" value={draft.name} onChange={(e) => setDraft({ ...draft, name: e.target.value })} />
        <TextInput aria-label="Description" placeholder="One sentence" value={draft.description} onChange={(e) => setDraft({ ...draft, description: e.target.value })} />
        <TextInput aria-label="Other words" placeholder="Other words, comma-separated" value={draft.aliases} onChange={(e) => setDraft({ ...draft, aliases: e.target.value })} />
        <Button type="submit" variant="primary">
          Add
        </Button>
      </form>
      {message ? <p role="status" className="mt-2 text-sm text-muted">{message}</p> : null}
      <ul className="mt-4 divide-y divide-line text-sm">
        {tags.map((t) => (
          <li key={t.slug} className="flex flex-wrap items-center gap-2 py-2">
            <span className="font-medium">{t.name}</span>
            <span className="text-xs text-muted">{t.kind}</span>
            <span className="text-xs text-muted">{t.aliases.join(", ")}</span>
            <span className="ml-auto flex gap-1">
              <Button variant="ghost" onClick={() => setEditing({ ...t })}>
                Edit
              </Button>
              <Button variant="ghost" onClick={() => setMerge({ from: t, into: tags.find((x) => x.kind === t.kind && x.slug !== t.slug)?.slug ?? "" })}>
                Merge…
              </Button>
            </span>
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={editing !== null}
        title={`Edit “${editing?.name ?? ""}”`}
        confirmLabel="Save"
        onClose={() => setEditing(null)}
        onConfirm={async () => {
          if (editing && (await call(`/api/tags/${editing.slug}`, "PATCH", { name: editing.name, description: editing.description, aliases: editing.aliases }, "Saved."))) setEditing(null);
        }}
      >
        {editing ? (
          <>
            <TextInput aria-label="Name" value={editing.name} onChange={(e) => setEditing({ ...editing, name: e.target.value })} />
            <TextInput aria-label="Description" value={editing.description} onChange={(e) => setEditing({ ...editing, description: e.target.value })} />
            <TextInput aria-label="Other words" value={editing.aliases.join(", ")} onChange={(e) => setEditing({ ...editing, aliases: aliasList(e.target.value) })} />
          </>
        ) : null}
      </ConfirmDialog>
      <ConfirmDialog
        open={merge !== null}
        title={`Merge “${merge?.from.name ?? ""}” into…`}
        confirmLabel="Merge"
        danger
        onClose={() => setMerge(null)}
        onConfirm={async () => {
          if (merge && (await call(`/api/tags/${merge.from.slug}/merge`, "POST", { into: merge.into }, "Merged."))) setMerge(null);
        }}
      >
        <p>Techniques, the department method and subscriptions move to the chosen tag; this tag&apos;s name becomes one of its other words.</p>
        <Select aria-label="Merge into" value={merge?.into ?? ""} onChange={(e) => merge && setMerge({ ...merge, into: e.target.value })}>
          {tags
            .filter((x) => merge && x.kind === merge.from.kind && x.slug !== merge.from.slug)
            .map((x) => (
              <option key={x.slug} value={x.slug}>
                {x.name}
              </option>
            ))}
        </Select>
      </ConfirmDialog>
    </Card>
  );
}
