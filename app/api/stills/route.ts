import fs from "node:fs/promises";
import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { createStill } from "@/lib/stills/mutations";
import { listStillsForTechnique } from "@/lib/stills/queries";
import type { StillCreatedResponse, StillResponse, StillOwner, StillRole } from "@/lib/stills/schemas";
import { MAX_UPLOAD_BODY_BYTES, receiveStillUpload } from "@/lib/stills/upload";

// Uploads are streamed from the request body; never prerendered or cached.
export const dynamic = "force-dynamic";
export const runtime = "nodejs";

// Anyone signed in uploads trials and use-log stills; createStill checks "still:upload" for technique stills.
export const POST = authedRoute({ bodyLimit: MAX_UPLOAD_BODY_BYTES }, async (req, { user }) => {
  const { file, fields } = await receiveStillUpload(req);
  try {
    const created = await createStill(user, {
      file,
      alt: fields.alt ?? "",
      caption: fields.caption,
      credit: fields.credit,
      technique: fields.technique,
      role: fields.role as StillRole | undefined,
      owner: fields.owner as StillOwner | undefined,
    });
    return Response.json(created satisfies StillCreatedResponse, { status: 201 });
  } finally {
    await fs.rm(file.path, { force: true });
  }
});

const listQuery = z.object({ technique: z.string().min(1, "Name a technique.") });

export const GET = authedRoute(async (req, { user }) => {
  const q = parseWith(listQuery, searchParamsOf(req));
  const { technique } = await requireVisibleTechnique(user, q.technique);
  const items = await listStillsForTechnique(user, technique.id);
  return Response.json({ items } satisfies { items: StillResponse[] });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
