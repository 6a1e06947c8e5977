import { useCallback, useEffect, useLayoutEffect, useRef, useState } from "react";
import { z } from "zod";

import { techniqueDocumentSchema } from "@/lib/techniques/document";

/*
 * Local draft recovery: the in-progress form is kept in localStorage so a reload or a crashed
 * tab loses at most the last debounce interval. A stored draft is only ever OFFERED (banner with
 * restore / discard); it is never applied on its own, and while it is on offer nothing
 * overwrites it.
 */

export const techniqueDraftSchema = z.object({
  title: z.string(),
  summary: z.string(),
  aliases: z.array(z.string()),
  tags: z.array(z.string()),
  body: techniqueDocumentSchema,
});
export type TechniqueDraft = z.infer<typeof techniqueDraftSchema>;

const STORAGE_PREFIX = "plateroom:draft:";
const storedSchema = z.object({ v: z.literal(1), savedAt: z.string(), value: z.unknown() });

export function draftStorageKey(draftKey: string): string {
  return STORAGE_PREFIX + draftKey;
}

/** Remove a stored draft, e.g. after a save that did not go through the hook's clear(). */
function clearStoredDraft(draftKey: string): void {
  try {
    window.localStorage.removeItem(draftStorageKey(draftKey));
  } catch {
    // storage disabled or blocked: nothing to clear
  }
}

/** JSON with sorted keys: the server's jsonb does not keep key order, the editor does. */
function stableJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === "object" && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1)))
      : v,
  );
}

export type DraftRecovery<T> = {
  /** A stored draft that differs from what was loaded; show a banner while this is not null. */
  recoverable: T | null;
  /** When the offered draft was saved locally. */
  savedAt: Date | null;
  /** Hand the offered draft to onRestore and stop offering it. */
  restore(): T | null;
  /** Delete the offered draft and keep the loaded value. */
  discard(): void;
  /** Call after a successful save: removes the stored draft until the form changes again. */
  clear(): void;
};

type DraftRecoveryOptions<T> = {
  /** localStorage key suffix, e.g. `technique:${slug}` or "technique:new"; undefined turns it off. */
  draftKey: string | undefined;
  /** The form as it is now. */
  value: T;
  /** The form as loaded from the server (what a draft is compared with on mount). */
  loaded: T;
  /** Stored text is untrusted (older format, another tab, hand edits): it is parsed first. */
  schema: z.ZodType<T>;
  onRestore(draft: T): void;
  debounceMs?: number;
};

export function useDraftRecovery<T>({
  draftKey,
  value,
  loaded,
  schema,
  onRestore,
  debounceMs = 600,
}: DraftRecoveryOptions<T>): DraftRecovery<T> {
  // Saving starts only once the stored draft has been looked at (and, if offered, decided on).
  const [state, setState] = useState<{ isReady: boolean; offer: { value: T; savedAt: Date } | null }>({
    isReady: false,
    offer: null,
  });
  const { isReady, offer } = state;
  const baseline = useRef(stableJson(loaded));
  const latest = useRef(value);
  useLayoutEffect(() => {
    latest.current = value;
  }, [value]);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);

  useEffect(() => {
    if (!draftKey) return;
    const found = readDraft(draftKey, schema);
    const isDifferent = found !== null && stableJson(found.value) !== baseline.current;
    if (!isDifferent) clearStoredDraft(draftKey);
    // localStorage exists only in the browser, after hydration: an effect is the place to read it.
    setState({ isReady: !isDifferent, offer: isDifferent ? found : null });
    // Only on mount / key change: later value changes are the user's own edits.
  }, [draftKey, schema]);

  const write = useCallback(() => {
    if (!draftKey) return;
    const json = stableJson(latest.current);
    try {
      if (json === baseline.current) {
        window.localStorage.removeItem(draftStorageKey(draftKey));
      } else {
        const record = { v: 1, savedAt: new Date().toISOString(), value: latest.current };
        window.localStorage.setItem(draftStorageKey(draftKey), JSON.stringify(record));
      }
    } catch {
      // Quota or privacy mode: recovery is a convenience, the form still works.
    }
  }, [draftKey]);

  useEffect(() => {
    if (!draftKey || !isReady || offer) return;
    clearTimeout(timer.current);
    timer.current = setTimeout(write, debounceMs);
    return () => clearTimeout(timer.current);
  }, [draftKey, isReady, offer, value, write, debounceMs]);

  // A reload fires pagehide: write now rather than lose the debounce interval.
  useEffect(() => {
    if (!draftKey || !isReady || offer) return;
    const flush = () => {
      clearTimeout(timer.current);
      write();
    };
    window.addEventListener("pagehide", flush);
    return () => window.removeEventListener("pagehide", flush);
  }, [draftKey, isReady, offer, write]);

  const restore = useCallback((): T | null => {
    if (!offer) return null;
    setState({ isReady: true, offer: null });
    onRestore(offer.value);
    return offer.value;
  }, [offer, onRestore]);

  const discard = useCallback(() => {
    if (draftKey) clearStoredDraft(draftKey);
    setState({ isReady: true, offer: null });
  }, [draftKey]);

  const clear = useCallback(() => {
    clearTimeout(timer.current);
    baseline.current = stableJson(latest.current);
    if (draftKey) clearStoredDraft(draftKey);
  }, [draftKey]);

  return { recoverable: offer?.value ?? null, savedAt: offer?.savedAt ?? null, restore, discard, clear };
}

function readDraft<T>(draftKey: string, schema: z.ZodType<T>): { value: T; savedAt: Date } | null {
  let raw: string | null;
  try {
    raw = window.localStorage.getItem(draftStorageKey(draftKey));
  } catch {
    return null;
  }
  if (raw === null) return null;
  const stored = storedSchema.safeParse(safeJson(raw));
  if (!stored.success) return null;
  const parsed = schema.safeParse(stored.data.value);
  return parsed.success ? { value: parsed.data, savedAt: new Date(stored.data.savedAt) } : null;
}

function safeJson(raw: string): unknown {
  try {
    return JSON.parse(raw);
  } catch {
    return null;
  }
}
