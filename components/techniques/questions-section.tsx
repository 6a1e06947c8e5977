"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { TextArea } from "@/components/ui/field";
import { Skeleton } from "@/components/ui/skeleton";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { documentToPlainText } from "@/lib/techniques/plain-text";
import { documentFromText } from "@/lib/techniques/document";
import type { QuestionResponse } from "@/lib/questions/schemas";
import { formatDateTime } from "@/lib/utils";

/** Questions and answers under a technique; plain text in, rendered as text (never markup). */
export function QuestionsSection({ slug, canAsk }: { slug: string; canAsk: boolean }) {
  const client = useQueryClient();
  const key = ["questions", slug];
  const questions = useQuery({ queryKey: key, queryFn: () => apiFetch<{ items: QuestionResponse[] }>(`/api/techniques/${slug}/questions`) });
  const [text, setText] = useState("");
  const ask = useMutation({
    mutationFn: () => apiFetch(`/api/techniques/${slug}/questions`, { method: "POST", json: { body: documentFromText(text) } }),
    onSuccess: () => {
      setText("");
      void client.invalidateQueries({ queryKey: key });
    },
  });
  return (
    <Card aria-labelledby="questions-title">
      <CardTitle>
        <span id="questions-title">Questions</span>
      </CardTitle>
      {questions.isLoading ? <Skeleton className="h-16" /> : null}
      {questions.error ? <p role="alert" className="text-sm text-bad">{(questions.error as Error).message}</p> : null}
      {questions.data && !questions.data.items.length ? <EmptyState title="No questions yet." /> : null}
      <ul className="space-y-4">
        {questions.data?.items.map((q) => <QuestionItem key={q.id} q={q} onChanged={() => client.invalidateQueries({ queryKey: key })} />)}
      </ul>
      {canAsk ? (
        <form
          className="mt-4 space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (text.trim()) ask.mutate();
          }}
        >
          <label htmlFor={`ask-${slug}`} className="block text-sm font-medium">
            Ask about this technique
          </label>
          <TextArea id={`ask-${slug}`} value={text} onChange={(e) => setText(e.target.value)} placeholder="e.g. Does this hold up on motion-blurred markers?" />
          {ask.error ? <p role="alert" className="text-sm text-bad">{ask.error instanceof ApiError ? ask.error.message : "Could not post."}</p> : null}
          <Button type="submit" disabled={ask.isPending || !text.trim()}>
            {ask.isPending ? "Posting…" : "Ask"}
          </Button>
        </form>
      ) : null}
    </Card>
  );
}

function QuestionItem({ q, onChanged }: { q: QuestionResponse; onChanged(): void }) {
  const [answer, setAnswer] = useState("");
  const [error, setError] = useState<string | null>(null);
  async function post(path: string, json?: unknown) {
    setError(null);
    try {
      await apiFetch(path, { method: "POST", json });
      setAnswer("");
      onChanged();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "That did not work.");
    }
  }
  return (
    <li id={`question-${q.id}`} className="rounded border border-line p-3">
      <p className="text-xs text-muted">
        {q.author?.name ?? "Someone"} · {formatDateTime(q.createdAt)} {q.resolvedAt ? <span className="text-ok">· resolved</span> : null}
      </p>
      <p className="mt-1 whitespace-pre-wrap">{documentToPlainText(q.body)}</p>
      <ul className="mt-2 space-y-2 border-l border-line pl-3">
        {q.answers.map((a) => (
          <li key={a.id}>
            <p className="text-xs text-muted">
              {a.author?.name ?? "Someone"} · {formatDateTime(a.createdAt)}
            </p>
            <p className="whitespace-pre-wrap">{documentToPlainText(a.body)}</p>
          </li>
        ))}
      </ul>
      {q.canAnswer ? (
        <div className="mt-2 flex gap-2">
          <label htmlFor={`answer-${q.id}`} className="sr-only">
            Answer
          </label>
          <TextArea id={`answer-${q.id}`} className="min-h-10" value={answer} onChange={(e) => setAnswer(e.target.value)} placeholder="Answer…" />
          <Button disabled={!answer.trim()} onClick={() => post(`/api/questions/${q.id}/answers`, { body: documentFromText(answer) })}>
            Answer
          </Button>
        </div>
      ) : null}
      {q.canResolve && !q.resolvedAt ? (
        <Button variant="ghost" className="mt-2" onClick={() => post(`/api/questions/${q.id}/resolve`)}>
          Mark resolved
        </Button>
      ) : null}
      {error ? <p role="alert" className="text-sm text-bad">{error}</p> : null}
    </li>
  );
}
