import { apiRoute, parseWith, searchParamsOf, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { findTry, renderFilled } from "@/lib/plate-check/mutations";
import { renderQuerySchema } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** A tried technique's render: the proxy (WebP, 1024 px) or, with `?size=exact`, the full frame as 16-bit PNG. */
export const GET = apiRoute<{ id: string; slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const params = await ctx.params;
  const id = parseWith(uuidParam, params.id);
  const { size } = parseWith(renderQuerySchema, searchParamsOf(req));
  const { still, result } = await findTry(user, id, params.slug);
  const exact = size === "exact";
  const out = await renderFilled(still, result.recipe, exact ? "png16" : "webp", exact);
  return new Response(new Uint8Array(out.bytes), {
    headers: { "Content-Type": out.contentType, "Content-Length": String(out.bytes.length), "Cache-Control": "private, no-store", "X-Lab-Width": String(out.width), "X-Lab-Height": String(out.height) },
  });
});
