import { cn } from "@/lib/utils";

/** Shown next to every place that accepts stills (shared/PRODUCT.md, "Confidentiality"). */
export function ConfidentialNotice({ className }: { className?: string }) {
  return (
    <p role="note" className={cn("rounded border border-line bg-surface-2 px-3 py-2 text-xs text-muted", className)}>
      <strong className="font-semibold text-ink">Stills may be confidential.</strong> Frames from shows that are not yet released
      fall under the studio&apos;s content-security policy. Upload only what the policy allows; Plateroom keeps files in private
      storage, removes camera, location and author metadata before storing them (pixels and colour profile stay as they are), shows
      them only to signed-in people allowed to see them, and never shares them outside Plateroom.
    </p>
  );
}
