"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClasses } from "@/components/ui/field";
import { StillThumbChoice } from "@/components/stills/still-thumb-choice";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { StillPairResponse, StillResponse } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

type PairCandidate = Pick<StillResponse, "id" | "alt" | "role" | "width" | "height">;

type PairEditorProps = {
  /** Technique slug; both stills must belong to it. */
  technique: string;
  /** Stills of the technique to choose from (e.g. GET /api/stills?technique=… or fresh uploads). */
  stills: PairCandidate[];
  onSaved?: (pair: StillPairResponse) => void;
};

/** Pick a before and an after from a technique's stills and save them as a pair. */
export function PairEditor({ technique, stills, onSaved }: PairEditorProps) {
  const id = useId();
  const [before, setBefore] = useState<string | null>(() => stills.find((s) => s.role === "before")?.id ?? null);
  const [after, setAfter] = useState<string | null>(() => stills.find((s) => s.role === "after")?.id ?? null);
  const [caption, setCaption] = useState("");
  const [saving, setSaving] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);

  async function save() {
    if (!before || !after) return setMessage({ ok: false, text: "Pick a before and an after still." });
    if (before === after) return setMessage({ ok: false, text: "Before and after must be different stills." });
    setSaving(true);
    setMessage(null);
    try {
      const pair = await apiFetch<StillPairResponse>("/api/stills/pairs", { method: "POST", json: { technique, before, after, caption: caption.trim() || undefined } });
      setMessage({ ok: true, text: `Pair saved in revision ${pair.revision}.` });
      onSaved?.(pair);
    } catch (e) {
      setMessage({ ok: false, text: e instanceof ApiError ? e.message : "Could not save the pair." });
    } finally {
      setSaving(false);
    }
  }

  if (stills.length < 2) return <p className="text-sm text-muted">Upload at least two stills to make a before/after pair.</p>;

  return (
    <section aria-label="Make a before/after pair" className="space-y-3">
      <div className="grid gap-3 md:grid-cols-2">
        <StillChoice legend="Before" name={`${id}-before`} stills={stills} value={before} onChange={setBefore} />
        <StillChoice legend="After" name={`${id}-after`} stills={stills} value={after} onChange={setAfter} />
      </div>
      <div className="space-y-1">
        <label htmlFor={`${id}-caption`} className="block text-sm font-medium">
          Caption <span className="text-muted">(optional)</span>
        </label>
        <input id={`${id}-caption`} className={inputClasses} value={caption} maxLength={500} onChange={(e) => setCaption(e.target.value)} />
      </div>
      <div className="flex items-center gap-3">
        <Button variant="primary" onClick={() => void save()} disabled={saving}>
          {saving ? "Saving…" : "Save pair"}
        </Button>
        {message ? (
          <p role="status" className={cn("text-sm", message.ok ? "text-ok" : "text-bad")}>
            {message.text}
          </p>
        ) : null}
      </div>
    </section>
  );
}

function StillChoice({ legend, name, stills, value, onChange }: { legend: string; name: string; stills: PairCandidate[]; value: string | null; onChange: (id: string) => void }) {
  return (
    <fieldset className="space-y-2 rounded border border-line p-2">
      <legend className="px-1 text-sm font-medium">{legend}</legend>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
        {stills.map((s) => (
          <StillThumbChoice
            key={s.id}
            name={name}
            still={s}
            checked={value === s.id}
            onChoose={onChange}
            thumbClassName="max-h-24"
            details={
              <span className="block text-muted">
                {s.width}×{s.height} · {s.role}
              </span>
            }
          />
        ))}
      </div>
    </fieldset>
  );
}
