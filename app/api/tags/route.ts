import { apiRoute, parseJson } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { createTag } from "@/lib/tags/mutations";
import { tagInputSchema } from "@/lib/tags/schemas";
import { listTags } from "@/lib/techniques/queries";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  assertCan(user, "technique:read");
  return Response.json({ items: (await listTags()).map(({ id: _id, ...t }) => t) });
});

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, tagInputSchema);
  const tag = await createTag(user, input);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind }, { status: 201 });
});
