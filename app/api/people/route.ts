import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { invitePerson } from "@/lib/people/mutations";
import { listPeople } from "@/lib/people/queries";
import { invitePersonSchema, type PeopleResponse } from "@/lib/people/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ items: await listPeople(user) } satisfies PeopleResponse);
});

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, invitePersonSchema);
  return Response.json(await invitePerson(user, input), { status: 201 });
});
