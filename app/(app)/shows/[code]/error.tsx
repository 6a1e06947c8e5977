"use client";

import { SegmentError } from "@/components/shots/segment-error";

export default function ShowError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return <SegmentError what="This show" back={{ href: "/shows", label: "All shows" }} digest={error.digest} reset={reset} />;
}
