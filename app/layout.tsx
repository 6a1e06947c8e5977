import type { Metadata } from "next";
import { cookies } from "next/headers";
import type { ReactNode } from "react";
import { mono, sans } from "@/app/fonts";
import { Providers } from "@/app/providers";
import { THEME_COOKIE } from "@/lib/theme";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Plateroom", template: "%s · Plateroom" },
  description: "The paint and prep department's knowledge base of plate-cleanup techniques.",
  icons: { icon: "/logo.svg" },
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  // The theme lives in a cookie so the server renders the right one: no flash, no inline script.
  const theme = (await cookies()).get(THEME_COOKIE)?.value === "light" ? "light" : "dark";
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable} ${theme === "light" ? "light" : ""}`}>
      <body className="min-h-screen antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
