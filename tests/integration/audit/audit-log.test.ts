import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { auditLog } from "@/db/schema";
import { GET } from "@/app/api/admin/audit/route";
import { sentenceText } from "@/lib/audit/describe";
import { listAudit, listAuditActors } from "@/lib/audit/queries";
import { retireTechnique } from "@/lib/techniques/mutations";
import { makeTechnique, makeUser } from "@/tests/integration/mail/factories";
import { createPerson, ctx } from "@/tests/integration/stills/factories";

/* Issue 13, item 8: the audit log filters by person, action and date, and pages, in the database. */

async function entry(actorId: string | null, action: string, at: string, targetId: string | null = null, detail: Record<string, unknown> = {}) {
  await getDb().insert(auditLog).values({ actorId, action, targetType: "technique", targetId, detail, at: new Date(at) });
}

describe("audit log", () => {
  it("filters by person, action and UTC day (both ends inclusive), pages, and reads as sentences", async () => {
    const admin = await makeUser({ role: "admin" });
    const lead = await makeUser({ role: "lead", name: "Ines Varrow" });
    const senior = await makeUser({ role: "senior", name: "Joel Brackwell" });
    const t = await makeTechnique({ title: "Marker channel cleanup" });
    await entry(senior.id, "technique.submit", "2026-03-01T23:59:59Z", t.id, { revision: 2 });
    await entry(lead.id, "technique.approve", "2026-03-02T00:00:00Z", t.id, { revision: 2 });
    await entry(lead.id, "technique.return", "2026-03-03T12:00:00Z", t.id, { revision: 3, note: "Crop it." });
    for (let i = 0; i < 7; i++) await entry(senior.id, "technique.edit", `2026-03-04T10:0${i}:00Z`, t.id, { revision: 3 + i, changeNote: `Note ${i}` });

    const all = await listAudit(admin, { limit: 4, offset: 0 });
    expect(all.total).toBe(10);
    expect(all.items).toHaveLength(4);
    // Newest first; the page after holds the next four.
    const next = await listAudit(admin, { limit: 4, offset: 4 });
    expect(next.items[0]!.id).toBeLessThan(all.items[3]!.id);

    const byLead = await listAudit(admin, { actorId: lead.id, limit: 50, offset: 0 });
    expect(byLead.total).toBe(2);
    expect(byLead.items.map((e) => sentenceText(e.sentence))).toEqual([
      "Ines Varrow sent revision 3 of Marker channel cleanup back: “Crop it.”",
      "Ines Varrow approved revision 2 of Marker channel cleanup.",
    ]);
    expect(byLead.items[1]!.sentence).toContainEqual({ text: "Marker channel cleanup", href: `/techniques/${t.slug}` });

    expect((await listAudit(admin, { actions: ["technique.edit"], limit: 50, offset: 0 })).total).toBe(7);
    // One UTC day: 00:00:00 is in, the second before midnight belongs to the day before.
    const day = await listAudit(admin, { from: "2026-03-02", to: "2026-03-02", limit: 50, offset: 0 });
    expect(day.items.map((e) => e.action)).toEqual(["technique.approve"]);
    expect((await listAudit(admin, { from: "2026-03-01", to: "2026-03-03", limit: 50, offset: 0 })).total).toBe(3);
    expect((await listAudit(admin, { actorId: senior.id, from: "2026-03-04", limit: 3, offset: 3 })).items).toHaveLength(3);

    expect((await listAuditActors(admin)).map((p) => p.name)).toEqual(["Ines Varrow", "Joel Brackwell"]);
    await expect(listAudit(lead, { limit: 10, offset: 0 })).rejects.toMatchObject({ code: "forbidden" });
  });

  it("names a retired technique's replacement by its title, linked, like the retired one", async () => {
    const admin = await makeUser({ role: "admin" });
    const lead = await makeUser({ role: "lead", name: "Ines Varrow" });
    const old = await makeTechnique({ title: "Single-pass marker paint-out" });
    const replacement = await makeTechnique({ title: "Two-pass marker cleanup" });
    await retireTechnique(lead, old.slug, { supersededBy: replacement.slug, note: "Keeps the grain." });

    const [retired] = (await listAudit(admin, { actions: ["technique.retire"], limit: 50, offset: 0 })).items;
    expect(sentenceText(retired!.sentence)).toBe("Ines Varrow retired Single-pass marker paint-out, replaced by Two-pass marker cleanup: “Keeps the grain.”");
    expect(retired!.sentence).toContainEqual({ text: "Two-pass marker cleanup", href: `/techniques/${replacement.slug}` });
    expect(retired!.sentence).toContainEqual({ text: "Single-pass marker paint-out", href: `/techniques/${old.slug}` });
  });

  it("the API takes the same filters and refuses a bad one with a clear message", async () => {
    const { auth } = await createPerson("admin");
    const ok = await GET(new Request(`http://plateroom.test/api/admin/audit?action=technique.approve&from=2026-03-02&to=2026-03-02`, { headers: auth }), ctx({}));
    expect(ok.status).toBe(200);
    const body = (await ok.json()) as { total: number; items: { action: string; sentence: unknown[] }[] };
    expect(body.items.every((e) => e.action === "technique.approve" && Array.isArray(e.sentence))).toBe(true);
    const bad = await GET(new Request("http://plateroom.test/api/admin/audit?from=yesterday", { headers: auth }), ctx({}));
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { code: string; message: string } }).error).toMatchObject({ code: "validation_failed" });
  });
});
