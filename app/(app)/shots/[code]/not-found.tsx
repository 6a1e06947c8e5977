import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";

export default function ShotNotFound() {
  return (
    <EmptyState title="No shot with this code.">
      Check the code (it looks like SLM_040_0120), or find it on its{" "}
      <Link href="/shows" className="text-accent underline underline-offset-2">
        show
      </Link>
      .
    </EmptyState>
  );
}
