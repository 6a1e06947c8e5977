"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState, type KeyboardEvent } from "react";
import { FinderOptions, type FinderOption } from "@/components/search/finder-options";
import { useDebouncedValue } from "@/components/search/use-debounced-value";
import { apiFetch } from "@/lib/api/fetcher";
import { queryKeys } from "@/lib/api/query-keys";
import { searchHref, type SuggestApiResponse } from "@/lib/search-ui/params";
import { clearRecent, pushRecent, readRecent } from "@/lib/search-ui/recent";

/**
 * The quick finder: a modal <dialog> holding a combobox. Results follow the typing (debounced);
 * ArrowUp/ArrowDown move, Enter opens the highlighted row (or all results when none is), Escape closes.
 */
export function FinderDialog({ open, onClose, userId }: { open: boolean; onClose(): void; userId: string }) {
  const router = useRouter();
  const dialogRef = useRef<HTMLDialogElement>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const [q, setQ] = useState("");
  const [active, setActive] = useState(-1);
  const [recent, setRecent] = useState<string[]>([]);
  const debounced = useDebouncedValue(q.trim(), 120);
  // After choosing a result, focus goes to the page's main content, not back to the Find button.
  const focusMainOnClose = useRef(false);

  useEffect(() => {
    const d = dialogRef.current;
    if (!d) return;
    if (open && !d.open) {
      setQ("");
      setActive(-1);
      setRecent(readRecent(userId));
      d.showModal();
      inputRef.current?.focus();
    }
    if (!open && d.open) {
      d.close();
      if (focusMainOnClose.current) document.getElementById("main")?.focus({ preventScroll: true });
      focusMainOnClose.current = false;
    }
  }, [open, userId]);

  const suggest = useQuery({
    queryKey: queryKeys.search(debounced, { kind: "suggest" }),
    queryFn: ({ signal }) => apiFetch<SuggestApiResponse>(`/api/search/suggest?q=${encodeURIComponent(debounced)}&limit=8`, { signal }),
    enabled: open && debounced.length > 0,
    placeholderData: keepPreviousData,
    staleTime: 15_000,
  });

  const typed = q.trim();
  const options: FinderOption[] = !typed
    ? recent.map((text) => ({ kind: "recent", text }))
    : [...(suggest.data?.items ?? []).map((item) => ({ kind: "technique" as const, item })), { kind: "all", text: typed }];

  function choose(option: FinderOption | undefined) {
    if (!option) {
      if (typed) choose({ kind: "all", text: typed });
      return;
    }
    if (option.kind === "recent") {
      setQ(option.text);
      setActive(-1);
      inputRef.current?.focus();
      return;
    }
    pushRecent(userId, typed);
    focusMainOnClose.current = true;
    router.push(option.kind === "technique" ? `/techniques/${option.item.slug}` : searchHref({ q: option.text }));
    onClose();
  }

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>) {
    if (e.key === "ArrowDown" || e.key === "ArrowUp") {
      e.preventDefault();
      if (!options.length) return;
      const last = options.length - 1;
      setActive((i) => (e.key === "ArrowDown" ? (i >= last ? 0 : i + 1) : i <= 0 ? last : i - 1));
    } else if (e.key === "Enter") {
      e.preventDefault();
      choose(active >= 0 ? options[active] : undefined);
    }
  }

  const status = !typed
    ? recent.length
      ? "Recent searches"
      : "Type a problem, a technique or a shot code."
    : suggest.isError
      ? "Search is not answering. Press Enter to try the full search page."
      : suggest.data && debounced === typed && suggest.data.items.length === 0
        ? "No technique matches. Press Enter to search everything, or ask for a write-up there."
        : suggest.isFetching || debounced !== typed
          ? "Searching…"
          : `${suggest.data?.items.length ?? 0} ${suggest.data?.items.length === 1 ? "technique" : "techniques"}`;

  return (
    <dialog
      ref={dialogRef}
      data-finder
      aria-label="Find a technique"
      onClose={onClose}
      onClick={(e) => e.target === dialogRef.current && onClose()}
      className="mx-auto mt-[12vh] w-full max-w-xl rounded-lg border border-line bg-surface p-0 text-ink backdrop:bg-black/60"
    >
      <div className="border-b border-line p-3">
        <input
          ref={inputRef}
          role="combobox"
          aria-label="Find a technique"
          aria-expanded={options.length > 0}
          aria-controls="finder-listbox"
          aria-autocomplete="list"
          aria-activedescendant={active >= 0 && active < options.length ? `finder-option-${active}` : undefined}
          value={q}
          onChange={(e) => {
            setQ(e.target.value);
            setActive(-1);
          }}
          onKeyDown={onKeyDown}
          placeholder="Describe the problem… (tracker dots, wire on sky, SLM_040_0120)"
          autoComplete="off"
          spellCheck={false}
          maxLength={200}
          className="w-full bg-transparent text-base outline-none placeholder:text-muted"
        />
      </div>
      <p aria-live="polite" className="flex items-center justify-between px-3 pt-2 text-xs text-muted">
        <span>{status}</span>
        {!typed && recent.length ? (
          <button
            type="button"
            className="text-accent hover:underline"
            onClick={() => {
              clearRecent(userId);
              setRecent([]);
              inputRef.current?.focus();
            }}
          >
            Clear
          </button>
        ) : null}
      </p>
      <FinderOptions options={options} active={active} onHover={setActive} onChoose={choose} />
      <p className="border-t border-line px-3 py-2 text-xs text-muted">
        <kbd className="font-mono">↑</kbd> <kbd className="font-mono">↓</kbd> to choose · <kbd className="font-mono">Enter</kbd> to open · <kbd className="font-mono">Esc</kbd> to close
      </p>
    </dialog>
  );
}
