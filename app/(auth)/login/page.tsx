import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { AuthCard } from "@/components/auth/auth-card";
import { LoginForm } from "@/components/auth/login-form";
import { currentUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Sign in" };

export default async function LoginPage({ searchParams }: { searchParams: Promise<{ next?: string; password?: string }> }) {
  const { next, password } = await searchParams;
  if (await currentUser()) redirect("/");
  return (
    <AuthCard title="Sign in">
      {password === "set" ? (
        <p className="mb-4 rounded border border-ok/50 bg-ok/10 px-3 py-2 text-sm text-ok" role="status">
          Your password is set. Sign in with it now.
        </p>
      ) : null}
      <LoginForm next={typeof next === "string" ? next : "/"} />
      <p className="mt-4 text-center text-sm text-muted">
        <Link href="/forgot-password" className="underline underline-offset-2 hover:text-ink">
          Forgot your password?
        </Link>
      </p>
    </AuthCard>
  );
}
