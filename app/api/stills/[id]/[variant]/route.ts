import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { getStillForRead } from "@/lib/stills/queries";
import { STILL_VARIANTS } from "@/lib/stills/schemas";
import { serveStillFile } from "@/lib/stills/serve";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

const variantParam = z.enum(STILL_VARIANTS);

export const GET = authedRoute<{ id: string; variant: string }>(async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  const variant = variantParam.safeParse(params.variant);
  if (!variant.success) throw new AppError("not_found", "Variants are original, preview and thumb.");
  const still = await getStillForRead(user, id);
  return serveStillFile(req, still, variant.data);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
