import { authedRoute, otherMethods } from "@/lib/api/handler";
import type { MeResponse } from "@/lib/people/schemas";

export const GET = authedRoute(async (req, { user }) => {
  return Response.json({ id: user.id, email: user.email, name: user.name, role: user.role } satisfies MeResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
