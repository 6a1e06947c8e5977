import Link from "next/link";
import { RequestList } from "@/components/requests/request-list";
import { TechniqueList } from "@/components/techniques/technique-list";
import { buttonClasses } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listRequests } from "@/lib/requests/queries";
import { listSubscriptions } from "@/lib/subscriptions/queries";
import { listMyDrafts, listReviewQueue, listTechniques } from "@/lib/techniques/queries";

export default async function HomePage() {
  const user = await requireUser();
  const [recent, drafts, queue, openRequests, myRequests, subscriptions] = await Promise.all([
    listTechniques(user, { status: "approved", limit: 8 }),
    listMyDrafts(user),
    can(user, "technique:review") ? listReviewQueue(user) : Promise.resolve([]),
    can(user, "request:claim") ? listRequests(user, "open") : Promise.resolve([]),
    listRequests(user, "mine"),
    listSubscriptions(user),
  ]);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">Hello, {user.name.split(" ")[0]}</h1>
        <Link href="/search" className={buttonClasses("secondary", "ml-auto")}>
          Find a method by problem
        </Link>
      </div>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <div className="space-y-6">
          {can(user, "technique:review") ? (
            <Card>
              <CardTitle action={<Link href="/review" className="text-sm text-accent">Open the queue</Link>}>Waiting for your review ({queue.length})</CardTitle>
              {queue.length ? (
                <ul className="space-y-1 text-sm">
                  {queue.slice(0, 6).map((q) => (
                    <li key={q.slug}>
                      <Link href={`/techniques/${q.slug}`} className="hover:text-accent">
                        {q.title}
                      </Link>{" "}
                      <span className="text-muted">rev {q.revision} by {q.author?.name ?? "someone"}</span>
                    </li>
                  ))}
                </ul>
              ) : (
                <EmptyState title="Nothing waiting for review." />
              )}
            </Card>
          ) : null}
          {can(user, "technique:write") ? (
            <Card>
              <CardTitle action={<Link href="/techniques/new" className="text-sm text-accent">Write a technique</Link>}>My drafts</CardTitle>
              {drafts.length ? (
                <ul className="space-y-1 text-sm">
                  {drafts.map((d) => (
                    <li key={d.slug}>
                      <Link href={`/techniques/${d.slug}`} className="hover:text-accent">
                        {d.title}
                      </Link>{" "}
                      <span className="text-muted">
                        rev {d.revision} · {d.state === "returned" ? "sent back — see the note" : d.state === "in_review" ? "waiting for review" : "draft"}
                      </span>
                    </li>
                  ))}
                </ul>
              ) : (
                <EmptyState title="No drafts. Write up a method you keep solving again." />
              )}
            </Card>
          ) : null}
          <section aria-labelledby="recent-title" className="space-y-2">
            <h2 id="recent-title" className="font-semibold">
              Recently approved
            </h2>
            <TechniqueList items={recent.items} empty="Nothing approved yet." />
          </section>
        </div>
        <div className="space-y-6">
          <Card>
            <CardTitle action={<Link href="/settings" className="text-sm text-accent">Manage</Link>}>Following</CardTitle>
            {subscriptions.items.length ? (
              <ul className="space-y-1 text-sm">
                {subscriptions.items.map((s) => (
                  <li key={`${s.target.kind}:${s.target.key}`}>
                    <span className="text-muted">{s.target.kind}</span> {s.label}
                  </li>
                ))}
              </ul>
            ) : (
              <EmptyState title="You follow nothing yet.">Follow a technique, problem or show to hear when it changes.</EmptyState>
            )}
          </Card>
          {can(user, "request:claim") ? (
            <Card>
              <CardTitle>Requested write-ups</CardTitle>
              <RequestList items={openRequests} canClaim />
            </Card>
          ) : null}
          <Card>
            <CardTitle>My requests</CardTitle>
            <RequestList items={myRequests} canClaim={false} />
          </Card>
        </div>
      </div>
    </div>
  );
}
