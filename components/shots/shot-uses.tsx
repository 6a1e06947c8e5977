"use client";

import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { StillThumb } from "@/components/shots/still-thumb";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { USE_OUTCOME_LABELS, type ShotUseResponse, type UpdateUseInput, type UseOutcome, type UseResponse } from "@/lib/uses/schemas";
import { formatDate } from "@/lib/utils";
import { OutcomeRadios } from "@/components/shots/outcome-radios";

const OUTCOME_TONE = { clean: "ok", "touch-up": "warn", failed: "bad" } as const;

/** The changes an edit makes, and nothing else: an untouched field is not sent. */
function editBody(
  use: Pick<ShotUseResponse, "outcome" | "note" | "beforeStill" | "afterStill">,
  edit: { outcome: UseOutcome; note: string; dropBefore: boolean; dropAfter: boolean },
): UpdateUseInput | null {
  const body: UpdateUseInput = {};
  if (edit.outcome !== use.outcome) body.outcome = edit.outcome;
  if (edit.note.trim() !== use.note) body.note = edit.note.trim();
  if (edit.dropBefore && use.beforeStill) body.beforeStill = null;
  if (edit.dropAfter && use.afterStill) body.afterStill = null;
  return Object.keys(body).length ? body : null;
}

/** The techniques used on a shot, newest first; the author of a log (or a lead) may edit or delete it. */
export function ShotUses({ uses }: { uses: ShotUseResponse[] }) {
  if (!uses.length) return <EmptyState title="No technique has been logged on this shot yet." />;
  return (
    <ul className="space-y-3" data-testid="shot-uses">
      {uses.map((u) => (
        <ShotUseItem key={u.id} use={u} />
      ))}
    </ul>
  );
}

function ShotUseItem({ use }: { use: ShotUseResponse }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const remove = useMutation({
    mutationFn: () => apiFetch<null>(`/api/uses/${use.id}`, { method: "DELETE" }),
    onSuccess: () => {
      setConfirming(false);
      router.refresh();
    },
  });
  const retired = use.technique.status === "retired";

  return (
    <li className="rounded-lg border border-line bg-surface p-3" data-testid="shot-use">
      <div className="flex flex-wrap items-center gap-2">
        <Link href={`/techniques/${use.technique.slug}`} className="font-medium hover:text-accent">
          {use.technique.title}
        </Link>
        {retired ? <Badge tone="warn">retired</Badge> : null}
        <Badge tone={OUTCOME_TONE[use.outcome]}>{USE_OUTCOME_LABELS[use.outcome]}</Badge>
        <span className="text-sm text-muted">
          {use.user?.name ?? "someone no longer here"} · <time dateTime={use.createdAt}>{formatDate(use.createdAt)}</time>
          {use.updatedAt !== use.createdAt ? " (edited)" : ""}
        </span>
        {use.canEdit && !editing ? (
          <span className="ml-auto flex gap-1">
            <Button variant="ghost" onClick={() => setEditing(true)} aria-label={`Edit the log of ${use.technique.title}`}>
              Edit
            </Button>
            <Button variant="danger" onClick={() => setConfirming(true)} aria-label={`Delete the log of ${use.technique.title}`}>
              Delete
            </Button>
          </span>
        ) : null}
      </div>

      {use.followUp ? (
        <p role="note" className="mt-2 rounded border border-warn/60 bg-warn/10 px-3 py-2 text-sm" data-testid="follow-up">
          <strong className="font-semibold">Follow up:</strong> {use.technique.title} is retired
          {use.followUp.replacement ? (
            <>
              {" "}
              — see{" "}
              <Link href={`/techniques/${use.followUp.replacement.slug}`} className="font-medium text-accent underline underline-offset-2">
                {use.followUp.replacement.title}
              </Link>
              .
            </>
          ) : (
            "; no replacement was named. Ask a lead what to use instead."
          )}
        </p>
      ) : null}

      {editing ? (
        <EditUse use={use} onDone={() => setEditing(false)} />
      ) : use.note ? (
        <p className="mt-2 whitespace-pre-line text-sm">{use.note}</p>
      ) : null}

      {use.beforeStill || use.afterStill ? (
        <div className="mt-3 flex flex-wrap gap-3">
          {use.beforeStill ? <StillThumb id={use.beforeStill} alt={use.beforeStillAlt} label="Before" /> : null}
          {use.afterStill ? <StillThumb id={use.afterStill} alt={use.afterStillAlt} label="After" /> : null}
        </div>
      ) : null}

      <ConfirmDialog
        open={confirming}
        title="Delete this log?"
        confirmLabel="Delete log"
        danger
        busy={remove.isPending}
        onConfirm={() => remove.mutate()}
        onClose={() => {
          setConfirming(false);
          remove.reset();
        }}
      >
        <p>
          The record that {use.technique.title} was used here ({USE_OUTCOME_LABELS[use.outcome].toLowerCase()}) is removed from this shot and from the
          technique&apos;s shot table. This cannot be undone.
        </p>
        {remove.error ? (
          <p role="alert" className="text-bad">
            {remove.error instanceof ApiError ? remove.error.message : "Deleting failed; the log is still there."}
          </p>
        ) : null}
      </ConfirmDialog>
    </li>
  );
}

function EditUse({ use, onDone }: { use: ShotUseResponse; onDone(): void }) {
  const router = useRouter();
  const uid = useId();
  const [outcome, setOutcome] = useState<UseOutcome>(use.outcome);
  const [note, setNote] = useState(use.note);
  const [dropBefore, setDropBefore] = useState(false);
  const [dropAfter, setDropAfter] = useState(false);
  const body = editBody(use, { outcome, note, dropBefore, dropAfter });
  const save = useMutation({
    mutationFn: (json: UpdateUseInput) => apiFetch<UseResponse>(`/api/uses/${use.id}`, { method: "PATCH", json }),
    onSuccess: () => {
      onDone();
      router.refresh();
    },
  });

  return (
    <form
      className="mt-3 space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (body) save.mutate(body);
      }}
    >
      <OutcomeRadios name={`${uid}-outcome`} value={outcome} onChange={setOutcome} />
      <Field id={`${uid}-note`} label="Note" error={save.error instanceof ApiError ? save.error.fields?.note : undefined}>
        <TextArea id={`${uid}-note`} value={note} onChange={(e) => setNote(e.target.value)} />
      </Field>
      {use.beforeStill || use.afterStill ? (
        <div className="flex flex-wrap gap-4 text-sm">
          {use.beforeStill ? (
            <label className="flex items-center gap-1.5">
              <input type="checkbox" checked={dropBefore} onChange={(e) => setDropBefore(e.target.checked)} /> Remove the before still
            </label>
          ) : null}
          {use.afterStill ? (
            <label className="flex items-center gap-1.5">
              <input type="checkbox" checked={dropAfter} onChange={(e) => setDropAfter(e.target.checked)} /> Remove the after still
            </label>
          ) : null}
        </div>
      ) : null}
      {save.error ? (
        <p role="alert" className="text-sm text-bad">
          {save.error instanceof ApiError ? save.error.message : "Saving failed; nothing was changed."}
        </p>
      ) : null}
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={!body || save.isPending}>
          {save.isPending ? "Saving…" : "Save changes"}
        </Button>
        <Button onClick={onDone} disabled={save.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
