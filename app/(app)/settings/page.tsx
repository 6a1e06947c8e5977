import type { Metadata } from "next";
import { SubscriptionSettings } from "@/components/settings/subscription-settings";
import { TokenManager } from "@/components/settings/token-manager";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { requireUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const user = await requireUser();
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Settings</h1>
        <p className="text-sm text-muted">
          {user.name} · {user.email} · {ROLE_LABELS[user.role]}
        </p>
      </div>
      <SubscriptionSettings />
      <TokenManager />
    </div>
  );
}
