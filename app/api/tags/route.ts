import { authedRoute, otherMethods } from "@/lib/api/handler";
import { createTag } from "@/lib/tags/mutations";
import { listTags } from "@/lib/tags/queries";
import { tagInputSchema } from "@/lib/tags/schemas";

export const GET = authedRoute(async (req, { user }) => {
  return Response.json({ items: (await listTags(user)).map(({ id: _id, ...t }) => t) });
});

export const POST = authedRoute("tag:manage", async (req, { user, json }) => {
  const input = await json(tagInputSchema);
  const tag = await createTag(user, input);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind }, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
