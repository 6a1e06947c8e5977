import { authedRoute, otherMethods } from "@/lib/api/handler";
import { listReviewQueue } from "@/lib/techniques/queries";

export const GET = authedRoute("technique:review", async (req, { user }) => {
  return Response.json({ items: await listReviewQueue(user) });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
