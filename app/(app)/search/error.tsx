"use client";

import Link from "next/link";
import { Button } from "@/components/ui/button";

export default function SearchError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return (
    <div role="alert" className="mx-auto max-w-lg space-y-3 rounded-lg border border-bad/50 bg-bad/10 p-6">
      <h1 className="text-lg font-semibold">Search is not answering right now</h1>
      <p className="text-sm text-muted">
        Try again in a moment, or browse the <Link href="/problems" className="text-accent underline">problems</Link> list instead.{" "}
        {error.digest ? `Reference: ${error.digest}` : null}
      </p>
      <Button onClick={reset}>Try again</Button>
    </div>
  );
}
