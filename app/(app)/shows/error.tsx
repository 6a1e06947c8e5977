"use client";

import { SegmentError } from "@/components/shots/segment-error";

export default function ShowsError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return <SegmentError what="The list of shows" back={{ href: "/", label: "Home" }} digest={error.digest} reset={reset} />;
}
