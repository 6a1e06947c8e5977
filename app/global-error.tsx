"use client";

export default function GlobalError({ reset }: { error: Error; reset(): void }) {
  return (
    <html lang="en">
      <body style={{ background: "#161616", color: "#ececec", fontFamily: "sans-serif", padding: "2rem" }}>
        <h1>Plateroom could not load this page</h1>
        <p>Nothing was changed.</p>
        <button onClick={reset}>Try again</button>
      </body>
    </html>
  );
}
