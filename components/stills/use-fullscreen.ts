"use client";

import { useCallback, useSyncExternalStore, type RefObject } from "react";

function subscribe(onChange: () => void): () => void {
  document.addEventListener("fullscreenchange", onChange);
  return () => document.removeEventListener("fullscreenchange", onChange);
}

const never = () => () => undefined;

/**
 * Full screen for one element through the Fullscreen API (WHATWG Fullscreen API Standard):
 * `toggle` enters or leaves; Escape leaves (the browser's own key); `active` follows the
 * document's state, so leaving by Escape updates the button too.
 */
export function useFullscreen(ref: RefObject<HTMLElement | null>): { active: boolean; supported: boolean; toggle: () => void } {
  const supported = useSyncExternalStore(never, () => document.fullscreenEnabled === true, () => false);
  const active = useSyncExternalStore(subscribe, () => document.fullscreenElement !== null && document.fullscreenElement === ref.current, () => false);
  const toggle = useCallback(() => {
    if (document.fullscreenElement) void document.exitFullscreen();
    else void ref.current?.requestFullscreen?.().catch(() => undefined);
  }, [ref]);
  return { active, supported, toggle };
}
