import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { updateTag } from "@/lib/tags/mutations";
import { tagUpdateSchema } from "@/lib/tags/schemas";

export const PATCH = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, tagUpdateSchema);
  const tag = await updateTag(user, (await ctx.params).slug, input);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind, description: tag.description, aliases: tag.aliases });
});
