"use client";

import Link from "next/link";
import { useState } from "react";
import { keepTry, proposeTry, tryImageUrl } from "@/components/plate-check/check-api";
import { TryMeasuresTable } from "@/components/plate-check/try-measures";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { ApiError } from "@/lib/api/fetcher";
import type { KeptRecipeDto, TryResult } from "@/lib/plate-check/schemas";

type Props = { stillId: string; result: TryResult; canPropose: boolean; picked: boolean; onPick(): void; onKept(k: KeptRecipeDto): void };

/** One tried technique: its render on the frame, what it did, and keeping or proposing its filled recipe. */
export function TryColumn({ stillId, result, canPropose, picked, onPick, onKept }: Props) {
  const [exact, setExact] = useState(false);
  const [loading, setLoading] = useState(true);
  const [note, setNote] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "bad"; text: string; href?: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const id = `try-${result.slug}`;

  async function act(kind: "keep" | "propose") {
    setBusy(true);
    setMessage(null);
    try {
      if (kind === "keep") {
        onKept(await keepTry(stillId, result.slug, note));
        setMessage({ tone: "ok", text: "Kept in your trials on this still." });
      } else {
        const out = await proposeTry(stillId, result.slug, note || `Recipe values filled from a checked frame (plate check).`);
        setMessage({ tone: "ok", text: `Proposed as revision ${out.revision}; it waits for a lead's review.`, href: `/techniques/${out.slug}/history` });
      }
    } catch (error) {
      setMessage({ tone: "bad", text: error instanceof ApiError ? error.message : "That did not work. Try again." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <article aria-labelledby={`${id}-title`} className={picked ? "space-y-2 rounded border-2 border-accent p-2" : "space-y-2 rounded border border-line p-2"}>
      <div className="flex flex-wrap items-center gap-2">
        <h3 id={`${id}-title`} className="font-semibold">
          <Link href={`/techniques/${result.slug}`} className="hover:text-accent">
            {result.title}
          </Link>
        </h3>
        <span className="text-xs text-muted">rev {result.revision}</span>
        {result.isHouseMethod ? <Badge tone="ok">Department method</Badge> : null}
      </div>
      {result.problem ? (
        <p className="rounded border border-dashed border-line p-3 text-sm text-muted">Not tried: {result.problem}</p>
      ) : (
        <>
          <div className="relative overflow-hidden rounded border border-line bg-stage">
            {/* eslint-disable-next-line @next/next/no-img-element -- a private render from the API, never cached */}
            <img src={tryImageUrl(stillId, result.slug, exact)} alt={`The frame after ${result.title}${exact ? " (exact render)" : " (proxy render)"}`} className="block h-auto w-full" onLoad={() => setLoading(false)} onError={() => setLoading(false)} />
            {loading ? <p role="status" className="absolute inset-x-0 bottom-0 bg-surface/80 px-2 py-1 text-xs">Rendering {exact ? "at full resolution" : "a proxy"}…</p> : null}
          </div>
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => { setExact(!exact); setLoading(true); }} aria-pressed={exact}>
              {exact ? "Show the proxy" : "Render exact"}
            </Button>
            <Button variant={picked ? "primary" : "secondary"} onClick={onPick} aria-pressed={picked}>
              {picked ? "Picked" : "Pick this one"}
            </Button>
          </div>
          {result.measures ? <TryMeasuresTable measures={result.measures} /> : null}
          {result.filled.length || result.skipped.length ? (
            <details className="text-xs">
              <summary className="cursor-pointer text-muted">What was filled in from the findings</summary>
              <ul className="mt-1 list-inside list-disc space-y-0.5">
                {[...result.filled, ...result.skipped].map((line) => <li key={line}>{line}</li>)}
              </ul>
            </details>
          ) : null}
          {picked ? (
            <div className="space-y-2 rounded bg-surface-2 p-2">
              <label className="block text-sm" htmlFor={`${id}-note`}>
                Note (optional for keeping; the change note when proposing)
              </label>
              <input id={`${id}-note`} className="w-full rounded border border-line bg-surface px-2 py-1 text-sm" value={note} maxLength={500} onChange={(e) => setNote(e.target.value)} />
              <div className="flex flex-wrap gap-2">
                <Button variant="primary" disabled={busy} onClick={() => act("keep")}>
                  Keep for my trial
                </Button>
                {canPropose ? (
                  <Button disabled={busy} onClick={() => window.confirm(`Propose these values as a new revision of “${result.title}”? It goes to review; readers keep the approved revision until a lead approves.`) && act("propose")}>
                    Propose as an edit
                  </Button>
                ) : null}
              </div>
            </div>
          ) : null}
          {message ? (
            <p role="status" className={message.tone === "ok" ? "text-sm text-ok" : "text-sm text-bad"}>
              {message.text}{" "}
              {message.href ? (
                <Link href={message.href} className="text-accent">
                  See the history
                </Link>
              ) : null}
            </p>
          ) : null}
        </>
      )}
    </article>
  );
}
