import type { Metadata } from "next";
import { Refused } from "@/components/ui/refused";
import { currentUser } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Not for your role" };

export default async function Forbidden() {
  const user = await currentUser();
  return <Refused role={user?.role} />;
}
