import Link from "next/link";
import { utcTime } from "@/lib/plate-check/format";
import type { KeptRecipeDto } from "@/lib/plate-check/schemas";

/** Filled recipes kept on this still (the reader's own: a kept recipe is its keeper's alone). */
export function KeptList({ items }: { items: KeptRecipeDto[] }) {
  if (!items.length) return null;
  return (
    <section aria-labelledby="kept-title" className="space-y-2">
      <h3 id="kept-title" className="font-semibold">
        Kept recipes on this still
      </h3>
      <ul className="space-y-2">
        {items.map((k) => (
          <li key={k.id} className="rounded border border-line p-2 text-sm">
            <Link href={`/techniques/${k.slug}`} className="font-medium hover:text-accent">
              {k.title}
            </Link>{" "}
            <span className="text-xs text-muted">
              rev {k.revision} · {utcTime(k.createdAt)} · {k.recipe.length} step{k.recipe.length === 1 ? "" : "s"}
            </span>
            {k.note ? <p className="text-muted">{k.note}</p> : null}
            <details className="text-xs">
              <summary className="cursor-pointer text-muted">The filled recipe (JSON for POST /api/lab/run)</summary>
              <pre className="mt-1 max-h-60 overflow-auto rounded bg-surface-2 p-2">{JSON.stringify(k.recipe, null, 2)}</pre>
            </details>
          </li>
        ))}
      </ul>
    </section>
  );
}
