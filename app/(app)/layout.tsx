import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { AppHeader } from "@/components/shell/app-header";
import { NAV_ITEMS } from "@/components/shell/nav-items";
import { can } from "@/lib/auth/permissions";
import { currentUser } from "@/lib/auth/session";
import { THEME_COOKIE } from "@/lib/theme";
import { reviewQueueCountForShell } from "@/lib/techniques/page-data";

export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await currentUser();
  if (!user) redirect("/login");
  const items = NAV_ITEMS.filter((item) => can(user, item.permission));
  const reviewCount = can(user, "technique:review") ? await reviewQueueCountForShell(user) : 0;
  const theme = (await cookies()).get(THEME_COOKIE)?.value === "light" ? "light" : "dark";
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-accent focus:px-3 focus:py-1 focus:text-accent-ink">
        Skip to content
      </a>
      <AppHeader items={items} reviewCount={reviewCount} user={{ id: user.id, name: user.name, role: user.role }} theme={theme} />
      {/* Focusable, so the skip link and the quick finder can move focus to the page itself. */}
      <main id="main" tabIndex={-1} className="mx-auto max-w-7xl px-4 py-6 focus:outline-none">
        {children}
      </main>
    </div>
  );
}
