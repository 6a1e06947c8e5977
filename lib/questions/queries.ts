import "server-only";
import { asc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { answers, questions, users } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { QuestionResponse } from "@/lib/questions/schemas";
import type { TechniqueDocument } from "@/lib/techniques/document";
import { requireVisibleTechnique } from "@/lib/techniques/queries";

/** Questions on a technique, oldest first, with what this person may do on each. */
export async function listQuestions(user: SessionUser, slug: string): Promise<QuestionResponse[]> {
  const { technique } = await requireVisibleTechnique(user, slug);
  const db = getDb();
  const qs = await db.select().from(questions).where(eq(questions.techniqueId, technique.id)).orderBy(asc(questions.createdAt));
  const as = qs.length ? await db.select().from(answers).where(inArray(answers.questionId, qs.map((q) => q.id))).orderBy(asc(answers.createdAt)) : [];
  const ids = [...new Set([...qs.map((q) => q.authorId), ...as.map((a) => a.authorId)].filter((x): x is string => Boolean(x)))];
  const names = new Map((ids.length ? await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)) : []).map((u) => [u.id, u]));
  const resource = { techniqueAuthorId: technique.createdById };
  return qs.map((q) => ({
    id: q.id,
    author: q.authorId ? (names.get(q.authorId) ?? null) : null,
    body: q.body as TechniqueDocument,
    createdAt: q.createdAt.toISOString(),
    resolvedAt: q.resolvedAt?.toISOString() ?? null,
    canAnswer: can(user, "question:answer", resource),
    canResolve: can(user, "question:resolve", { ...resource, ownerId: q.authorId }),
    answers: as
      .filter((a) => a.questionId === q.id)
      .map((a) => ({ id: a.id, author: a.authorId ? (names.get(a.authorId) ?? null) : null, body: a.body as TechniqueDocument, createdAt: a.createdAt.toISOString() })),
  }));
}
