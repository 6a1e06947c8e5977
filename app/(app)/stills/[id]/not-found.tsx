import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";

export default function StillNotFound() {
  return (
    <EmptyState title="No still at this address.">
      It may have been removed, or it is someone else&apos;s private trial.{" "}
      <Link href="/check" className="text-accent underline underline-offset-2">
        Check a frame of your own
      </Link>
      .
    </EmptyState>
  );
}
