"use client";

import { Button } from "@/components/ui/button";

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return (
    <div role="alert" className="mx-auto max-w-lg space-y-3 rounded-lg border border-bad/50 bg-bad/10 p-6">
      <h1 className="text-lg font-semibold">This page could not be shown</h1>
      <p className="text-sm text-muted">Nothing was changed. {error.digest ? `Reference: ${error.digest}` : null}</p>
      <Button onClick={reset}>Try again</Button>
    </div>
  );
}
