"use client";

import type { TagRef } from "@/lib/techniques/schemas";
import { cn } from "@/lib/utils";

/** Problem and plate tags as toggle chips; leads maintain the lists. */
export function TagPicker({ tags, value, onChange }: { tags: TagRef[]; value: string[]; onChange(next: string[]): void }) {
  const groups: Array<{ kind: TagRef["kind"]; label: string }> = [
    { kind: "problem", label: "What is wrong in the plate" },
    { kind: "plate", label: "What the plate is" },
  ];
  return (
    <div className="space-y-3">
      {groups.map((group) => (
        <fieldset key={group.kind}>
          <legend className="mb-1 text-xs font-medium text-muted">{group.label}</legend>
          <div className="flex flex-wrap gap-1.5">
            {tags
              .filter((t) => t.kind === group.kind)
              .map((tag) => {
                const on = value.includes(tag.slug);
                return (
                  <button
                    key={tag.slug}
                    type="button"
                    aria-pressed={on}
                    onClick={() => onChange(on ? value.filter((s) => s !== tag.slug) : [...value, tag.slug])}
                    className={cn(
                      "rounded-full border px-2.5 py-0.5 text-xs",
                      on ? "border-accent bg-accent text-accent-ink" : "border-line text-muted hover:text-ink",
                    )}
                  >
                    {tag.name}
                  </button>
                );
              })}
          </div>
        </fieldset>
      ))}
    </div>
  );
}
