import { apiRoute } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import type { MeResponse } from "@/lib/people/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ id: user.id, email: user.email, name: user.name, role: user.role } satisfies MeResponse);
});
