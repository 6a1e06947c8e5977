"use client";

import { SegmentError } from "@/components/shots/segment-error";

export default function ShotError({ error, reset }: { error: Error & { digest?: string }; reset(): void }) {
  return <SegmentError what="This shot" back={{ href: "/shows", label: "All shows" }} digest={error.digest} reset={reset} />;
}
