import type { Metadata } from "next";
import { AuthCard } from "@/components/auth/auth-card";
import { SetPasswordForm } from "@/components/auth/set-password-form";

export const metadata: Metadata = { title: "Set your password" };

export default async function SetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  return (
    <AuthCard title="Set your password">
      {typeof token === "string" && token ? (
        <SetPasswordForm token={token} />
      ) : (
        <p className="text-sm text-muted">This page needs the link from your invitation or reset mail.</p>
      )}
    </AuthCard>
  );
}
