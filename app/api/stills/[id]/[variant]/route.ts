import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { apiRoute, parseWith, searchParamsOf, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { getStillForRead } from "@/lib/stills/queries";
import { displayQuerySchema, STILL_VARIANTS } from "@/lib/stills/schemas";
import { serveStillFile } from "@/lib/stills/serve";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

const variantParam = z.enum(STILL_VARIANTS);

export const GET = apiRoute<{ id: string; variant: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const params = await ctx.params;
  const id = parseWith(uuidParam, params.id);
  const variant = variantParam.safeParse(params.variant);
  if (!variant.success) throw new AppError("not_found", "Variants are original, preview, thumb and display.");
  const display = parseWith(displayQuerySchema, searchParamsOf(req));
  const still = await getStillForRead(user, id);
  return serveStillFile(req, still, variant.data, { display });
});
