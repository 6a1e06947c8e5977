import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard } from "@/components/auth/auth-card";
import { UnsubscribeConfirm } from "@/components/mail/unsubscribe-confirm";
import { isAppError } from "@/lib/api/errors";
import { verifyUnsubscribeToken, type UnsubscribeTarget } from "@/lib/mail/unsubscribe";
import { labelsFor } from "@/lib/subscriptions/queries";

export const metadata: Metadata = { title: "Unsubscribe", robots: { index: false } };

/** What the link stops, in words: the technique's title, the tag's name, the show. */
async function describeTarget(target: UnsubscribeTarget): Promise<string> {
  if (target.kind === "all") return "anything you follow, including your daily digest";
  const label = (await labelsFor([{ kind: target.kind, key: target.key }])).get(`${target.kind}:${target.key}`) ?? target.key;
  if (target.kind === "technique") return `the technique “${label}”`;
  if (target.kind === "tag") return `the tag “${label}”`;
  return `the show ${label}`;
}

/**
 * Where the unsubscribe link in a message leads (GET /api/unsubscribe redirects here). Public:
 * the signed token decides, and the page itself changes nothing until confirmed.
 */
export default async function UnsubscribePage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const raw = (await searchParams).token;
  const token = typeof raw === "string" ? raw : "";
  let target: UnsubscribeTarget;
  try {
    target = verifyUnsubscribeToken(token);
  } catch (error) {
    const message = isAppError(error) ? error.message : "This unsubscribe link is not valid.";
    return (
      <AuthCard title="This link does not work">
        <div role="alert" className="space-y-3 text-sm" data-testid="unsubscribe-invalid">
          <p>{message}</p>
          <p className="text-muted">
            Links in older messages expire, and a link that was changed on the way is refused. <Link href="/settings" className="text-accent underline">Sign in to manage what you follow</Link>.
          </p>
        </div>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Unsubscribe">
      <UnsubscribeConfirm token={token} what={await describeTarget(target)} />
    </AuthCard>
  );
}
