import { highlight } from "@/lib/search/highlight";

/** Text with the matched ranges wrapped in <mark>; rendered as React text, never as HTML. */
export function HighlightedText({ text, ranges, className }: { text: string; ranges: ReadonlyArray<readonly [number, number]>; className?: string }) {
  return (
    <span className={className}>
      {highlight(text, ranges).map((seg, i) =>
        seg.isMatch ? (
          <mark key={i} className="rounded-sm bg-accent/25 px-px text-ink">
            {seg.text}
          </mark>
        ) : (
          seg.text
        ),
      )}
    </span>
  );
}
