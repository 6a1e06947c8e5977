import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";

export default function ShowNotFound() {
  return (
    <EmptyState title="No show with this code.">
      <Link href="/shows" className="text-accent underline underline-offset-2">
        See all shows
      </Link>
    </EmptyState>
  );
}
