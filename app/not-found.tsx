import Link from "next/link";
import { Wordmark } from "@/components/brand/logo-mark";

export default function NotFound() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-4 p-6 text-center">
      <Wordmark />
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="text-muted">This address shows nothing you can see. It may have moved, or never existed.</p>
      <Link href="/" className="text-accent underline underline-offset-2">
        Back to Plateroom
      </Link>
    </main>
  );
}
