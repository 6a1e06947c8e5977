"use client";

import { useState } from "react";
import { THEME_COOKIE, type Theme } from "@/lib/theme";

export function ThemeToggle({ initial }: { initial: Theme }) {
  const [theme, setTheme] = useState<Theme>(initial);
  function toggle() {
    const next: Theme = theme === "dark" ? "light" : "dark";
    document.documentElement.classList.toggle("light", next === "light");
    document.cookie = `${THEME_COOKIE}=${next}; path=/; max-age=31536000; samesite=lax`;
    setTheme(next);
  }
  return (
    <button
      type="button"
      onClick={toggle}
      className="rounded px-2 py-1.5 text-sm text-muted hover:bg-surface-2 hover:text-ink"
      aria-label={theme === "dark" ? "Use the light theme" : "Use the dark theme"}
    >
      {theme === "dark" ? "Light" : "Dark"}
    </button>
  );
}
