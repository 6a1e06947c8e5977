import "server-only";
import { asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { shows, type Show } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { ShowResponse } from "@/lib/shows/schemas";

function toShowResponse(s: Show, shotCount: number): ShowResponse {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    kind: s.kind,
    state: s.state,
    shotPattern: s.shotPattern,
    shotCount,
    createdAt: s.createdAt.toISOString(),
  };
}

// Qualified by hand: inside the subquery drizzle prints both columns unqualified, and "id" would bind to shots.
const shotCountSql = sql<number>`(select count(*) from "shots" s where s."show_id" = "shows"."id")`.mapWith(Number);

/** Every show with its number of shots, active shows first. Any signed-in person. */
export async function listShows(actor: SessionUser): Promise<ShowResponse[]> {
  assertCan(actor, "technique:read");
  const rows = await getDb()
    .select({ show: shows, shotCount: shotCountSql })
    .from(shows)
    .orderBy(asc(shows.state), asc(shows.code));
  return rows.map((r) => toShowResponse(r.show, r.shotCount));
}

/** Internal: the show row by code, or 404 "No show XYZ". */
export async function requireShow(code: string): Promise<Show> {
  const [show] = await getDb().select().from(shows).where(eq(shows.code, code.trim().toUpperCase())).limit(1);
  if (!show) throw new AppError("not_found", `No show ${code}`);
  return show;
}

export async function getShow(actor: SessionUser, code: string): Promise<ShowResponse> {
  assertCan(actor, "technique:read");
  const [row] = await getDb()
    .select({ show: shows, shotCount: shotCountSql })
    .from(shows)
    .where(eq(shows.code, code.trim().toUpperCase()))
    .limit(1);
  if (!row) throw new AppError("not_found", `No show ${code}`);
  return toShowResponse(row.show, row.shotCount);
}
