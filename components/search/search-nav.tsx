"use client";

import { useRouter } from "next/navigation";
import { createContext, useContext, useTransition, type ReactNode } from "react";
import { cn } from "@/lib/utils";

/** `optimistic` runs inside the transition, so a control can show its new value before the page answers. */
type SearchNav = { navigate(href: string, optimistic?: () => void): void; isPending: boolean };

const SearchNavContext = createContext<SearchNav | null>(null);

/**
 * One transition for every control of the search page (box, facets, sort), so the results can
 * show that a new search is on its way whichever control started it.
 */
export function SearchNavProvider({ children }: { children: ReactNode }) {
  const router = useRouter();
  const [isPending, startTransition] = useTransition();
  const navigate = (href: string, optimistic?: () => void) =>
    startTransition(() => {
      optimistic?.();
      router.push(href, { scroll: false });
    });
  return <SearchNavContext.Provider value={{ navigate, isPending }}>{children}</SearchNavContext.Provider>;
}

export function useSearchNav(): SearchNav {
  const nav = useContext(SearchNavContext);
  if (!nav) throw new Error("useSearchNav needs a SearchNavProvider");
  return nav;
}

/** Dims the results while a new search loads and tells assistive technology it is busy. */
export function PendingRegion({ children, className }: { children: ReactNode; className?: string }) {
  const { isPending } = useSearchNav();
  return (
    <div aria-busy={isPending} className={cn("transition-opacity", isPending && "opacity-50", className)} data-testid="search-results">
      {children}
    </div>
  );
}
