"use client";

import Link from "next/link";
import { Button } from "@/components/ui/button";

/** What a shows or shots page shows when it fails to render: nothing was changed, try again or go back. */
export function SegmentError({ what, back, digest, reset }: { what: string; back: { href: string; label: string }; digest?: string; reset(): void }) {
  return (
    <div role="alert" className="mx-auto max-w-lg space-y-3 rounded-lg border border-bad/50 bg-bad/10 p-6">
      <h1 className="text-lg font-semibold">{what} could not be shown</h1>
      <p className="text-sm text-muted">Nothing was changed. {digest ? `Reference: ${digest}` : null}</p>
      <div className="flex gap-2">
        <Button onClick={reset}>Try again</Button>
        <Link href={back.href} className="inline-flex items-center px-3 py-1.5 text-sm text-muted hover:text-ink">
          {back.label}
        </Link>
      </div>
    </div>
  );
}
