"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { Select } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { TagRef } from "@/lib/techniques/schemas";

type Current = Record<string, { slug: string; title: string }>;

/**
 * A lead marks this approved technique as the department's method for one of its problem tags.
 * It always asks first, naming the method it replaces; followers of the problem are told.
 */
export function HouseMethodPicker({ slug, title, problemTags, current }: { slug: string; title: string; problemTags: TagRef[]; current: Current }) {
  const router = useRouter();
  const selectId = useId();
  const choices = problemTags.filter((t) => current[t.slug]?.slug !== slug);
  const [tag, setTag] = useState(choices[0]?.slug ?? "");
  const [isAsking, setIsAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  if (!choices.length) return null;
  const problem = choices.find((t) => t.slug === tag) ?? choices[0]!;
  const replaced = current[problem.slug] ?? null;

  async function mark() {
    setBusy(true);
    setMessage(null);
    try {
      await apiFetch(`/api/tags/${problem.slug}/house-method`, { method: "PUT", json: { technique: slug, replaces: replaced?.slug ?? null } });
      setIsAsking(false);
      router.refresh();
    } catch (e) {
      setMessage(e instanceof ApiError ? e.message : "That did not work; nothing was changed.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex items-center gap-2">
      <label htmlFor={selectId} className="text-sm text-muted">
        Department method for
      </label>
      <Select id={selectId} className="w-auto" value={problem.slug} onChange={(e) => setTag(e.target.value)}>
        {choices.map((t) => (
          <option key={t.slug} value={t.slug}>
            {t.name}
          </option>
        ))}
      </Select>
      <Button onClick={() => setIsAsking(true)}>Mark…</Button>
      <ConfirmDialog
        open={isAsking}
        title={replaced ? `Replace the department method for ${problem.name}?` : `Make this the department method for ${problem.name}?`}
        confirmLabel={replaced ? "Replace" : "Mark"}
        busy={busy}
        onConfirm={mark}
        onClose={() => {
          setIsAsking(false);
          setMessage(null);
        }}
      >
        {replaced ? (
          <p>
            <strong>{replaced.title}</strong> is the department method for {problem.name} now. Marking <strong>{title}</strong> takes its place.
          </p>
        ) : (
          <p>
            {problem.name} has no department method yet. <strong>{title}</strong> becomes the one juniors find first.
          </p>
        )}
        <p>People following {problem.name} are told by mail, and the change is kept in the audit log.</p>
        {message ? (
          <p role="alert" className="text-bad">
            {message}
          </p>
        ) : null}
      </ConfirmDialog>
    </div>
  );
}
