import sharp from "sharp";
import { authedRoute, otherMethods, parseWith, searchParamsOf, uuidParam } from "@/lib/api/handler";
import { findTry } from "@/lib/plate-check/mutations";
import { renderQuerySchema } from "@/lib/plate-check/schemas";
import { renderFilled } from "@/lib/plate-check/tries";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/**
 * A tried technique's render: the proxy (1024 px, the 16-bit render the measures came from,
 * encoded as WebP for display) or, with `?size=exact`, the full frame as 16-bit PNG.
 */
export const GET = authedRoute<{ id: string; slug: string }>("still:check", async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  const { size } = parseWith(renderQuerySchema, searchParamsOf(req));
  const { still, result } = await findTry(user, id, params.slug);
  const exact = size === "exact";
  const out = await renderFilled(still, result.recipe, "png16", exact);
  // The browser shows 8 bits anyway: the proxy goes out as WebP (a fifth of the bytes).
  const bytes = exact ? out.bytes : await sharp(out.bytes, { ignoreIcc: true }).webp({ quality: 88 }).toBuffer();
  return new Response(new Uint8Array(bytes), {
    headers: {
      "Content-Type": exact ? "image/png" : "image/webp",
      "Content-Length": String(bytes.length),
      "Cache-Control": "private, no-store",
      "X-Lab-Width": String(out.width),
      "X-Lab-Height": String(out.height),
    },
  });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
