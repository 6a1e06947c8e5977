import localFont from "next/font/local";

// Shipped with the app from @fontsource packages: nothing is fetched at build or run time.
export const sans = localFont({
  src: [
    { path: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2", style: "normal" },
    { path: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-italic.woff2", style: "italic" },
  ],
  variable: "--font-sans",
  display: "swap",
});

export const mono = localFont({
  src: [{ path: "../node_modules/@fontsource-variable/jetbrains-mono/files/jetbrains-mono-latin-wght-normal.woff2", style: "normal" }],
  variable: "--font-mono",
  display: "swap",
});
