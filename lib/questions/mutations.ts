import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { answers, questions, revisions, techniques, type Technique } from "@/db/schema";
import type { Tx } from "@/lib/mail/outbox";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { baseUrl } from "@/lib/env";
import { notifyPeople, notifyPerson } from "@/lib/mail/events";
import { questionAskedMail } from "@/lib/mail/templates";
import type { TechniqueDocument } from "@/lib/techniques/document";
import { documentToPlainText } from "@/lib/techniques/plain-text";
import { requireVisibleTechnique } from "@/lib/techniques/queries";

export async function askQuestion(user: SessionUser, slug: string, body: TechniqueDocument): Promise<{ id: string }> {
  assertCan(user, "question:ask");
  const { technique } = await requireVisibleTechnique(user, slug);
  return getDb().transaction(async (tx) => {
    const [q] = await tx.insert(questions).values({ techniqueId: technique.id, authorId: user.id, body, bodyText: documentToPlainText(body) }).returning({ id: questions.id });
    await writeAudit(tx, { actorId: user.id, action: "question.ask", targetType: "technique", targetId: technique.id, detail: { question: q!.id } });
    await tellAuthorsOfQuestion(tx, user, technique, q!.id, documentToPlainText(body));
    return { id: q!.id };
  });
}

/** The technique's creator and the author of the revision readers see hear of a new question (not the asker). */
async function tellAuthorsOfQuestion(tx: Tx, asker: SessionUser, technique: Technique, questionId: string, text: string) {
  const revisionId = technique.approvedRevisionId ?? technique.latestRevisionId;
  const [r] = revisionId ? await tx.select({ title: revisions.title, authorId: revisions.authorId }).from(revisions).where(eq(revisions.id, revisionId)) : [];
  const ref = { slug: technique.slug, title: r?.title ?? technique.slug };
  const link = `${baseUrl()}/techniques/${technique.slug}#question-${questionId}`;
  await notifyPeople(tx, [technique.createdById, r?.authorId], {
    kind: "question-asked",
    actorId: asker.id,
    title: `${asker.name} asked about ${ref.title}`,
    summary: text.slice(0, 300),
    link,
    mail: (name) => questionAskedMail({ name, technique: ref, asker: asker.name, question: text.slice(0, 1000), link }),
  });
}

async function loadQuestion(id: string) {
  const [row] = await getDb()
    .select({ q: questions, t: techniques })
    .from(questions)
    .innerJoin(techniques, eq(techniques.id, questions.techniqueId))
    .where(eq(questions.id, id));
  if (!row) throw new AppError("not_found", "No such question.");
  return row;
}

/** The technique's author and leads answer; the asker hears about it. */
export async function answerQuestion(user: SessionUser, questionId: string, body: TechniqueDocument): Promise<{ id: string }> {
  const { q, t } = await loadQuestion(questionId);
  assertCan(user, "question:answer", { techniqueAuthorId: t.createdById });
  const revisionId = t.approvedRevisionId ?? t.latestRevisionId;
  const [r] = revisionId ? await getDb().select({ title: revisions.title }).from(revisions).where(eq(revisions.id, revisionId)) : [];
  return getDb().transaction(async (tx) => {
    const [a] = await tx.insert(answers).values({ questionId, authorId: user.id, body, bodyText: documentToPlainText(body) }).returning({ id: answers.id });
    if (q.authorId && q.authorId !== user.id) {
      await notifyPerson(tx, {
        kind: "question-answered",
        actorId: user.id,
        toUserId: q.authorId,
        title: r?.title ?? t.slug,
        link: `${baseUrl()}/techniques/${t.slug}#question-${q.id}`,
        summary: documentToPlainText(body).slice(0, 300),
      });
    }
    await writeAudit(tx, { actorId: user.id, action: "question.answer", targetType: "technique", targetId: t.id, detail: { question: questionId } });
    return { id: a!.id };
  });
}

export async function resolveQuestion(user: SessionUser, questionId: string): Promise<void> {
  const { q, t } = await loadQuestion(questionId);
  assertCan(user, "question:resolve", { ownerId: q.authorId, techniqueAuthorId: t.createdById });
  await getDb().transaction(async (tx) => {
    await tx.update(questions).set({ resolvedAt: new Date() }).where(eq(questions.id, questionId));
    await writeAudit(tx, { actorId: user.id, action: "question.resolve", targetType: "technique", targetId: t.id, detail: { question: questionId } });
  });
}
