import type { ReactNode } from "react";
import { STILL_TOKEN, type DiffSegment, type DiffStill, type FieldDiff, type PairChange } from "@/lib/techniques/diff";
import { stillUrl } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

/**
 * Word-level changes per field: removed struck through, added underlined (not colour alone);
 * stills in the text as thumbnails, then the before/after pairs added, removed or re-captioned.
 */
export function DiffView({ fields, pairs = [] }: { fields: FieldDiff[]; pairs?: PairChange[] }) {
  if (!fields.length && !pairs.length) return <p className="text-sm text-muted">These two revisions have the same content.</p>;
  return (
    <div className="space-y-4">
      {fields.map((f) => (
        <section key={f.field} className="rounded border border-line bg-surface p-3">
          <h3 className="mb-2 text-sm font-semibold">{f.label}</h3>
          <div className="font-mono text-sm leading-6 whitespace-pre-wrap">
            {f.segments.map((s, i) => (
              <Segment key={i} segment={s} stills={f.stills} />
            ))}
          </div>
        </section>
      ))}
      {pairs.length ? <PairChanges pairs={pairs} /> : null}
    </div>
  );
}

function Segment({ segment, stills }: { segment: DiffSegment; stills?: Record<string, DiffStill> }) {
  const parts: ReactNode[] = [];
  let text = "";
  for (const ch of segment.text) {
    const still = STILL_TOKEN.test(ch) ? stills?.[ch] : undefined;
    if (!still) {
      text += ch;
      continue;
    }
    if (text) parts.push(text);
    text = "";
    parts.push(<StillThumb key={parts.length} still={still} change={segment.kind} />);
  }
  if (text) parts.push(text);
  const content = parts.length === 1 && typeof parts[0] === "string" ? parts[0] : parts;
  if (segment.kind === "added") {
    return (
      <ins className="bg-ok/20 underline decoration-ok" aria-label="added">
        {content}
      </ins>
    );
  }
  if (segment.kind === "removed") {
    return (
      <del className="bg-bad/20 line-through decoration-bad" aria-label="removed">
        {content}
      </del>
    );
  }
  return <span>{content}</span>;
}

const CHANGE_WORD = { added: "Added still", removed: "Removed still", same: "Still" } as const;

function StillThumb({ still, change, label }: { still: DiffStill; change: DiffSegment["kind"]; label?: string }) {
  return (
    <span
      className={cn(
        "my-1 inline-flex flex-col items-start gap-1 rounded border p-1 align-top font-sans text-xs no-underline",
        change === "added" ? "border-ok" : change === "removed" ? "border-bad" : "border-line",
      )}
    >
      {/* eslint-disable-next-line @next/next/no-img-element -- private thumbnails from our API */}
      <img src={stillUrl(still.id, "thumb")} alt={still.alt} className={cn("max-h-24 max-w-40 bg-stage object-contain", change === "removed" && "opacity-60")} />
      <span className="max-w-40 truncate text-muted" title={still.alt}>
        {label ?? CHANGE_WORD[change]}: {still.alt || "no description"}
      </span>
    </span>
  );
}

const PAIR_WORD = { added: "Pair added", removed: "Pair removed", captioned: "Caption changed" } as const;

function PairChanges({ pairs }: { pairs: PairChange[] }) {
  return (
    <section className="rounded border border-line bg-surface p-3">
      <h3 className="mb-2 text-sm font-semibold">Before and after pairs</h3>
      <ul className="space-y-3">
        {pairs.map((p) => (
          <li
            key={`${p.change}-${p.before.id}-${p.after.id}`}
            className={cn("rounded border p-2 text-sm", p.change === "added" ? "border-ok" : p.change === "removed" ? "border-bad" : "border-line")}
          >
            <p className="mb-1 font-medium">{PAIR_WORD[p.change]}</p>
            <div className="flex flex-wrap gap-2">
              <StillThumb still={p.before} change={p.change === "captioned" ? "same" : p.change} label="Before" />
              <span aria-hidden="true" className="self-center text-muted">
                →
              </span>
              <StillThumb still={p.after} change={p.change === "captioned" ? "same" : p.change} label="After" />
            </div>
            {p.change === "captioned" ? (
              <p className="mt-1">
                <del className="bg-bad/20 line-through">{p.previousCaption || "(no caption)"}</del> → <ins className="bg-ok/20">{p.caption || "(no caption)"}</ins>
              </p>
            ) : p.caption ? (
              <p className="mt-1 text-muted">{p.caption}</p>
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}
