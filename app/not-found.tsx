import { Wordmark } from "@/components/brand/logo-mark";
import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function NotFound() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center p-6">
      <Wordmark />
      <NotFoundNotice />
    </main>
  );
}
