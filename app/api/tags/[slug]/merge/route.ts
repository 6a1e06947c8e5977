import { authedRoute, otherMethods } from "@/lib/api/handler";
import { mergeTags } from "@/lib/tags/mutations";
import { tagMergeSchema } from "@/lib/tags/schemas";

export const POST = authedRoute<{ slug: string }>("tag:manage", async (req, { user, params, json }) => {
  const { into } = await json(tagMergeSchema);
  const tag = await mergeTags(user, params.slug, into);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind, aliases: tag.aliases });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
