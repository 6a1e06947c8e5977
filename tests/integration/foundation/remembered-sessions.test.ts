import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { GET as me } from "@/app/api/me/route";
import { PATCH as updatePerson } from "@/app/api/people/[id]/route";
import { DELETE as revokeToken } from "@/app/api/tokens/[id]/route";
import { changeGeneration } from "@/db/change-watch";
import { currentDriver, getDb } from "@/db/client";
import { apiTokens, auditLog, changeStamp, tags, users } from "@/db/schema";
import { apiRequest, createPeople, params, sessionCookie } from "@/tests/factories";

/**
 * Sessions and tokens are remembered between requests only until the next committed change to
 * people or tokens (db/change-watch.ts, migration 0001). Issue 9: disabling someone, changing
 * their role, signing out and revoking a token take effect on the very next request.
 */

async function stamp(): Promise<number> {
  const [row] = await getDb().select({ value: changeStamp.value }).from(changeStamp);
  return row!.value;
}

/**
 * The watch starts listening on first use; wait until this process knows about changes. On a
 * PostgreSQL server it never does (other instances write too): nothing is remembered there.
 */
async function watching(): Promise<number | null> {
  if (currentDriver() === "postgres") {
    expect(changeGeneration()).toBeNull();
    return null;
  }
  for (let i = 0; i < 100; i++) {
    const generation = changeGeneration();
    if (generation !== null) return generation;
    await new Promise((r) => setTimeout(r, 10));
  }
  throw new Error("the change watch never started listening");
}

async function meAs(headers: Record<string, string>): Promise<Response> {
  return me(apiRequest("GET", "/api/me", null, undefined, headers), params({}));
}

describe("the change stamp and the change watch", () => {
  it("watches every table except the ones pages never show (a new table must choose)", async () => {
    const result = await getDb().execute(sql`
      select c.relname as "table", t.tgname as "trigger"
      from pg_class c join pg_namespace n on n.oid = c.relnamespace
      left join pg_trigger t on t.tgrelid = c.oid and not t.tgisinternal
      where n.nspname = 'public' and c.relkind = 'r'`);
    // Both drivers answer with node-postgres's result shape.
    const rows = (result as { rows: { table: string; trigger: string | null }[] }).rows;
    const triggers = new Map<string, string[]>();
    for (const { table, trigger } of rows) triggers.set(table, [...(triggers.get(table) ?? []), ...(trigger ? [trigger] : [])]);
    // Mail, sign-in bookkeeping, the audit trail and search's stored page vectors (a cache) never appear
    // on a page; tokens only notify.
    const unwatched = new Set(["outbox", "digest_items", "one_time_tokens", "sign_in_failures", "password_reset_requests", "audit_log", "change_stamp", "search_meaning_vectors"]);
    // Search documents' sources also say which technique changed (migration 0003, lib/techniques/search-follow.ts);
    // a thesaurus edit says so too (migration 0009_thesaurus_starter).
    const search: Record<string, string> = {
      techniques: "notify_search_change",
      revisions: "notify_search_change",
      uses: "notify_search_change",
      house_methods: "notify_search_change",
      tags: "notify_search_reload",
      shots: "notify_search_reload",
      thesaurus_entries: "notify_search_thesaurus",
    };
    for (const [table, names] of triggers) {
      if (unwatched.has(table)) expect(names, table).toEqual([]);
      else if (table === "api_tokens") expect(names, table).toEqual(["notify_change"]);
      else expect(names.sort(), table).toEqual(["bump_change_stamp", ...(search[table] ? [search[table]] : [])].sort());
    }
    expect(triggers.has("techniques")).toBe(true);
  });

  it("rises with a change to what pages show, and not with an audit row", async () => {
    const before = await stamp();
    await getDb().insert(tags).values({ slug: "stamp-check", name: "Stamp check", kind: "problem" });
    const afterTag = await stamp();
    expect(afterTag).toBeGreaterThan(before);
    await getDb().insert(auditLog).values({ action: "test.stamp", targetType: "test", targetId: "x" });
    expect(await stamp()).toBe(afterTag);
  });

  it("reports a committed change before the writer's own query returns", async () => {
    const people = await createPeople();
    const g0 = await watching();
    if (g0 === null) return;
    await getDb().update(users).set({ name: "Renamed Once" }).where(eq(users.id, people.artist.id));
    const g1 = changeGeneration();
    expect(g1).not.toBe(g0);
    // A rolled-back change sends nothing (PostgreSQL delivers NOTIFY only on commit).
    await getDb()
      .transaction(async (tx) => {
        await tx.update(users).set({ name: "Never Kept" }).where(eq(users.id, people.artist.id));
        tx.rollback();
      })
      .catch(() => undefined);
    expect(changeGeneration()).toBe(g1);
  });
});

describe("remembered sessions end on the next request", () => {
  it("after disabling, a role change and a sign-out, by session cookie", async () => {
    const people = await createPeople();
    await watching();
    const cookie = await sessionCookie(people.artist);
    for (let i = 0; i < 3; i++) expect((await meAs({ cookie })).status).toBe(200);

    const promote = await updatePerson(apiRequest("PATCH", `/api/people/${people.artist.id}`, people.admin, { role: "senior" }), params({ id: people.artist.id }));
    expect(promote.status).toBe(200);
    // A role change ends the person's sessions (lib/people/mutations.ts; OWASP ASVS 4.0.3 V3.3).
    expect((await meAs({ cookie })).status).toBe(401);
    const promoted = await sessionCookie(people.artist, 1);
    for (let i = 0; i < 2; i++) expect((await (await meAs({ cookie: promoted })).json()).role).toBe("senior");

    // Sign-out raises the session version (lib/people/sign-in.ts); a cookie from before it is refused.
    await getDb().update(users).set({ sessionVersion: 2 }).where(eq(users.id, people.artist.id));
    expect((await meAs({ cookie: promoted })).status).toBe(401);
    const fresh = await sessionCookie(people.artist, 2);
    for (let i = 0; i < 2; i++) expect((await meAs({ cookie: fresh })).status).toBe(200);

    const disable = await updatePerson(apiRequest("PATCH", `/api/people/${people.artist.id}`, people.admin, { disabled: true }), params({ id: people.artist.id }));
    expect(disable.status).toBe(200);
    expect((await meAs({ cookie: fresh })).status).toBe(401);
  });

  it("after revoking a token", async () => {
    const people = await createPeople();
    await watching();
    const bearer = { authorization: `Bearer ${people.senior.token}` };
    for (let i = 0; i < 3; i++) expect((await meAs(bearer)).status).toBe(200);
    const [token] = await getDb().select({ id: apiTokens.id }).from(apiTokens).where(eq(apiTokens.userId, people.senior.id));
    const revoked = await revokeToken(apiRequest("DELETE", `/api/tokens/${token!.id}`, people.senior), params({ id: token!.id }));
    expect(revoked.status).toBe(204);
    expect((await meAs(bearer)).status).toBe(401);
  });
});
