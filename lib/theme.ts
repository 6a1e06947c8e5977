export const THEME_COOKIE = "plateroom-theme";
export type Theme = "dark" | "light";
