import { authedRoute, otherMethods } from "@/lib/api/handler";
import { invitePerson } from "@/lib/people/mutations";
import { listPeople } from "@/lib/people/queries";
import { invitePersonSchema, type PeopleResponse } from "@/lib/people/schemas";

export const GET = authedRoute("people:manage", async (req, { user }) => {
  return Response.json({ items: await listPeople(user) } satisfies PeopleResponse);
});

export const POST = authedRoute("people:manage", async (req, { user, json }) => {
  const input = await json(invitePersonSchema);
  return Response.json(await invitePerson(user, input), { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
