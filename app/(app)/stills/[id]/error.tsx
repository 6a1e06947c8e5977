"use client";

import { SegmentError } from "@/components/shots/segment-error";

export default function StillError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return <SegmentError what="This still" back={{ href: "/check", label: "Plate check" }} digest={error.digest} reset={reset} />;
}
