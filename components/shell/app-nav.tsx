"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import type { NavItem } from "@/components/shell/nav-items";
import { cn } from "@/lib/utils";

export function AppNav({ items, reviewCount }: { items: NavItem[]; reviewCount: number }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
      {items.map((item) => {
        const active = item.href === "/" ? pathname === "/" : pathname.startsWith(item.href);
        return (
          <Link
            key={item.href}
            href={item.href}
            aria-current={active ? "page" : undefined}
            className={cn("rounded px-2.5 py-1.5 text-sm text-muted hover:bg-surface-2 hover:text-ink", active && "bg-surface-2 text-ink")}
          >
            {item.label}
            {item.badge === "review" && reviewCount > 0 ? (
              <span className="ml-1.5 rounded-full bg-accent px-1.5 text-xs font-semibold text-accent-ink" aria-label={`${reviewCount} waiting`}>
                {reviewCount}
              </span>
            ) : null}
          </Link>
        );
      })}
    </nav>
  );
}
