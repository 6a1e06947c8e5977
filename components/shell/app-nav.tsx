"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useId, useRef, useState, type KeyboardEvent } from "react";
import type { NavItem } from "@/components/shell/nav-items";
import { cn } from "@/lib/utils";

const linkClass = "rounded px-2.5 py-1.5 text-sm whitespace-nowrap text-muted hover:bg-surface-2 hover:text-ink";
const isActive = (href: string, pathname: string) => (href === "/" ? pathname === "/" : pathname.startsWith(href));

export function AppNav({ items, reviewCount }: { items: NavItem[]; reviewCount: number }) {
  const pathname = usePathname();
  const tucked = items.filter((item) => item.tucked);
  // One tucked destination alone is not worth a menu: it stays on the bar.
  const inMenu = tucked.length > 1 ? tucked : [];
  return (
    <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
      {items
        .filter((item) => !inMenu.includes(item))
        .map((item) => {
          const active = isActive(item.href, pathname);
          return (
            <Link key={item.href} href={item.href} aria-current={active ? "page" : undefined} className={cn(linkClass, active && "bg-surface-2 text-ink")}>
              {item.label}
              {item.badge === "review" && reviewCount > 0 ? (
                <span className="ml-1.5 rounded-full bg-accent px-1.5 text-xs font-semibold text-accent-ink" aria-label={`${reviewCount} waiting`}>
                  {reviewCount}
                </span>
              ) : null}
            </Link>
          );
        })}
      {inMenu.length > 0 ? <HousekeepingMenu items={inMenu} pathname={pathname} /> : null}
    </nav>
  );
}

/**
 * The less-used destinations behind one button (a disclosure of links): Enter/Space opens it,
 * arrow keys move between its links, Escape or a click elsewhere closes it.
 */
function HousekeepingMenu({ items, pathname }: { items: NavItem[]; pathname: string }) {
  const [open, setOpen] = useState(false);
  // Opens towards whichever side has room: the bar wraps on narrow screens, so the button can sit anywhere.
  const [alignRight, setAlignRight] = useState(false);
  const wrapper = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const id = useId();
  const active = items.some((item) => isActive(item.href, pathname));

  useEffect(() => {
    if (!open) return;
    const closeOutside = (event: PointerEvent) => {
      if (!wrapper.current?.contains(event.target as Node)) setOpen(false);
    };
    document.addEventListener("pointerdown", closeOutside);
    return () => document.removeEventListener("pointerdown", closeOutside);
  }, [open]);

  const links = () => [...(wrapper.current?.querySelectorAll<HTMLAnchorElement>("ul a") ?? [])];
  function toggle() {
    const box = button.current?.getBoundingClientRect();
    if (box) setAlignRight(box.left + 192 > window.innerWidth);
    setOpen((o) => !o);
  }
  function onKeyDown(event: KeyboardEvent) {
    if (event.key === "Escape" && open) {
      setOpen(false);
      button.current?.focus();
      return;
    }
    if (event.key !== "ArrowDown" && event.key !== "ArrowUp") return;
    event.preventDefault();
    if (!open) {
      toggle();
      requestAnimationFrame(() => links()[0]?.focus());
      return;
    }
    const all = links();
    const at = all.indexOf(document.activeElement as HTMLAnchorElement);
    const next = event.key === "ArrowDown" ? (at + 1) % all.length : (at <= 0 ? all.length : at) - 1;
    all[next]?.focus();
  }

  return (
    <div
      ref={wrapper}
      className="relative"
      onKeyDown={onKeyDown}
      onBlur={(event) => {
        if (!wrapper.current?.contains(event.relatedTarget)) setOpen(false);
      }}
    >
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={id}
        onClick={toggle}
        className={cn(linkClass, "inline-flex items-center gap-1", (active || open) && "bg-surface-2 text-ink")}
      >
        Housekeeping
        <svg aria-hidden="true" viewBox="0 0 12 12" className={cn("size-3 transition-transform", open && "rotate-180")}>
          <path d="M2.5 4.5 6 8l3.5-3.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
        </svg>
      </button>
      <ul
        id={id}
        hidden={!open}
        className={cn("absolute top-full z-40 mt-1 w-48 rounded border border-line bg-surface p-1 shadow-lg", alignRight ? "right-0" : "left-0")}
      >
        {items.map((item) => {
          const current = isActive(item.href, pathname);
          return (
            <li key={item.href}>
              <Link href={item.href} aria-current={current ? "page" : undefined} onClick={() => setOpen(false)} className={cn(linkClass, "block", current && "bg-surface-2 text-ink")}>
                {item.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </div>
  );
}
