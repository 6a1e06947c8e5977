"use client";

import { signOutAction } from "@/lib/auth/actions";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";

/** Who is signed in, and signing out (a server action). */
export function UserMenu({ user }: { user: { name: string; role: Role } }) {
  return (
    <div className="flex items-center gap-2 text-sm">
      <span className="hidden text-muted sm:inline" data-testid="signed-in-as">
        {user.name} · {ROLE_LABELS[user.role]}
      </span>
      <form action={signOutAction}>
        <button type="submit" className="rounded px-2 py-1.5 text-muted hover:bg-surface-2 hover:text-ink">
          Sign out
        </button>
      </form>
    </div>
  );
}
