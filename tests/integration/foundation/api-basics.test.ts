import { describe, expect, it } from "vitest";
import { GET as health } from "@/app/api/health/route";
import { GET as me } from "@/app/api/me/route";
import { GET as listPeople, POST as invite } from "@/app/api/people/route";
import { PATCH as updatePerson } from "@/app/api/people/[id]/route";
import { GET as listTokens, POST as createToken } from "@/app/api/tokens/route";
import { DELETE as revokeToken } from "@/app/api/tokens/[id]/route";
import { GET as unknownApi } from "@/app/api/[...unknown]/route";
import { apiRequest, createPeople, createPerson, params, sessionCookie } from "@/tests/factories";
import { getDb } from "@/db/client";
import { auditLog, outbox, users } from "@/db/schema";
import { eq } from "drizzle-orm";

const ctx = params({});

/** The error shape every API error must have (shared/API.md, "Calling it"). */
async function expectErrorShape(res: Response, status: number, code: string) {
  expect(res.status).toBe(status);
  expect(res.headers.get("content-type")).toContain("application/json");
  const body = await res.json();
  expect(body).toEqual({ error: expect.objectContaining({ code, message: expect.any(String) }) });
  return body.error as { code: string; message: string; fields?: Record<string, string> };
}

describe("health and identity", () => {
  it("reports the database as ok", async () => {
    const res = await health(apiRequest("GET", "/api/health", null), ctx);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ status: "ok", db: "ok" });
  });

  it("answers /api/me for each role, by token and by session cookie", async () => {
    const people = await createPeople();
    for (const person of Object.values(people)) {
      const res = await me(apiRequest("GET", "/api/me", person), ctx);
      expect(res.status).toBe(200);
      expect(await res.json()).toEqual({ id: person.id, email: person.email, name: person.name, role: person.role });
      const byCookie = await me(apiRequest("GET", "/api/me", null, undefined, { cookie: await sessionCookie(person) }), ctx);
      expect((await byCookie.json()).role).toBe(person.role);
    }
  });

  it("is 401 signed out, with a bad token and with a stale session cookie", async () => {
    await expectErrorShape(await me(apiRequest("GET", "/api/me", null), ctx), 401, "unauthorized");
    await expectErrorShape(await me(apiRequest("GET", "/api/me", { token: "plr_nope" }), ctx), 401, "unauthorized");
    const person = await createPerson("artist");
    // A cookie from before a sign-out carries an older session version (OWASP ASVS 4.0.3 V3.3.1: logout invalidates the session).
    await getDb().update(users).set({ sessionVersion: 1 }).where(eq(users.id, person.id));
    await expectErrorShape(await me(apiRequest("GET", "/api/me", null, undefined, { cookie: await sessionCookie(person, 0) }), ctx), 401, "unauthorized");
  });

  it("answers unknown API paths with the error shape, not an HTML page", async () => {
    await expectErrorShape(await unknownApi(apiRequest("GET", "/api/no/such/thing", null)), 404, "not_found");
  });
});

describe("people (admin)", () => {
  it("refuses everyone below admin with 403", async () => {
    const people = await createPeople();
    for (const role of ["artist", "senior", "lead"] as const) {
      await expectErrorShape(await listPeople(apiRequest("GET", "/api/people", people[role]), ctx), 403, "forbidden");
      await expectErrorShape(await invite(apiRequest("POST", "/api/people", people[role], { email: "x@kestrel.test", name: "X", role: "artist" }), ctx), 403, "forbidden");
    }
    expect((await listPeople(apiRequest("GET", "/api/people", people.admin), ctx)).status).toBe(200);
  });

  it("invites with a set-password link, queues the mail and audits it", async () => {
    const admin = await createPerson("admin");
    const res = await invite(apiRequest("POST", "/api/people", admin, { email: "New.Person@Kestrel.test", name: "New Person", role: "senior" }), ctx);
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.person).toMatchObject({ email: "new.person@kestrel.test", role: "senior", hasPassword: false });
    expect(body.setPasswordUrl).toMatch(/\/set-password\?token=inv_/);
    const mail = await getDb().select().from(outbox).where(eq(outbox.toEmail, "new.person@kestrel.test"));
    expect(mail).toHaveLength(1);
    expect(mail[0]!.text).toContain(body.setPasswordUrl);
    const audit = await getDb().select().from(auditLog).where(eq(auditLog.action, "person.invite"));
    expect(audit.some((a) => a.targetId === body.person.id)).toBe(true);
    const again = await invite(apiRequest("POST", "/api/people", admin, { email: "new.person@kestrel.test", name: "Again", role: "artist" }), ctx);
    await expectErrorShape(again, 409, "conflict");
  });

  it("validates input and malformed JSON with field messages", async () => {
    const admin = await createPerson("admin");
    const bad = await expectErrorShape(await invite(apiRequest("POST", "/api/people", admin, { email: "not-an-email", name: "", role: "boss" }), ctx), 400, "validation_failed");
    expect(Object.keys(bad.fields ?? {})).toEqual(expect.arrayContaining(["email", "name", "role"]));
    await expectErrorShape(await invite(apiRequest("POST", "/api/people", admin, "{ not json"), ctx), 400, "validation_failed");
  });

  it("never demotes or disables the last admin, and a role change applies on the next request", async () => {
    const admin = await createPerson("admin");
    // Other admins from earlier tests in this file exist; disable them so this one is the last.
    const others = await getDb().select().from(users).where(eq(users.role, "admin"));
    for (const other of others.filter((o) => o.id !== admin.id)) await getDb().update(users).set({ disabledAt: new Date() }).where(eq(users.id, other.id));
    await expectErrorShape(await updatePerson(apiRequest("PATCH", `/api/people/${admin.id}`, admin, { role: "lead" }), params({ id: admin.id })), 409, "conflict");
    await expectErrorShape(await updatePerson(apiRequest("PATCH", `/api/people/${admin.id}`, admin, { disabled: true }), params({ id: admin.id })), 409, "conflict");

    const artist = await createPerson("artist");
    const cookie = await sessionCookie(artist);
    const promoted = await updatePerson(apiRequest("PATCH", `/api/people/${artist.id}`, admin, { role: "senior" }), params({ id: artist.id }));
    expect((await promoted.json()).role).toBe("senior");
    expect((await (await me(apiRequest("GET", "/api/me", artist), ctx)).json()).role).toBe("senior");
    // The old cookie predates the change (OWASP ASVS 4.0.3 V3.3: sessions end when the account changes).
    await expectErrorShape(await me(apiRequest("GET", "/api/me", null, undefined, { cookie }), ctx), 401, "unauthorized");
    await updatePerson(apiRequest("PATCH", `/api/people/${artist.id}`, admin, { disabled: true }), params({ id: artist.id }));
    await expectErrorShape(await me(apiRequest("GET", "/api/me", artist), ctx), 401, "unauthorized");
  });
});

describe("personal API tokens", () => {
  it("creates a token shown once, lists it without the secret, and revokes it", async () => {
    const senior = await createPerson("senior");
    const created = await createToken(apiRequest("POST", "/api/tokens", senior, { name: "publish script" }), ctx);
    expect(created.status).toBe(201);
    const { id, token } = await created.json();
    expect(token).toMatch(/^plr_/);
    const meRes = await me(apiRequest("GET", "/api/me", { token }), ctx);
    expect((await meRes.json()).id).toBe(senior.id);
    const listed = await (await listTokens(apiRequest("GET", "/api/tokens", senior), ctx)).json();
    expect(JSON.stringify(listed)).not.toContain(token);
    expect(listed.items.map((t: { name: string }) => t.name)).toContain("publish script");
    expect((await revokeToken(apiRequest("DELETE", `/api/tokens/${id}`, senior), params({ id }))).status).toBe(204);
    await expectErrorShape(await me(apiRequest("GET", "/api/me", { token }), ctx), 401, "unauthorized");
  });
});

describe("audit log (admin)", () => {
  it("lists changes newest first for admins and refuses everyone else", async () => {
    const { GET: audit } = await import("@/app/api/admin/audit/route");
    const people = await createPeople();
    await invite(apiRequest("POST", "/api/people", people.admin, { email: "audited@kestrel.test", name: "Audited", role: "artist" }), ctx);
    for (const role of ["artist", "senior", "lead"] as const) {
      await expectErrorShape(await audit(apiRequest("GET", "/api/admin/audit", people[role]), ctx), 403, "forbidden");
    }
    await expectErrorShape(await audit(apiRequest("GET", "/api/admin/audit", null), ctx), 401, "unauthorized");
    const res = await audit(apiRequest("GET", "/api/admin/audit?limit=5", people.admin), ctx);
    const body = await res.json();
    expect(body.items[0]).toMatchObject({ action: "person.invite", actor: { id: people.admin.id } });
    expect(body.items.length).toBeLessThanOrEqual(5);
  });
});
