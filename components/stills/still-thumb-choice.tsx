import type { ReactNode } from "react";
import { stillUrl } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

/**
 * One still offered as a choice: its thumbnail and alt text on a card that is a radio button
 * (arrow keys move within the group `name`; the card shows keyboard focus). `details` adds lines below.
 */
export function StillThumbChoice({
  name,
  still,
  checked,
  onChoose,
  thumbClassName = "max-h-20",
  details,
}: {
  name: string;
  still: { id: string; alt: string };
  checked: boolean;
  onChoose: (id: string) => void;
  thumbClassName?: string;
  details?: ReactNode;
}) {
  return (
    <label
      className={cn(
        "block cursor-pointer rounded border p-1 text-xs has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent",
        checked ? "border-accent bg-surface-2" : "border-line",
      )}
    >
      <input type="radio" name={name} value={still.id} checked={checked} onChange={() => onChoose(still.id)} className="sr-only" />
      <span className="block bg-stage">
        {/* eslint-disable-next-line @next/next/no-img-element -- private thumbnails from our API */}
        <img src={stillUrl(still.id, "thumb")} alt={still.alt} className={cn("mx-auto object-contain", thumbClassName)} />
      </span>
      <span className="mt-1 block truncate" title={still.alt}>
        {still.alt}
      </span>
      {details}
    </label>
  );
}
