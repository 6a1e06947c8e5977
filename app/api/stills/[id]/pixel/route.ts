import { authedRoute, otherMethods, parseWith, searchParamsOf, uuidParam } from "@/lib/api/handler";
import { readPixel } from "@/lib/stills/pixels";
import { getStillForRead } from "@/lib/stills/queries";
import { pixelQuerySchema, type PixelResponse } from "@/lib/stills/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

export const GET = authedRoute<{ id: string }>(async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  const { x, y } = parseWith(pixelQuerySchema, searchParamsOf(req));
  const still = await getStillForRead(user, id);
  return Response.json((await readPixel(still, x, y)) satisfies PixelResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
