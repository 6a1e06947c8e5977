"use client";

import Link from "next/link";
import { Wordmark } from "@/components/brand/logo-mark";
import { QuickFinder } from "@/components/search/quick-finder";
import { AppNav } from "@/components/shell/app-nav";
import type { NavItem } from "@/components/shell/nav-items";
import { ThemeToggle } from "@/components/shell/theme-toggle";
import { UserMenu } from "@/components/shell/user-menu";
import type { Role } from "@/lib/auth/roles";
import type { Theme } from "@/lib/theme";

export type HeaderUser = { id: string; name: string; role: Role };

/**
 * The signed-in header: mark, navigation, quick finder, theme and the person. One client component
 * so every page's payload carries these few values rather than the header's element tree (issue 19);
 * its markup is still rendered on the server.
 */
export function AppHeader({ items, reviewCount, user, theme }: { items: NavItem[]; reviewCount: number; user: HeaderUser; theme: Theme }) {
  return (
    <header className="border-b border-line bg-surface">
      <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-4 px-4 py-2">
        <Link href="/" aria-label="Plateroom home">
          <Wordmark />
        </Link>
        <AppNav items={items} reviewCount={reviewCount} />
        <div className="ml-auto flex items-center gap-1">
          <QuickFinder userId={user.id} />
          <ThemeToggle initial={theme} />
          <UserMenu user={user} />
        </div>
      </div>
    </header>
  );
}
