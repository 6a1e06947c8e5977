import type { FieldDiff } from "@/lib/techniques/diff";
import { cn } from "@/lib/utils";

/** Word-level changes per field: removed struck through, added underlined (not colour alone). */
export function DiffView({ fields }: { fields: FieldDiff[] }) {
  if (!fields.length) return <p className="text-sm text-muted">These two revisions have the same content.</p>;
  return (
    <div className="space-y-4">
      {fields.map((f) => (
        <section key={f.field} className="rounded border border-line bg-surface p-3">
          <h3 className="mb-2 text-sm font-semibold">{f.label}</h3>
          <p className="font-mono text-sm leading-6 whitespace-pre-wrap">
            {f.segments.map((s, i) => (
              <span
                key={i}
                className={cn(s.kind === "added" && "bg-ok/20 underline decoration-ok", s.kind === "removed" && "bg-bad/20 line-through decoration-bad")}
                aria-label={s.kind === "same" ? undefined : s.kind}
              >
                {s.kind === "added" ? <ins className="no-underline">{s.text}</ins> : s.kind === "removed" ? <del>{s.text}</del> : s.text}
              </span>
            ))}
          </p>
        </section>
      ))}
    </div>
  );
}
