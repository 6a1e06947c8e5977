import type { Metadata } from "next";
import { MailView } from "@/components/mail/mail-view";
import { requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Mail" };

export default async function MailPage({ searchParams }: { searchParams: Promise<{ tab?: string | string[] }> }) {
  const user = await requireUser();
  requirePagePermission(user, "mail:read-outbox");
  const { tab } = await searchParams;
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-semibold">Mail</h1>
        <p className="text-sm text-muted">What Plateroom has queued and sent, and what the local mail server received.</p>
      </div>
      <MailView initialTab={tab === "delivered" ? "delivered" : "outbox"} />
    </div>
  );
}
