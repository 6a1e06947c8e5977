import type { UseResponse } from "@/lib/uses/schemas";

/** A use log row as the API answers it, numbered `i` (shot code, note and time follow it). */
export function logRow(i: number, over: Partial<UseResponse> = {}): UseResponse {
  return {
    id: `u${i}`,
    technique: { id: "t", slug: "dot-paint-out", title: "Dot paint-out", status: "approved" },
    shot: { code: `KYR_010_${String(i).padStart(4, "0")}`, showCode: "KYR", sequence: "010" },
    outcome: "clean",
    note: `note ${i}`,
    user: { id: "p", name: "Person" },
    beforeStill: null,
    afterStill: null,
    revisionId: null,
    canEdit: false,
    createdAt: new Date(Date.UTC(2026, 0, 1 + i)).toISOString(),
    updatedAt: new Date(Date.UTC(2026, 0, 1 + i)).toISOString(),
    ...over,
  };
}
