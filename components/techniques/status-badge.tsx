import { Badge } from "@/components/ui/badge";
import { STATUS_LABELS, type TechniqueStatus } from "@/lib/techniques/schemas";

const TONE = { draft: "neutral", in_review: "warn", approved: "ok", retired: "bad" } as const;

export function StatusBadge({ status }: { status: TechniqueStatus }) {
  return <Badge tone={TONE[status]}>{STATUS_LABELS[status]}</Badge>;
}

export function HouseMethodBadge({ tagName }: { tagName?: string }) {
  return <Badge tone="accent">{tagName ? `Department method · ${tagName}` : "Department method"}</Badge>;
}
