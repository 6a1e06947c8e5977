import { authedRoute, otherMethods } from "@/lib/api/handler";
import { updateTag } from "@/lib/tags/mutations";
import { tagUpdateSchema } from "@/lib/tags/schemas";

export const PATCH = authedRoute<{ slug: string }>("tag:manage", async (req, { user, params, json }) => {
  const input = await json(tagUpdateSchema);
  const tag = await updateTag(user, params.slug, input);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind, description: tag.description, aliases: tag.aliases });
});

export const { GET, HEAD, OPTIONS, POST, PUT, DELETE } = otherMethods({ PATCH });
