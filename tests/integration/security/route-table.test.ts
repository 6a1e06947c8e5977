import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import {
  HTTP_METHODS,
  ROUTE_TABLE,
  SERVER_ACTIONS,
  isOwnershipRule,
  rolesPassing,
  routeFileOf,
  type RouteEntry,
} from "@/tests/integration/security/route-table";
import { ROLES, type Role } from "@/lib/auth/roles";
import { createUnsubscribeToken } from "@/lib/mail/unsubscribe";
import { createApiToken } from "@/lib/people/mutations";
import { askQuestion } from "@/lib/questions/mutations";
import { createRequest } from "@/lib/requests/mutations";
import { logUse } from "@/lib/uses/mutations";
import { createPair } from "@/lib/stills/mutations";
import { createTag as createTagRow } from "@/lib/tags/mutations";
import { createPerson, params, sessionCookie, simpleDoc, type TestPerson } from "@/tests/factories";
import {
  approvedTechnique,
  approvedTechniqueBy,
  buildWorld,
  draftTechnique,
  expectErrorShape,
  inReviewTechnique,
  smallPng,
  uniq,
  uploadStill,
  useTempFolders,
  type World,
} from "./world";

/*
 * Access control, complete (issue 9). Every route in tests/integration/security/route-table.ts is called as signed
 * out, artist, senior, lead and admin, and as owner and non-owner where ownership decides.
 * Source: OWASP ASVS 4.0.3 V4.1.1 (access rules enforced on the server side, on every request)
 * and V4.1.3/V4.1.5 (least privilege, deny by default, fail securely) — section numbers from memory.
 * Expected statuses: shared/API.md "Calling it" (401 signed out, 403 role too low).
 */

// The Auth.js route cannot be imported under vitest: next-auth imports "next/server" without an
// extension, which Node's ESM resolver refuses unless vitest inlines next-auth (server.deps.inline).
// Its exports are read from the source instead, and it is exercised by the e2e sign-in journeys.
const NOT_IMPORTABLE = new Set(["app/api/auth/[...nextauth]/route.ts"]);

function routeFiles(): string[] {
  return fs
    .readdirSync("app/api", { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile() && e.name === "route.ts")
    .map((e) => path.relative(process.cwd(), path.join(e.parentPath, e.name)).split(path.sep).join("/"))
    .sort();
}

const CATCH_ALL = "app/api/[...unknown]/route.ts";
type RouteModule = Record<string, ((req: Request, ctx?: unknown) => Promise<Response>) | undefined>;

/**
 * The methods a route file declares: its `otherMethods({ … })` makes OPTIONS answer them in
 * `Allow` (RFC 9110 §9.3.7). The catch-all declares every method (each answers 404).
 */
async function declaredMethods(file: string): Promise<string[]> {
  if (NOT_IMPORTABLE.has(file)) {
    const src = fs.readFileSync(file, "utf8");
    const names = /otherMethods\(\{([^}]*)\}\)/.exec(src)?.[1] ?? "";
    return HTTP_METHODS.filter((m) => names.split(",").map((n) => n.trim()).includes(m));
  }
  if (file === CATCH_ALL) return [...HTTP_METHODS];
  const mod = (await import(/* @vite-ignore */ path.resolve(file))) as RouteModule;
  const res = await mod.OPTIONS!(new Request("http://localhost/", { method: "OPTIONS" }), params({}));
  expect(res.status, `OPTIONS ${file}`).toBe(204);
  const allow = (res.headers.get("allow") ?? "").split(",").map((m) => m.trim());
  return HTTP_METHODS.filter((m) => allow.includes(m));
}

describe("the route table is complete (a new route missing from it fails here)", () => {
  it("lists exactly the methods every app/api/**/route.ts exports", { timeout: 120_000 }, async () => {
    const files = routeFiles();
    expect(files.length).toBeGreaterThan(40);
    const inCode = new Set<string>();
    for (const file of files) for (const m of await declaredMethods(file)) inCode.add(`${m} ${file}`);
    const inTable = new Set(ROUTE_TABLE.map((e) => `${e.method} ${routeFileOf(e.path)}`));
    // Deny by default (ASVS V4.1.3, from memory): a handler nobody classified is a defect.
    expect([...inCode].filter((k) => !inTable.has(k)), "declared but not in tests/integration/security/route-table.ts").toEqual([]);
    expect([...inTable].filter((k) => !inCode.has(k)), "in the table but not declared").toEqual([]);
    expect(ROUTE_TABLE.length).toBe(inTable.size);
  });

  it("lists every server action (public POST endpoints) with its authority", () => {
    const found: string[] = [];
    for (const dir of ["app", "lib", "components"]) {
      for (const e of fs.readdirSync(dir, { recursive: true, withFileTypes: true })) {
        if (!e.isFile() || !/\.tsx?$/.test(e.name)) continue;
        const file = path.relative(process.cwd(), path.join(e.parentPath, e.name)).split(path.sep).join("/");
        const src = fs.readFileSync(file, "utf8");
        if (!/^\s*["']use server["']/.test(src)) continue;
        for (const m of src.matchAll(/export\s+(?:async\s+)?function\s+(\w+)/g)) found.push(`${file}#${m[1]}`);
      }
    }
    expect(found.sort()).toEqual(SERVER_ACTIONS.map((a) => `${a.file}#${a.name}`).sort());
  });
});

describe("every route answers a method it does not serve (RFC 9110 §15.5.6 405, §9.3.2 HEAD, §9.3.7 OPTIONS)", () => {
  const ALL_METHODS = ["GET", "HEAD", "OPTIONS", "POST", "PUT", "PATCH", "DELETE"] as const;

  it("exports all seven methods from every route file, so the framework never answers with an empty 405", async () => {
    for (const file of routeFiles()) {
      if (NOT_IMPORTABLE.has(file)) {
        // Read from the source: the declared methods and `otherMethods` for the rest.
        expect(fs.readFileSync(file, "utf8"), file).toMatch(/export const \{ HEAD, OPTIONS(, \w+)* \} = otherMethods\(/);
        continue;
      }
      const mod = (await import(/* @vite-ignore */ path.resolve(file))) as RouteModule;
      expect(ALL_METHODS.filter((m) => typeof mod[m] !== "function"), file).toEqual([]);
    }
  });

  it("answers 405 in the error shape with Allow naming exactly the methods served, before reading the body or the caller", { timeout: 120_000 }, async () => {
    const lead = w.people.lead;
    let checked = 0;
    for (const file of routeFiles()) {
      if (NOT_IMPORTABLE.has(file) || file === CATCH_ALL) continue;
      const served = ROUTE_TABLE.filter((e) => routeFileOf(e.path) === file).map((e) => e.method as string);
      const expectedAllow = new Set([...served, ...(served.includes("GET") ? ["HEAD"] : []), "OPTIONS"]);
      const mod = (await import(/* @vite-ignore */ path.resolve(file))) as RouteModule;
      for (const method of ALL_METHODS.filter((m) => !expectedAllow.has(m))) {
        for (const who of [null, lead]) {
          const headers = new Headers({ "Content-Type": "application/json" });
          if (who) headers.set("Authorization", `Bearer ${who.token}`);
          const withBody = method !== "HEAD" && method !== "GET";
          const req = new Request("http://localhost/", { method, headers, body: withBody ? "{ not json" : undefined });
          const res = await mod[method]!(req, params({}));
          const label = `${method} ${file} as ${who ? "lead" : "nobody"}`;
          expect(res.status, label).toBe(405);
          expect(new Set((res.headers.get("allow") ?? "").split(",").map((m) => m.trim())), `${label} Allow`).toEqual(expectedAllow);
          if (method === "HEAD") expect(await res.text(), `${label} HEAD has no content`).toBe("");
          else expect((await expectErrorShape(res, label)).code).toBe("method_not_allowed");
          checked += 1;
        }
      }
      const options = await mod.OPTIONS!(new Request("http://localhost/", { method: "OPTIONS" }), params({}));
      expect(options.status, `OPTIONS ${file}`).toBe(204);
      expect(new Set((options.headers.get("allow") ?? "").split(",").map((m) => m.trim())), `OPTIONS ${file}`).toEqual(expectedAllow);
    }
    expect(checked).toBeGreaterThan(200);
  });

  it("answers HEAD like GET without the content", async () => {
    const { GET, HEAD } = (await import("@/app/api/me/route")) as RouteModule;
    const headers = { Authorization: `Bearer ${w.people.senior.token}` };
    const get = await GET!(new Request("http://localhost/api/me", { headers }), params({}));
    const head = await HEAD!(new Request("http://localhost/api/me", { method: "HEAD", headers }), params({}));
    expect(head.status).toBe(200);
    expect(head.headers.get("content-type")).toBe(get.headers.get("content-type"));
    expect(head.headers.get("cache-control")).toBe("private, no-store");
    expect(await head.text()).toBe("");
    expect((await get.json()).email).toBe(w.people.senior.email);
    const anon = await HEAD!(new Request("http://localhost/api/me", { method: "HEAD" }), params({}));
    expect(anon.status).toBe(401);
  });

  it("answers every method of an unknown path with 404 in the error shape", async () => {
    const mod = (await import(/* @vite-ignore */ path.resolve(CATCH_ALL))) as RouteModule;
    for (const method of ALL_METHODS) {
      const res = await mod[method]!(new Request("http://localhost/api/no/such", { method }), params({ unknown: ["no", "such"] }));
      expect(res.status, method).toBe(404);
      if (method !== "HEAD") expect((await expectErrorShape(res, method)).code).toBe("not_found");
    }
  });
});

// ---------------------------------------------------------------------------------------------

type Prep = { url: string; body?: unknown; raw?: string; params?: Record<string, string>; headers?: Record<string, string>; form?: FormData };
type Case = {
  /** Status an allowed caller gets with these fixtures. */
  ok: number;
  /** Builds the request; may make fresh fixtures (mutations are not repeatable). `owner` owns the resource, for ownership rules and trial stills. */
  prep: (caller: TestPerson | null, owner?: TestPerson) => Promise<Prep>;
};

let w: World;
let folders: ReturnType<typeof useTempFolders>;
const INBOX_ID = "20250102030405-000001-0a1b2c3d";

const key = (e: Pick<RouteEntry, "method" | "path">) => `${e.method} ${e.path}`;
const doc = simpleDoc("Check the edges at frame 1012.");

function cases(): Record<string, Case> {
  const p = w.people;
  const stillOf = async (owner?: TestPerson) => (owner ? uploadStill(owner, { owner: "trial" }) : w.still);
  const c: Record<string, Case> = {
    "GET /api/health": { ok: 200, prep: async () => ({ url: "/api/health" }) },
    "POST /api/password-resets": { ok: 202, prep: async () => ({ url: "/api/password-resets", body: { email: `someone-${crypto.randomUUID()}@kestrel.test` } }) },
    "GET /api/unsubscribe": { ok: 303, prep: async () => ({ url: "/api/unsubscribe?token=abc" }) },
    "POST /api/unsubscribe": {
      ok: 200,
      prep: async () => ({ url: `/api/unsubscribe?token=${encodeURIComponent(createUnsubscribeToken({ userId: p.artist.id, kind: "all", key: "" }))}` }),
    },
    "GET /api/me": { ok: 200, prep: async () => ({ url: "/api/me" }) },
    "GET /api/tokens": { ok: 200, prep: async () => ({ url: "/api/tokens" }) },
    "POST /api/tokens": { ok: 201, prep: async () => ({ url: "/api/tokens", body: { name: "publish script" } }) },
    "DELETE /api/tokens/[id]": {
      ok: 204,
      prep: async (caller, owner) => {
        const { id } = await createApiToken(owner ?? caller ?? p.artist, "to revoke");
        return { url: `/api/tokens/${id}`, params: { id } };
      },
    },
    "GET /api/people": { ok: 200, prep: async () => ({ url: "/api/people" }) },
    "POST /api/people": { ok: 201, prep: async () => ({ url: "/api/people", body: { email: `p-${uniq()}@kestrel.test`, name: "New Person", role: "artist" } }) },
    "PATCH /api/people/[id]": {
      ok: 200,
      prep: async () => {
        const target = await createPerson("artist");
        return { url: `/api/people/${target.id}`, params: { id: target.id }, body: { role: "senior" } };
      },
    },
    "GET /api/admin/outbox": { ok: 200, prep: async () => ({ url: "/api/admin/outbox" }) },
    "GET /api/admin/outbox/[id]": { ok: 200, prep: async () => ({ url: `/api/admin/outbox/${w.outboxId}`, params: { id: String(w.outboxId) } }) },
    "POST /api/admin/outbox/[id]/retry": { ok: 200, prep: async () => ({ url: `/api/admin/outbox/${w.outboxId}/retry`, params: { id: String(w.outboxId) } }) },
    "GET /api/admin/audit": { ok: 200, prep: async () => ({ url: "/api/admin/audit?limit=5" }) },
    "GET /api/admin/inbox": { ok: 200, prep: async () => ({ url: "/api/admin/inbox" }) },
    "GET /api/admin/inbox/[id]": { ok: 200, prep: async () => ({ url: `/api/admin/inbox/${INBOX_ID}`, params: { id: INBOX_ID } }) },

    "GET /api/techniques": { ok: 200, prep: async () => ({ url: "/api/techniques" }) },
    "POST /api/techniques": {
      ok: 201,
      prep: async () => ({ url: "/api/techniques", body: { title: `Edge blend ${uniq()}`, summary: "Blend the patch edge into grain." } }),
    },
    "GET /api/techniques/[slug]": { ok: 200, prep: async () => ({ url: `/api/techniques/${w.approved}`, params: { slug: w.approved } }) },
    "PUT /api/techniques/[slug]": {
      ok: 200,
      prep: async () => {
        const slug = await draftTechnique(p.senior);
        const body = { title: "Patch regrain", summary: "Regrain a painted patch.", baseRevision: 1, changeNote: "Tighter wording." };
        return { url: `/api/techniques/${slug}`, params: { slug }, body };
      },
    },
    "POST /api/techniques/[slug]/submit": {
      ok: 200,
      prep: async () => {
        const slug = await draftTechnique(p.senior);
        return { url: `/api/techniques/${slug}/submit`, params: { slug } };
      },
    },
    "POST /api/techniques/[slug]/review": {
      ok: 200,
      prep: async () => {
        const slug = await inReviewTechnique(p.senior);
        return { url: `/api/techniques/${slug}/review`, params: { slug }, body: { revision: 1, decision: "approve" } };
      },
    },
    "POST /api/techniques/[slug]/retire": {
      ok: 200,
      prep: async () => {
        const slug = await approvedTechnique(p.senior, p.lead);
        return { url: `/api/techniques/${slug}/retire`, params: { slug }, body: { note: "Replaced." } };
      },
    },
    "GET /api/techniques/[slug]/revisions": { ok: 200, prep: async () => ({ url: `/api/techniques/${w.approved}/revisions`, params: { slug: w.approved } }) },
    "GET /api/techniques/[slug]/revisions/diff": {
      ok: 200,
      prep: async () => ({ url: `/api/techniques/${w.approved}/revisions/diff?from=1&to=1`, params: { slug: w.approved } }),
    },
    "POST /api/techniques/[slug]/revisions/[number]/restore": {
      ok: 201,
      prep: async () => {
        const slug = await draftTechnique(p.senior);
        return { url: `/api/techniques/${slug}/revisions/1/restore`, params: { slug, number: "1" }, body: { baseRevision: 1 } };
      },
    },
    "GET /api/techniques/[slug]/questions": { ok: 200, prep: async () => ({ url: `/api/techniques/${w.approved}/questions`, params: { slug: w.approved } }) },
    "POST /api/techniques/[slug]/questions": {
      ok: 201,
      prep: async () => ({ url: `/api/techniques/${w.approved}/questions`, params: { slug: w.approved }, body: { body: doc } }),
    },
    "GET /api/techniques/[slug]/uses": { ok: 200, prep: async () => ({ url: `/api/techniques/${w.approved}/uses`, params: { slug: w.approved } }) },
    "POST /api/techniques/[slug]/uses": {
      ok: 201,
      prep: async () => ({ url: `/api/techniques/${w.approved}/uses`, params: { slug: w.approved }, body: { shot: w.shot, outcome: "touch-up" } }),
    },
    "GET /api/review-queue": { ok: 200, prep: async () => ({ url: "/api/review-queue" }) },
    "GET /api/search": { ok: 200, prep: async () => ({ url: "/api/search?q=regrain" }) },
    "GET /api/search/suggest": { ok: 200, prep: async () => ({ url: "/api/search/suggest?q=pat" }) },

    "POST /api/questions/[id]/answers": {
      ok: 201,
      prep: async (caller, owner) => {
        // `owner` is the technique's author; the question is someone else's.
        const slug = await approvedTechniqueBy(owner ?? p.senior);
        const { id } = await askQuestion(w.other.artist, slug, doc);
        return { url: `/api/questions/${id}/answers`, params: { id }, body: { body: doc } };
      },
    },
    "POST /api/questions/[id]/resolve": {
      ok: 200,
      prep: async (caller, owner) => {
        // `owner` asked the question; the technique is another person's.
        const slug = await approvedTechniqueBy(w.other.senior);
        const { id } = await askQuestion(owner ?? p.artist, slug, doc);
        return { url: `/api/questions/${id}/resolve`, params: { id } };
      },
    },
    "GET /api/requests": { ok: 200, prep: async () => ({ url: "/api/requests?scope=open" }) },
    "POST /api/requests": { ok: 201, prep: async () => ({ url: "/api/requests", body: { query: "Rig removal on water", note: "" } }) },
    "POST /api/requests/[id]/claim": {
      ok: 200,
      prep: async () => {
        const { id } = await createRequest(p.artist, { query: `Boom shadow ${uniq()}`, note: "" });
        return { url: `/api/requests/${id}/claim`, params: { id } };
      },
    },

    "GET /api/tags": { ok: 200, prep: async () => ({ url: "/api/tags" }) },
    "POST /api/tags": { ok: 201, prep: async () => ({ url: "/api/tags", body: { kind: "plate", name: `Night exterior ${uniq()}` } }) },
    "PATCH /api/tags/[slug]": { ok: 200, prep: async () => ({ url: `/api/tags/${w.tag.slug}`, params: { slug: w.tag.slug }, body: { description: "Markers on a screen." } }) },
    "POST /api/tags/[slug]/merge": {
      ok: 200,
      prep: async () => {
        const from = await createTagRow(p.lead, { kind: "problem", name: `Wire ${uniq()}`, description: "", aliases: [] });
        const into = await createTagRow(p.lead, { kind: "problem", name: `Rig ${uniq()}`, description: "", aliases: [] });
        return { url: `/api/tags/${from.slug}/merge`, params: { slug: from.slug }, body: { into: into.slug } };
      },
    },
    "PUT /api/tags/[slug]/house-method": {
      ok: 200,
      prep: async () => ({ url: `/api/tags/${w.tag.slug}/house-method`, params: { slug: w.tag.slug }, body: { technique: null } }),
    },

    "GET /api/shows": { ok: 200, prep: async () => ({ url: "/api/shows" }) },
    "POST /api/shows": {
      ok: 201,
      prep: async () => ({ url: "/api/shows", body: { code: `Q${uniq().slice(-6)}`.toUpperCase().replace(/[^A-Z0-9]/g, "0"), name: "Another show" } }),
    },
    "GET /api/shows/[code]": { ok: 200, prep: async () => ({ url: `/api/shows/${w.showCode}`, params: { code: w.showCode } }) },
    "PATCH /api/shows/[code]": { ok: 200, prep: async () => ({ url: `/api/shows/${w.showCode}`, params: { code: w.showCode }, body: { name: "Security test show" } }) },
    "GET /api/shows/[code]/shots": { ok: 200, prep: async () => ({ url: `/api/shows/${w.showCode}/shots`, params: { code: w.showCode } }) },
    "POST /api/shows/[code]/shots": {
      ok: 200,
      prep: async () => ({ url: `/api/shows/${w.showCode}/shots`, params: { code: w.showCode }, body: { rows: [{ code: w.shot }] } }),
    },
    "GET /api/shots": { ok: 200, prep: async () => ({ url: `/api/shots?q=${w.showCode}` }) },
    "GET /api/shots/[code]": { ok: 200, prep: async () => ({ url: `/api/shots/${w.shot}`, params: { code: w.shot } }) },
    "GET /api/uses/[id]": { ok: 200, prep: async () => ({ url: `/api/uses/${w.use}`, params: { id: w.use } }) },
    "PATCH /api/uses/[id]": {
      ok: 200,
      prep: async (caller, owner) => {
        const { id } = await logUse(owner ?? p.artist, w.approved, { shot: w.shot, outcome: "clean", note: "" });
        return { url: `/api/uses/${id}`, params: { id }, body: { note: "Needed a second pass on frame 1040." } };
      },
    },
    "DELETE /api/uses/[id]": {
      ok: 204,
      prep: async (caller, owner) => {
        const { id } = await logUse(owner ?? p.artist, w.approved, { shot: w.shot, outcome: "failed", note: "" });
        return { url: `/api/uses/${id}`, params: { id } };
      },
    },

    "POST /api/stills": {
      ok: 201,
      prep: async () => {
        const form = new FormData();
        form.set("file", new Blob([new Uint8Array(await smallPng())], { type: "image/png" }), "trial.png");
        form.set("alt", "Trial grade of the plate");
        form.set("owner", "trial");
        return { url: "/api/stills", form };
      },
    },
    "GET /api/stills": { ok: 200, prep: async () => ({ url: `/api/stills?technique=${w.approved}` }) },
    "GET /api/stills/[id]": {
      ok: 200,
      prep: async (caller, owner) => {
        const id = await stillOf(owner);
        return { url: `/api/stills/${id}`, params: { id } };
      },
    },
    "GET /api/stills/[id]/[variant]": {
      ok: 200,
      prep: async (caller, owner) => {
        const id = await stillOf(owner);
        return { url: `/api/stills/${id}/preview`, params: { id, variant: "preview" } };
      },
    },
    "GET /api/stills/[id]/pixel": {
      ok: 200,
      prep: async (caller, owner) => {
        const id = await stillOf(owner);
        return { url: `/api/stills/${id}/pixel?x=1&y=2`, params: { id } };
      },
    },
    "GET /api/stills/pairs": { ok: 200, prep: async () => ({ url: `/api/stills/pairs?technique=${w.approved}` }) },
    "POST /api/stills/pairs": { ok: 201, prep: async () => ({ url: "/api/stills/pairs", body: { technique: w.approved, before: w.still, after: w.still2 } }) },
    "DELETE /api/stills/pairs/[id]": {
      ok: 204,
      prep: async () => {
        const { id } = await createPair(p.senior, { technique: w.approved, before: w.still2, after: w.still, caption: undefined });
        return { url: `/api/stills/pairs/${id}`, params: { id } };
      },
    },

    "POST /api/lab/run": { ok: 200, prep: async (c, owner) => ({ url: "/api/lab/run?report=1", body: { still: await stillOf(owner), steps: [], format: "png" } }) },
    "POST /api/lab/analyse": { ok: 200, prep: async (c, owner) => ({ url: "/api/lab/analyse", body: { still: await stillOf(owner), histogram: true, bins: 16 } }) },
    "POST /api/lab/sample": { ok: 200, prep: async (c, owner) => ({ url: "/api/lab/sample", body: { still: await stillOf(owner), boxes: [{ x: 0, y: 0, w: 4, h: 4 }] } }) },
    "POST /api/lab/solve": {
      ok: 200,
      prep: async () => ({
        url: "/api/lab/solve",
        body: {
          markers: [[0.1, 0.5, 0.2], [0.3, 0.6, 0.25], [0.2, 0.55, 0.4]],
          screen: [[0.1, 0.7, 0.2], [0.15, 0.72, 0.22], [0.12, 0.69, 0.3]],
          goal: { kind: "hide", channel: "g" },
        },
      }),
    },

    "GET /api/subscriptions": { ok: 200, prep: async () => ({ url: "/api/subscriptions" }) },
    "POST /api/subscriptions": { ok: 201, prep: async () => ({ url: "/api/subscriptions", body: { target: { kind: "technique", key: w.approved } } }) },
    "DELETE /api/subscriptions": { ok: 200, prep: async () => ({ url: "/api/subscriptions", body: { target: { kind: "technique", key: w.approved } } }) },
    "PUT /api/subscriptions/mode": { ok: 200, prep: async () => ({ url: "/api/subscriptions/mode", body: { mode: "daily" } }) },
  };
  for (const method of HTTP_METHODS) c[`${method} /api/[...unknown]`] = { ok: 404, prep: async () => ({ url: "/api/no/such/thing" }) };
  return c;
}

async function call(entry: RouteEntry, prep: Prep, caller: TestPerson | null, auth: "bearer" | "cookie" = "bearer"): Promise<Response> {
  const mod = (await import(/* @vite-ignore */ path.resolve(routeFileOf(entry.path)))) as Record<string, (req: Request, ctx: unknown) => Promise<Response>>;
  const handler = mod[entry.method];
  if (!handler) throw new Error(`${key(entry)} is not exported`);
  const headers = new Headers(prep.headers);
  if (caller && auth === "bearer") headers.set("Authorization", `Bearer ${caller.token}`);
  if (caller && auth === "cookie") headers.set("Cookie", await sessionCookie(caller));
  let body: BodyInit | undefined;
  if (prep.form) body = prep.form;
  else if (prep.raw !== undefined) {
    headers.set("Content-Type", "application/json");
    body = prep.raw;
  } else if (prep.body !== undefined) {
    headers.set("Content-Type", "application/json");
    body = JSON.stringify(prep.body);
  }
  const req = new Request(`http://localhost${prep.url}`, { method: entry.method, headers, body });
  return handler(req, params(prep.params ?? {}));
}

/** Every answer: never a 500, and every error in the API error shape with application/json. */
async function checked(res: Response, label: string): Promise<Response> {
  expect(res.status, `${label}: ${await res.clone().text().then((t) => t.slice(0, 300))}`).not.toBe(500);
  if (res.status >= 400) await expectErrorShape(res, label);
  return res;
}

async function expectStatus(res: Response, status: number, label: string): Promise<void> {
  await checked(res, label);
  const detail = res.status === status ? "" : await res.clone().text();
  expect(res.status, `${label} ${detail.slice(0, 300)}`).toBe(status);
  if (status === 401) expect((await res.clone().json()).error.code).toBe("unauthorized");
  if (status === 403) expect((await res.clone().json()).error.code).toBe("forbidden");
}

beforeAll(async () => {
  folders = useTempFolders();
  w = await buildWorld();
  // One received message in the local inbox, as scripts/fake-smtp/server.ts files them.
  const inbox = path.join(folders.data, "mail-inbox");
  fs.mkdirSync(inbox, { recursive: true });
  fs.writeFileSync(
    path.join(inbox, `${INBOX_ID}.eml`),
    "From: Plateroom <plateroom@kestrel.test>\r\nTo: lead@kestrel.test\r\nSubject: Test\r\nDate: Thu, 02 Jan 2025 03:04:05 +0000\r\nMessage-ID: <t1@kestrel.test>\r\n\r\nHello.\r\n",
  );
}, 120_000);

afterAll(() => folders?.cleanup());

describe("every route as signed out, artist, senior, lead and admin (ASVS V4.1.1, V4.1.3, from memory)", () => {
  const callable = ROUTE_TABLE.filter((e) => !NOT_IMPORTABLE.has(routeFileOf(e.path)));

  it("has a prepared call for every callable entry", () => {
    const c = cases();
    expect(callable.map(key).filter((k) => !c[k])).toEqual([]);
  });

  for (const entry of callable) {
    const label = key(entry);
    it(label, { timeout: 60_000 }, async () => {
      const c = cases()[label]!;
      // Signed out: 401 for everything that is not public (server-side check on every request).
      const anon = await call(entry, await c.prep(null), null);
      await expectStatus(anon, entry.access === "public" ? c.ok : 401, `${label} signed out`);

      if (isOwnershipRule(entry.access)) {
        for (const role of ROLES) {
          const me = w.people[role];
          // As owner of the resource: allowed for every role the permission table gives the action.
          await expectStatus(await call(entry, await c.prep(me, me), me), c.ok, `${label} as ${role}, owner`);
          // On someone else's resource: only leads, except tokens which are nobody else's business.
          const allowed = entry.access !== "owner" && role === "lead";
          const res = await call(entry, await c.prep(me, w.other.artist), me);
          await expectStatus(res, allowed ? c.ok : (entry.deniedAs ?? 403), `${label} as ${role}, not owner`);
        }
        return;
      }

      const passing = rolesPassing(entry.access);
      for (const role of ROLES) {
        const me = w.people[role];
        const res = await call(entry, await c.prep(me), me);
        // Roles below the minimum: 403; allowed roles: the route's answer, never 401/403/500.
        await expectStatus(res, passing.includes(role) ? c.ok : 403, `${label} as ${role}`);
        if (!passing.includes(role) && entry.method !== "GET") {
          // The role is checked before the body is read: a refused role learns nothing about the
          // body's rules from field errors (OWASP ASVS 4.0.3 V4.1.1, V4.1.5 fail securely, from memory).
          const garbage = await call(entry, { ...(await c.prep(me)), body: undefined, form: undefined, raw: "{ not json" }, me);
          await expectStatus(garbage, 403, `${label} as ${role} with a malformed body`);
          const wrongShape = await call(entry, { ...(await c.prep(me)), body: { title: 1, rows: "x", into: [], role: "boss" }, form: undefined }, me);
          await expectStatus(wrongShape, 403, `${label} as ${role} with a wrong-shaped body`);
        }
      }

      if (entry.trialStills) {
        // A private trial: its uploader only; anyone else, leads and admins too, 404, not 403 (no hint it exists).
        for (const role of ROLES) {
          const me = w.people[role];
          await expectStatus(await call(entry, await c.prep(me, me), me), c.ok, `${label} own trial as ${role}`);
          const other = await call(entry, await c.prep(me, w.other.artist), me);
          await expectStatus(other, entry.trialStills.deniedAs, `${label} someone else's trial as ${role}`);
        }
      }
    });
  }
});

describe("the same gate by session cookie, and for changed accounts", () => {
  const pick = (k: string) => ROUTE_TABLE.find((e) => key(e) === k)!;

  it("applies the table to cookie sessions as to bearer tokens", async () => {
    const c = cases();
    for (const k of ["GET /api/review-queue", "GET /api/people", "POST /api/techniques", "GET /api/me"]) {
      const entry = pick(k);
      for (const role of ROLES) {
        const res = await call(entry, await c[k]!.prep(w.people[role]), w.people[role], "cookie");
        await expectStatus(res, rolesPassing(entry.access).includes(role) ? c[k]!.ok : 403, `${k} as ${role} by cookie`);
      }
    }
  });

  it("refuses a disabled person at once, and a demoted lead on the next request", async () => {
    const c = cases();
    const lead = await createPerson("lead");
    const entry = pick("GET /api/review-queue");
    await expectStatus(await call(entry, await c["GET /api/review-queue"]!.prep(lead), lead), 200, "lead");
    await getDb().update(users).set({ role: "artist" }).where(eq(users.id, lead.id));
    await expectStatus(await call(entry, await c["GET /api/review-queue"]!.prep(lead), lead), 403, "demoted");
    await getDb().update(users).set({ disabledAt: new Date() }).where(eq(users.id, lead.id));
    await expectStatus(await call(entry, await c["GET /api/review-queue"]!.prep(lead), lead), 401, "disabled");
  });

  it("lets the technique's author (any role) resolve someone's question, and refuses a bystander", async () => {
    const entry = pick("POST /api/questions/[id]/resolve");
    for (const role of ["artist", "admin"] as const satisfies readonly Role[]) {
      const author = await createPerson(role);
      const slug = await approvedTechniqueBy(author);
      const { id } = await askQuestion(w.other.artist, slug, doc);
      await expectStatus(await call(entry, { url: `/api/questions/${id}/resolve`, params: { id } }, author), 200, `author ${role}`);
      await expectStatus(await call(entry, { url: `/api/questions/${id}/resolve`, params: { id } }, w.people.senior), 403, "bystander senior");
    }
  });

  it("lets artists upload only trials and use stills, not technique stills", async () => {
    const entry = pick("POST /api/stills");
    const form = new FormData();
    form.set("file", new Blob([new Uint8Array(await smallPng())], { type: "image/png" }), "plate.png");
    form.set("alt", "Plate");
    form.set("technique", w.approved);
    await expectStatus(await call(entry, { url: "/api/stills", form }, w.people.artist), 403, "artist technique still");
    const again = new FormData();
    for (const [k, v] of form) again.set(k, v);
    await expectStatus(await call(entry, { url: "/api/stills", form: again }, w.people.senior), 201, "senior technique still");
  });
});
