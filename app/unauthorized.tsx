import { Wordmark } from "@/components/brand/logo-mark";
import { SignInFirst } from "@/components/ui/sign-in-first";

/** unauthorized(): ours, not Next.js's default (which every page's payload also carried). */
export default function Unauthorized() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 p-6">
      <Wordmark />
      <SignInFirst />
    </main>
  );
}
