import { apiRoute } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { listReviewQueue } from "@/lib/techniques/queries";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ items: await listReviewQueue(user) });
});
