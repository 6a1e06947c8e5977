import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { tryMethods } from "@/lib/plate-check/mutations";
import { tryRequestSchema, type TryResult } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** Fills, renders (proxy) and measures up to three techniques on the checked still. */
export const POST = authedRoute<{ id: string }>("still:check", async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const { techniques } = await json(tryRequestSchema);
  return Response.json({ tries: (await tryMethods(user, id, techniques)) satisfies TryResult[] });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
