"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { ThesaurusEntryForm } from "@/components/thesaurus/entry-form";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { ThesaurusEntryDto } from "@/lib/thesaurus/schemas";

/** The thesaurus, filterable by any word; leads edit and delete entries in place. */
export function ThesaurusList({ entries, canManage }: { entries: ThesaurusEntryDto[]; canManage: boolean }) {
  const router = useRouter();
  const [filter, setFilter] = useState("");
  const [editing, setEditing] = useState<string | null>(null);
  const [deleting, setDeleting] = useState<ThesaurusEntryDto | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const shown = useMemo(() => {
    const f = filter.trim().toLowerCase();
    return f ? entries.filter((e) => [e.broader ?? "", ...e.terms, e.note].some((t) => t.toLowerCase().includes(f))) : entries;
  }, [entries, filter]);

  function saved(text: string) {
    setEditing(null);
    setMessage(text);
    router.refresh();
  }

  async function remove(entry: ThesaurusEntryDto) {
    setBusy(true);
    try {
      await apiFetch(`/api/thesaurus/${entry.id}`, { method: "DELETE" });
      setMessage("Deleted. Search no longer uses that entry.");
      router.refresh();
    } catch (e) {
      setMessage(e instanceof ApiError ? e.message : "That did not work.");
    } finally {
      setBusy(false);
      setDeleting(null);
    }
  }

  return (
    <section aria-label="Thesaurus entries" className="space-y-3">
      {canManage ? <ThesaurusEntryForm onSaved={saved} /> : null}
      {message ? (
        <p role="status" className="text-sm text-muted">
          {message}
        </p>
      ) : null}
      <TextInput type="search" aria-label="Filter the thesaurus" placeholder="Filter by any word, e.g. grain" value={filter} onChange={(e) => setFilter(e.target.value)} />
      <p className="text-xs text-muted">
        {shown.length} of {entries.length} entries
      </p>
      {shown.length === 0 ? <EmptyState title={entries.length ? "No entry uses that word." : "The thesaurus is empty."} /> : null}
      <ul className="divide-y divide-line text-sm">
        {shown.map((e) => (
          <li key={e.id} className="py-2" data-testid="thesaurus-entry">
            {editing === e.id ? (
              <ThesaurusEntryForm entry={e} onSaved={saved} onCancel={() => setEditing(null)} />
            ) : (
              <div className="flex flex-wrap items-baseline gap-2">
                <EntryWords entry={e} />
                {canManage ? (
                  <span className="ml-auto flex gap-1">
                    <Button variant="ghost" onClick={() => setEditing(e.id)} aria-label={`Edit ${e.broader ?? e.terms[0]}`}>
                      Edit
                    </Button>
                    <Button variant="ghost" onClick={() => setDeleting(e)} aria-label={`Delete ${e.broader ?? e.terms[0]}`}>
                      Delete
                    </Button>
                  </span>
                ) : null}
              </div>
            )}
          </li>
        ))}
      </ul>
      <ConfirmDialog open={deleting !== null} title="Delete this entry?" confirmLabel="Delete" danger busy={busy} onClose={() => setDeleting(null)} onConfirm={() => deleting && void remove(deleting)}>
        {deleting ? (
          <p>
            Search will stop connecting {deleting.kind === "narrower" ? `${deleting.terms.join(", ")} to “${deleting.broader}”` : deleting.terms.join(", ")}. The audit log keeps what it said.
          </p>
        ) : null}
      </ConfirmDialog>
    </section>
  );
}

function EntryWords({ entry }: { entry: ThesaurusEntryDto }) {
  return (
    <div>
      {entry.kind === "narrower" ? (
        <p>
          <span className="text-muted">{entry.terms.join(", ")}</span> <span aria-label="also find">→</span> <strong>{entry.broader}</strong>
        </p>
      ) : (
        <p>
          <strong>{entry.terms.join(" · ")}</strong>
        </p>
      )}
      {entry.note ? <p className="text-xs text-muted">{entry.note}</p> : null}
    </div>
  );
}
