import type { ReactNode } from "react";
import { Wordmark } from "@/components/brand/logo-mark";

export function AuthCard({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="w-full max-w-sm space-y-6">
        <div className="space-y-2 text-center">
          <div className="flex justify-center text-lg">
            <Wordmark />
          </div>
          <p className="text-sm text-muted">The paint and prep department&apos;s cleanup methods, with their evidence.</p>
        </div>
        <div className="rounded-lg border border-line bg-surface p-6">
          <h1 className="mb-4 text-lg font-semibold">{title}</h1>
          {children}
        </div>
      </div>
    </main>
  );
}
