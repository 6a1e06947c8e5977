import fs from "node:fs";
import path from "node:path";
import { and, eq, sql } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { auditLog, digestItems, subscriptions, users } from "@/db/schema";
import type { InboxMessage } from "@/lib/mail/schemas";
import { askQuestion } from "@/lib/questions/mutations";
import { documentFromText } from "@/lib/techniques/document";
import { createTechnique, reviewTechnique, setHouseMethod, submitTechnique, updateTechnique } from "@/lib/techniques/mutations";
import { follow, makeTag, makeTechnique, makeUser } from "@/tests/integration/mail/factories";
import { MAIL_BASE as BASE, setUpFakeMail } from "@/tests/integration/mail/fake-mail";

/*
 * Issue 13, item 5: who hears of what in the writing and review flow, delivered over SMTP to the
 * project's fake server and read back as received. Rules from the issue: authors follow their own
 * techniques; authors hear of approval, send-back (with the lead's reason) and questions; leads hear
 * of submissions, immediate or digest per their setting; nobody gets mail about their own action.
 */

const mail = setUpFakeMail();
beforeEach(async () => {
  // Each test has its own people: those of earlier tests (leads among them) are disabled.
  await getDb().update(users).set({ disabledAt: new Date() }).where(sql`true`);
});

/** Sends everything queued to the fake SMTP server; returns what it received in this run. */
const deliver = async (): Promise<InboxMessage[]> => (await mail.deliver()).messages;
const to = (messages: InboxMessage[], email: string) => messages.filter((m) => m.envelope.to.includes(email));
const digestFor = async (userId: string) => getDb().select().from(digestItems).where(eq(digestItems.userId, userId));

const BODY = documentFromText("Sample the dust colour, lift it in the darkest channel, regrain.");

async function world() {
  const author = await makeUser({ role: "senior", name: "Joel Author" });
  const lead = await makeUser({ role: "lead", name: "Ines Lead" });
  const dailyLead = await makeUser({ role: "lead", name: "Maud Daily", mailMode: "daily" });
  const offLead = await makeUser({ role: "lead", name: "Gone Lead", disabled: true });
  const artist = await makeUser({ name: "Tamsin Artist" });
  const tag = await makeTag({ name: `Dust ${Math.random().toString(36).slice(2, 6)}` });
  return { author, lead, dailyLead, offLead, artist, tag };
}

describe("mail in the review flow", () => {
  it("authors follow their own technique, in their own mail mode", async () => {
    const { author, tag } = await world();
    const daily = await makeUser({ role: "senior", mailMode: "daily" });
    const a = await createTechnique(author, { title: "Dust lift on dark skies", summary: "Lift dust.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });
    const b = await createTechnique(daily, { title: "Dust lift on bright skies", summary: "Lift dust.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });
    const rows = await getDb().select().from(subscriptions).where(eq(subscriptions.kind, "technique"));
    expect(rows.find((r) => r.userId === author.id)).toMatchObject({ key: a.slug, mode: "immediate" });
    expect(rows.find((r) => r.userId === daily.id)).toMatchObject({ key: b.slug, mode: "daily" });
  });

  it("the migration gives techniques written before the rule their author as follower, keeping existing rows", async () => {
    const older = await makeUser({ role: "senior", mailMode: "daily" });
    const already = await makeUser({ role: "senior" });
    const a = await makeTechnique({ authorId: older.id });
    const b = await makeTechnique({ authorId: already.id });
    await follow(already.id, "technique", b.slug, "daily");
    // Found by name: migration numbers may change when branches merge.
    const file = fs.readdirSync(path.resolve("db/migrations")).find((f) => f.endsWith("_authors_follow_own_techniques.sql"))!;
    const migration = fs.readFileSync(path.resolve("db/migrations", file), "utf8");
    await getDb().execute(sql.raw(migration));
    const rows = await getDb().select().from(subscriptions).where(eq(subscriptions.kind, "technique"));
    expect(rows.filter((r) => r.key === a.slug).map((r) => [r.userId, r.mode])).toEqual([[older.id, "daily"]]);
    expect(rows.filter((r) => r.key === b.slug).map((r) => [r.userId, r.mode])).toEqual([[already.id, "daily"]]);
  });

  it("a submission reaches every lead (immediate or digest), never the submitter; the author hears of send-back with the reason and of approval", async () => {
    const { author, lead, dailyLead, offLead, artist, tag } = await world();
    await follow(artist.id, "tag", tag.slug);
    const { slug } = await createTechnique(author, { title: "Dust on a night sky", summary: "Lift dust specks.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });

    await submitTechnique(author, slug);
    let got = await deliver();
    expect(got.flatMap((m) => m.envelope.to)).toEqual([lead.email]);
    expect(got[0]!.subject).toBe("To review: Dust on a night sky (revision 1)");
    expect(got[0]!.text).toContain(`${BASE}/techniques/${slug}/review`);
    expect(got[0]!.text).toContain("Joel Author submitted the new technique");
    const daily = await digestFor(dailyLead.id);
    expect(daily).toHaveLength(1);
    expect(daily[0]).toMatchObject({ kind: "review-waiting", link: `${BASE}/techniques/${slug}/review` });
    expect(await digestFor(offLead.id)).toHaveLength(0);
    expect(await digestFor(author.id)).toHaveLength(0);

    const reason = "Crop the still to the sky: the ground distracts from the specks.";
    await reviewTechnique(lead, slug, { revision: 1, decision: "return", note: reason });
    got = await deliver();
    expect(got.flatMap((m) => m.envelope.to)).toEqual([author.email]);
    expect(got[0]!.subject).toBe("Sent back: Dust on a night sky (revision 1)");
    expect(got[0]!.text).toContain(reason);
    expect(got[0]!.text).toContain("Ines Lead sent your revision 1");
    expect(got[0]!.html).toContain("Crop the still to the sky");

    await updateTechnique(author, slug, { title: "Dust on a night sky", summary: "Lift dust specks.", aliases: [], tags: [tag.slug], body: BODY, recipe: [], baseRevision: 1, changeNote: "Cropped the still." });
    // Saving alone tells nobody: a saved revision is a draft until submitted.
    expect(await deliver()).toHaveLength(0);
    await submitTechnique(author, slug);
    expect((await deliver()).flatMap((m) => m.envelope.to)).toEqual([lead.email]);

    await reviewTechnique(lead, slug, { revision: 2, decision: "approve" });
    got = await deliver();
    // The author once, in their own words (not again as a follower); the tag's follower hears of the new technique; the lead nothing.
    expect(to(got, author.email).map((m) => m.subject)).toEqual(["Approved: Dust on a night sky (revision 2)"]);
    expect(to(got, artist.email).map((m) => m.subject)).toEqual([`New under ${tag.name}: Dust on a night sky`]);
    expect(to(got, lead.email)).toHaveLength(0);
    expect(got).toHaveLength(2);
  });

  it("a lead reviewing their own revision gets no mail about it; the other leads hear of the submission", async () => {
    const { lead, dailyLead, tag } = await world();
    const otherLead = await makeUser({ role: "lead", name: "Other Lead" });
    const { slug } = await createTechnique(lead, { title: "Lead's own dust note", summary: "Lift.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });
    await submitTechnique(lead, slug);
    const got = await deliver();
    expect(to(got, lead.email)).toHaveLength(0);
    expect(to(got, otherLead.email)).toHaveLength(1);
    expect(await digestFor(dailyLead.id)).toHaveLength(1);
    await reviewTechnique(lead, slug, { revision: 1, decision: "approve" });
    expect(to(await deliver(), lead.email)).toHaveLength(0);
  });

  it("the author hears of a question on their technique; the asker does not", async () => {
    const { author, lead, artist, tag } = await world();
    const { slug } = await createTechnique(author, { title: "Dust by median", summary: "Median.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });
    await submitTechnique(author, slug);
    await reviewTechnique(lead, slug, { revision: 1, decision: "approve" });
    await deliver();

    await askQuestion(artist, slug, documentFromText("Does it hold on a slow pan?"));
    const got = await deliver();
    expect(got.flatMap((m) => m.envelope.to)).toEqual([author.email]);
    expect(got[0]!.subject).toBe("Question on Dust by median");
    expect(got[0]!.text).toContain("Does it hold on a slow pan?");
    expect(got[0]!.text).toContain(`${BASE}/techniques/${slug}#question-`);

    // Asking on one's own technique tells nobody.
    await askQuestion(author, slug, documentFromText("Note to self: add the pan case."));
    expect(await deliver()).toHaveLength(0);
  });

  it("changing the department method names both methods in the audit log and tells the problem's followers, not the lead", async () => {
    const { author, lead, artist, tag } = await world();
    const daily = await makeUser({ name: "Dana Daily" });
    await follow(artist.id, "tag", tag.slug);
    await follow(daily.id, "tag", tag.slug, "daily");
    await follow(lead.id, "tag", tag.slug);
    const approved = async (title: string) => {
      const { slug } = await createTechnique(author, { title, summary: "Lift.", aliases: [], tags: [tag.slug], body: BODY, recipe: [] });
      await submitTechnique(author, slug);
      await reviewTechnique(lead, slug, { revision: 1, decision: "approve" });
      return slug;
    };
    const first = await approved("Dust by clone offset");
    const second = await approved("Dust by temporal median");
    await setHouseMethod(lead, tag.slug, first, { replaces: null });
    await deliver();

    // The lead saw the first method and replaces it.
    await setHouseMethod(lead, tag.slug, second, { replaces: first });
    const got = await deliver();
    expect(got.flatMap((m) => m.envelope.to)).toEqual([artist.email]);
    expect(got[0]!.subject).toBe(`Department method for ${tag.name}: Dust by temporal median`);
    expect(got[0]!.text).toContain('in place of "Dust by clone offset"');
    expect(got[0]!.headers["list-unsubscribe"]).toMatch(/^<https:\/\/plateroom\.kestrel\.test\/api\/unsubscribe\?token=/);
    expect((await digestFor(daily.id)).map((d) => d.kind)).toContain("department-method");
    const [entry] = await getDb()
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, "tag.house-method.set"), sql`${auditLog.detail}->>'technique' = ${second}`));
    expect(entry!.detail).toMatchObject({ technique: second, title: "Dust by temporal median", replaced: { slug: first, title: "Dust by clone offset" } });

    // A stale confirmation (someone changed it meanwhile) is refused, not applied.
    await expect(setHouseMethod(lead, tag.slug, first, { replaces: first })).rejects.toMatchObject({ code: "conflict" });
  });
});
