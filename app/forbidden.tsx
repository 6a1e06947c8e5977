import { Wordmark } from "@/components/brand/logo-mark";
import { Refused } from "@/components/ui/refused";

/** forbidden() outside the signed-in pages: ours, not Next.js's default (which every page's payload also carried). */
export default function Forbidden() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 p-6">
      <Wordmark />
      <Refused />
    </main>
  );
}
