import type { Metadata } from "next";
import { PeopleManager } from "@/components/people/people-manager";
import { Refused } from "@/components/ui/refused";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const user = await requireUser();
  if (!can(user, "people:manage")) return <Refused what="Managing people" />;
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">People</h1>
      <PeopleManager currentUserId={user.id} />
    </div>
  );
}
