"use client";

// A client component only to keep page payloads small: the server sends a reference to it instead
// of its whole element tree, and Next.js sends the not-found and forbidden pages' trees with every
// page (issue 19). It has no state; its markup is still rendered on the server.

import Link from "next/link";

/** The "not for your role" page (answered with 403 through forbidden()). */
export function Refused({ role }: { role?: string }) {
  return (
    <div className="mx-auto max-w-lg rounded-lg border border-bad/50 bg-bad/10 p-6 text-center" data-testid="refused">
      <h1 className="text-lg font-semibold">Not for your role</h1>
      <p className="mt-2 text-sm text-muted">
        {role ? `This page is open to other roles than ${role}.` : "This page is open to other roles only."}{" "}
        {role === "admin" ? "Admins look after people, mail and the audit log; writing and reviewing techniques is for seniors and leads." : "If you need it, ask an admin."}
      </p>
      <p className="mt-3 text-sm">
        <Link href="/" className="text-accent underline underline-offset-2">
          Back to the start page
        </Link>
      </p>
    </div>
  );
}
