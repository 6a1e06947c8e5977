import Link from "next/link";
import type { TagRef } from "@/lib/techniques/schemas";

export function TagChips({ tags }: { tags: TagRef[] }) {
  if (!tags.length) return null;
  return (
    <ul className="flex flex-wrap gap-1.5" aria-label="Tags">
      {tags.map((tag) => (
        <li key={tag.slug}>
          <Link
            href={`/problems/${tag.slug}`}
            className="rounded-full border border-line px-2 py-0.5 text-xs text-muted hover:border-accent hover:text-ink"
            title={tag.kind === "problem" ? "Problem" : "Plate"}
          >
            {tag.kind === "plate" ? "◻ " : ""}
            {tag.name}
          </Link>
        </li>
      ))}
    </ul>
  );
}
