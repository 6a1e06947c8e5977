import type { Metadata } from "next";
import { PeopleManager } from "@/components/people/people-manager";
import { requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const user = await requireUser();
  requirePagePermission(user, "people:manage");
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">People</h1>
      <PeopleManager currentUserId={user.id} />
    </div>
  );
}
