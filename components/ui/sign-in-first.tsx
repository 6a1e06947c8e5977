"use client";

// A client component only to keep page payloads small (see components/ui/refused.tsx).
import Link from "next/link";

/** The page unauthorized() answers with (401): this needs a signed-in person. */
export function SignInFirst() {
  return (
    <div className="mx-auto max-w-lg rounded-lg border border-line bg-surface p-6 text-center" data-testid="sign-in-first">
      <h1 className="text-lg font-semibold">Sign in first</h1>
      <p className="mt-2 text-sm text-muted">This page is for people signed in to Plateroom.</p>
      <p className="mt-3 text-sm">
        <Link href="/login" className="text-accent underline underline-offset-2">
          Sign in
        </Link>
      </p>
    </div>
  );
}
