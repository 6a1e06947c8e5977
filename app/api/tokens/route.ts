import { authedRoute, otherMethods } from "@/lib/api/handler";
import { createApiToken } from "@/lib/people/mutations";
import { listApiTokens } from "@/lib/people/queries";
import { createTokenSchema, type CreatedTokenResponse } from "@/lib/people/schemas";

export const GET = authedRoute("token:manage", async (req, { user }) => {
  return Response.json({ items: await listApiTokens(user) });
});

/** The token is in this answer only; the server keeps its hash. */
export const POST = authedRoute("token:manage", async (req, { user, json }) => {
  const { name } = await json(createTokenSchema);
  return Response.json((await createApiToken(user, name)) satisfies CreatedTokenResponse, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
