import type { Permission } from "@/lib/auth/permissions";

/** `tucked`: a less-used destination, gathered with the others under one menu so the bar keeps to one row. */
export type NavItem = { href: string; label: string; permission: Permission; badge?: "review"; tucked?: true };

/** The signed-in navigation; each entry shows only to people whose role has its permission. */
export const NAV_ITEMS: NavItem[] = [
  { href: "/", label: "Home", permission: "technique:read" },
  { href: "/techniques", label: "Techniques", permission: "technique:read" },
  { href: "/problems", label: "Problems", permission: "technique:read" },
  { href: "/search", label: "Search", permission: "technique:read" },
  { href: "/check", label: "Plate check", permission: "still:check" },
  { href: "/shows", label: "Shows", permission: "technique:read" },
  { href: "/review", label: "Review", permission: "technique:review", badge: "review" },
  { href: "/thesaurus", label: "Thesaurus", permission: "thesaurus:manage", tucked: true },
  { href: "/people", label: "People", permission: "people:manage", tucked: true },
  { href: "/mail", label: "Mail", permission: "mail:read-outbox", tucked: true },
  { href: "/audit", label: "Audit", permission: "audit:read", tucked: true },
  { href: "/settings", label: "Settings", permission: "token:manage", tucked: true },
];
