import Link from "next/link";
import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/brand/logo-mark";
import { QuickFinder } from "@/components/search/quick-finder";
import { AppNav } from "@/components/shell/app-nav";
import { NAV_ITEMS } from "@/components/shell/nav-items";
import { ThemeToggle } from "@/components/shell/theme-toggle";
import { UserMenu } from "@/components/shell/user-menu";
import { can } from "@/lib/auth/permissions";
import { currentUser } from "@/lib/auth/session";
import { THEME_COOKIE } from "@/lib/theme";
import { countReviewQueue } from "@/lib/techniques/queries";

export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await currentUser();
  if (!user) redirect("/login");
  const items = NAV_ITEMS.filter((item) => can(user, item.permission));
  const reviewCount = can(user, "technique:review") ? await countReviewQueue(user) : 0;
  const theme = (await cookies()).get(THEME_COOKIE)?.value === "light" ? "light" : "dark";
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-accent focus:px-3 focus:py-1 focus:text-accent-ink">
        Skip to content
      </a>
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
      {/* Focusable, so the skip link and the quick finder can move focus to the page itself. */}
      <main id="main" tabIndex={-1} className="mx-auto max-w-7xl px-4 py-6 focus:outline-none">
        {children}
      </main>
    </div>
  );
}
