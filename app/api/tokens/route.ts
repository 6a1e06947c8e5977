import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { createApiToken } from "@/lib/people/mutations";
import { listApiTokens } from "@/lib/people/queries";
import { createTokenSchema, type CreatedTokenResponse } from "@/lib/people/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ items: await listApiTokens(user) });
});

/** The token is in this answer only; the server keeps its hash. */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { name } = await parseJson(req, createTokenSchema);
  return Response.json((await createApiToken(user, name)) satisfies CreatedTokenResponse, { status: 201 });
});
