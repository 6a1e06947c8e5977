import type { ReactNode } from "react";
import { Wordmark } from "@/components/brand/logo-mark";

/** A page outside the signed-in shell (nothing here, not for your role, sign in first): the mark above one notice. */
export function StandaloneFrame({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 p-6">
      <Wordmark />
      {children}
    </main>
  );
}
