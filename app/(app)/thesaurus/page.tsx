import type { Metadata } from "next";
import { ThesaurusList } from "@/components/thesaurus/thesaurus-list";
import { Card } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listThesaurusEntries } from "@/lib/thesaurus/queries";

export const metadata: Metadata = { title: "Thesaurus" };

export default async function ThesaurusPage() {
  const user = await requireUser();
  const entries = await listThesaurusEntries(user);
  const canManage = can(user, "thesaurus:manage");
  return (
    <div className="space-y-5">
      <div>
        <h1 className="text-2xl font-semibold">Thesaurus</h1>
        <p className="mt-1 max-w-3xl text-sm text-muted">
          The words the department uses for the same thing. Search uses them for everyone, a little below the exact word typed: terms of the same
          meaning find each other; narrower terms also find their broader term, not the other way round. A term in quotes is met only by its
          exact words and their plurals.
          {canManage ? " Changes apply to the next search and are kept in the audit log." : null}
        </p>
      </div>
      <Card>
        <ThesaurusList entries={entries} canManage={canManage} />
      </Card>
    </div>
  );
}
