import { apiRoute, parseJson, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { tryMethods } from "@/lib/plate-check/mutations";
import { tryRequestSchema, type TryResult } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** Fills, renders (proxy) and measures up to three techniques on the checked still. */
export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(uuidParam, (await ctx.params).id);
  const { techniques } = await parseJson(req, tryRequestSchema);
  return Response.json({ tries: (await tryMethods(user, id, techniques)) satisfies TryResult[] });
});
