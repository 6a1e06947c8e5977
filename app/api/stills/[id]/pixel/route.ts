import { authedRoute, otherMethods, parseWith, searchParamsOf, uuidParam } from "@/lib/api/handler";
import { readPixel, readPixelBlock } from "@/lib/stills/pixels";
import { getStillForRead } from "@/lib/stills/queries";
import { pixelQuerySchema, type PixelBlockResponse, type PixelResponse } from "@/lib/stills/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

export const GET = authedRoute<{ id: string }>(async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  const { x, y, w, h } = parseWith(pixelQuerySchema, searchParamsOf(req));
  const still = await getStillForRead(user, id);
  if (w !== undefined || h !== undefined) return Response.json((await readPixelBlock(still, x, y, w ?? 1, h ?? 1)) satisfies PixelBlockResponse);
  return Response.json((await readPixel(still, x, y)) satisfies PixelResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
