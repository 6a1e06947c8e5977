import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { shows } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { getShow, requireShow } from "@/lib/shows/queries";
import type { CreateShowInput, ShowResponse, UpdateShowInput } from "@/lib/shows/schemas";

/** PostgreSQL's unique_violation (SQLSTATE 23505), possibly wrapped by the driver layer. */
function isUniqueViolation(error: unknown): boolean {
  for (let e: unknown = error; e && typeof e === "object"; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === "23505") return true;
  }
  return false;
}

/** Leads only. 409 when the code is taken. */
export async function createShow(actor: SessionUser, input: CreateShowInput): Promise<ShowResponse> {
  assertCan(actor, "show:manage");
  const taken = () => new AppError("conflict", `A show with code ${input.code} already exists.`, { fields: { code: "Already in use." } });
  try {
    return await getDb().transaction(async (tx) => {
      const [existing] = await tx.select({ id: shows.id }).from(shows).where(eq(shows.code, input.code)).limit(1);
      if (existing) throw taken();
      const [show] = await tx.insert(shows).values(input).returning();
      if (!show) throw new AppError("internal");
      await writeAudit(tx, { actorId: actor.id, action: "show.create", targetType: "show", targetId: show.id, detail: { code: show.code } });
      return { ...toShow(show), shotCount: 0 };
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw taken();
    throw error;
  }
}

function toShow(s: typeof shows.$inferSelect): Omit<ShowResponse, "shotCount"> {
  return { id: s.id, code: s.code, name: s.name, kind: s.kind, state: s.state, shotPattern: s.shotPattern, createdAt: s.createdAt.toISOString() };
}

/** Leads only. The code is fixed; name, kind, state and shot pattern may change. */
export async function updateShow(actor: SessionUser, code: string, input: UpdateShowInput): Promise<ShowResponse> {
  assertCan(actor, "show:manage");
  const show = await requireShow(code);
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  await getDb().transaction(async (tx) => {
    await tx.update(shows).set(changes).where(eq(shows.id, show.id));
    await writeAudit(tx, { actorId: actor.id, action: "show.update", targetType: "show", targetId: show.id, detail: changes });
  });
  return getShow(actor, show.code);
}
