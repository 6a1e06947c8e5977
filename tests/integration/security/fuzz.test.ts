import path from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ROUTE_TABLE, routeFileOf } from "@/tests/integration/security/route-table";
import { createUnsubscribeToken } from "@/lib/mail/unsubscribe";
import { createRequest } from "@/lib/requests/mutations";
import { askQuestion } from "@/lib/questions/mutations";
import { logUse } from "@/lib/uses/mutations";
import { createTag as createTagRow } from "@/lib/tags/mutations";
import { createPerson, params, simpleDoc, type TestPerson } from "@/tests/factories";
import { approvedTechnique, buildWorld, draftTechnique, expectErrorShape, inReviewTechnique, uniq, useTempFolders, type World } from "./world";

/*
 * Hostile input at volume (issue 9): property-based tests (fast-check) feed arbitrary JSON,
 * mutated valid bodies, malformed JSON text and wrong content types into every JSON route's
 * real handler, called as a role allowed to use it. The property: never a 500, and every
 * non-2xx answer is the API error shape with application/json (shared/API.md "Calling it";
 * OWASP ASVS 4.0.3 V5.1 input validation, from memory). Runs are bounded to keep this fast.
 */

// Bounded so the suite stays fast; PLATEROOM_FUZZ_SCALE=10 for a deeper run by hand.
const SCALE = Number(process.env.PLATEROOM_FUZZ_SCALE ?? 1);
const RUNS = { arbitrary: 30 * SCALE, mutated: 50 * SCALE, malformed: 10 * SCALE };
let w: World;
let folders: ReturnType<typeof useTempFolders>;

type Target = {
  method: "POST" | "PUT" | "PATCH" | "DELETE";
  path: string;
  /** The caller: a role that passes the route's role gate, so input reaches validation and the DAL. */
  as: () => TestPerson;
  url: () => string;
  params: () => Record<string, string>;
  valid: () => unknown;
};

const doc = simpleDoc("Does this hold with heavy motion blur?");
let useId = "";
let questionId = "";
let draftSlug = "";
let inReviewSlug = "";
let retireSlug = "";
let mergeTag = "";
let personId = "";

/** The routes fuzzed here; one generated test each. */
const FUZZED = [
  "POST /api/techniques", "PUT /api/techniques/[slug]", "POST /api/techniques/[slug]/review", "POST /api/techniques/[slug]/retire",
  "POST /api/techniques/[slug]/revisions/[number]/restore", "POST /api/techniques/[slug]/questions", "POST /api/techniques/[slug]/uses",
  "PATCH /api/uses/[id]", "POST /api/questions/[id]/answers", "POST /api/requests", "POST /api/tags", "PATCH /api/tags/[slug]",
  "POST /api/tags/[slug]/merge", "PUT /api/tags/[slug]/house-method", "POST /api/shows", "PATCH /api/shows/[code]",
  "POST /api/shows/[code]/shots", "POST /api/stills/pairs", "POST /api/lab/run", "POST /api/lab/analyse", "POST /api/lab/sample",
  "POST /api/lab/solve", "POST /api/people", "PATCH /api/people/[id]", "POST /api/tokens", "POST /api/subscriptions",
  "DELETE /api/subscriptions", "PUT /api/subscriptions/mode", "POST /api/password-resets",
] as const;

function targets(): Target[] {
  const p = w.people;
  const t = (method: Target["method"], route: string, as: () => TestPerson, url: () => string, prm: () => Record<string, string>, valid: () => unknown): Target => ({
    method,
    path: route,
    as,
    url,
    params: prm,
    valid,
  });
  const none = () => ({});
  return [
    t("POST", "/api/techniques", () => p.senior, () => "/api/techniques", none, () => ({ title: "Edge blend", summary: "Blend the edge.", tags: [w.tag.slug], body: doc, recipe: [{ op: "copy", from: "g", to: "b" }] })),
    t("PUT", "/api/techniques/[slug]", () => p.senior, () => `/api/techniques/${draftSlug}`, () => ({ slug: draftSlug }), () => ({ title: "Patch regrain", summary: "Regrain.", baseRevision: 1, changeNote: "Wording." })),
    t("POST", "/api/techniques/[slug]/review", () => p.lead, () => `/api/techniques/${inReviewSlug}/review`, () => ({ slug: inReviewSlug }), () => ({ revision: 1, decision: "return", note: "Add a still." })),
    t("POST", "/api/techniques/[slug]/retire", () => p.lead, () => `/api/techniques/${retireSlug}/retire`, () => ({ slug: retireSlug }), () => ({ supersededBy: w.approved, note: "Replaced." })),
    t("POST", "/api/techniques/[slug]/revisions/[number]/restore", () => p.senior, () => `/api/techniques/${draftSlug}/revisions/1/restore`, () => ({ slug: draftSlug, number: "1" }), () => ({ baseRevision: 1 })),
    t("POST", "/api/techniques/[slug]/questions", () => p.artist, () => `/api/techniques/${w.approved}/questions`, () => ({ slug: w.approved }), () => ({ body: doc })),
    t("POST", "/api/techniques/[slug]/uses", () => p.artist, () => `/api/techniques/${w.approved}/uses`, () => ({ slug: w.approved }), () => ({ shot: w.shot, outcome: "clean", note: "Fine.", beforeStill: w.still, afterStill: w.still2 })),
    t("PATCH", "/api/uses/[id]", () => p.lead, () => `/api/uses/${useId}`, () => ({ id: useId }), () => ({ outcome: "touch-up", note: "Second pass.", shot: w.shot, beforeStill: null })),
    t("POST", "/api/questions/[id]/answers", () => p.lead, () => `/api/questions/${questionId}/answers`, () => ({ id: questionId }), () => ({ body: doc })),
    t("POST", "/api/requests", () => p.artist, () => "/api/requests", none, () => ({ query: "Rig removal on water", note: "Lots of ripples." })),
    t("POST", "/api/tags", () => p.lead, () => "/api/tags", none, () => ({ kind: "plate", name: "Night exterior", description: "", aliases: ["night ext"] })),
    t("PATCH", "/api/tags/[slug]", () => p.lead, () => `/api/tags/${w.tag.slug}`, () => ({ slug: w.tag.slug }), () => ({ name: w.tag.name, description: "Markers.", aliases: ["markers"] })),
    t("POST", "/api/tags/[slug]/merge", () => p.lead, () => `/api/tags/${mergeTag}/merge`, () => ({ slug: mergeTag }), () => ({ into: w.tag.slug })),
    t("PUT", "/api/tags/[slug]/house-method", () => p.lead, () => `/api/tags/${w.tag.slug}/house-method`, () => ({ slug: w.tag.slug }), () => ({ technique: w.approved })),
    t("POST", "/api/shows", () => p.lead, () => "/api/shows", none, () => ({ code: "LTH", name: "The Long Thaw", kind: "series", state: "active", shotPattern: "^{CODE}_\\d{3}_\\d{4}$" })),
    t("PATCH", "/api/shows/[code]", () => p.lead, () => `/api/shows/${w.showCode}`, () => ({ code: w.showCode }), () => ({ name: "Security test show", kind: "feature" })),
    t("POST", "/api/shows/[code]/shots", () => p.lead, () => `/api/shows/${w.showCode}/shots`, () => ({ code: w.showCode }), () => ({ rows: [{ code: w.shot, frameStart: 1001, frameEnd: 1100, state: "in_prep" }], dryRun: true })),
    t("POST", "/api/stills/pairs", () => p.senior, () => "/api/stills/pairs", none, () => ({ technique: w.approved, before: w.still, after: w.still2, caption: "Before and after" })),
    t("POST", "/api/lab/run", () => p.artist, () => "/api/lab/run?report=1", none, () => ({ still: w.still, steps: [{ op: "matte", channel: "g", black: 0.1, white: 0.9 }, { op: "grow", px: 1 }], format: "png" })),
    t("POST", "/api/lab/analyse", () => p.artist, () => "/api/lab/analyse", none, () => ({ still: w.still, line: { x0: 0, y0: 0, x1: 10, y1: 5 }, histogram: true, bins: 16 })),
    t("POST", "/api/lab/sample", () => p.artist, () => "/api/lab/sample", none, () => ({ still: w.still, boxes: [{ x: 0, y: 0, w: 4, h: 4 }] })),
    t("POST", "/api/lab/solve", () => p.artist, () => "/api/lab/solve", none, () => ({ markers: [[0.1, 0.5, 0.2], [0.3, 0.6, 0.25]], screen: [[0.1, 0.7, 0.2], [0.12, 0.69, 0.3]], goal: { kind: "hide", channel: "g" } })),
    t("POST", "/api/people", () => p.admin, () => "/api/people", none, () => ({ email: "new.person@kestrel.test", name: "New Person", role: "artist" })),
    t("PATCH", "/api/people/[id]", () => p.admin, () => `/api/people/${personId}`, () => ({ id: personId }), () => ({ role: "senior", disabled: false })),
    t("POST", "/api/tokens", () => p.artist, () => "/api/tokens", none, () => ({ name: "publish script" })),
    t("POST", "/api/subscriptions", () => p.artist, () => "/api/subscriptions", none, () => ({ target: { kind: "technique", key: w.approved }, mode: "daily" })),
    t("DELETE", "/api/subscriptions", () => p.artist, () => "/api/subscriptions", none, () => ({ target: { kind: "show", key: w.showCode } })),
    t("PUT", "/api/subscriptions/mode", () => p.artist, () => "/api/subscriptions/mode", none, () => ({ mode: "immediate" })),
    t("POST", "/api/password-resets", () => p.artist, () => "/api/password-resets", none, () => ({ email: "someone@kestrel.test" })),
  ];
}

async function send(target: Target, body: string | undefined, contentType: string | null): Promise<Response> {
  const mod = (await import(/* @vite-ignore */ path.resolve(routeFileOf(target.path)))) as Record<string, (req: Request, ctx: unknown) => Promise<Response>>;
  const headers = new Headers({ Authorization: `Bearer ${target.as().token}` });
  if (contentType) headers.set("Content-Type", contentType);
  const req = new Request(`http://localhost${target.url()}`, { method: target.method, headers, body });
  return mod[target.method]!(req, params(target.params()));
}

/** The property for every answer: no 500, and errors in the API error shape. */
async function wellBehaved(res: Response, label: string): Promise<void> {
  if (res.status === 500) throw new Error(`${label}: 500 ${await res.text()}`);
  if (res.status >= 400) await expectErrorShape(res, label);
  else expect(res.status, label).toBeLessThan(400);
}

// ---- generators ----

/** JSON values, including the awkward ones: deep nesting, huge numbers, prototype keys. */
const jsonish = fc.oneof(
  { weight: 4, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
  { weight: 1, arbitrary: fc.anything({ maxDepth: 3, withNullPrototype: true, withBigInt: false }).map((v) => JSON.parse(JSON.stringify(v) ?? "null") as unknown) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(1e308, -0, 2 ** 53 + 1, "", "\u0000", "<script>alert(1)</script>", "../../etc/passwd", "a".repeat(10_000), [], {}, null) },
);

function allPaths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const out: (string | number)[][] = [prefix];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...allPaths(v, [...prefix, i])));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) out.push(...allPaths(v, [...prefix, k]));
  return out;
}

function setAt(root: unknown, at: (string | number)[], make: (old: unknown) => unknown | typeof REMOVE): unknown {
  if (at.length === 0) {
    const v = make(root);
    return v === REMOVE ? undefined : v;
  }
  const [head, ...rest] = at;
  if (Array.isArray(root)) {
    const copy = [...root];
    const v = setAt(copy[head as number], rest, make);
    if (rest.length === 0 && v === undefined) copy.splice(head as number, 1);
    else copy[head as number] = v;
    return copy;
  }
  const copy: Record<string, unknown> = { ...(root as Record<string, unknown>) };
  const v = setAt(copy[head as string], rest, make);
  if (rest.length === 0 && v === undefined) delete copy[head as string];
  else Object.defineProperty(copy, head as string, { value: v, enumerable: true, writable: true, configurable: true });
  return copy;
}
const REMOVE = Symbol("remove");

/** A valid body with one spot changed: replaced by any JSON, removed, duplicated, or given a stray (or prototype) key. */
function mutated(valid: unknown): fc.Arbitrary<unknown> {
  const paths = allPaths(valid);
  return fc.tuple(fc.nat({ max: paths.length - 1 }), fc.constantFrom("replace", "remove", "extra", "wrap"), jsonish, fc.constantFrom("__proto__", "constructor", "x", "", "title")).map(([i, how, value, extraKey]) => {
    const at = paths[i]!;
    if (how === "replace") return setAt(valid, at, () => value);
    if (how === "remove") return setAt(valid, at, () => REMOVE);
    if (how === "wrap") return setAt(valid, at, (old) => [old, old]);
    return setAt(valid, at, (old) => (old && typeof old === "object" && !Array.isArray(old) ? { ...old, [extraKey]: value } : { [extraKey]: old }));
  });
}

/** Text that is almost JSON: truncated, with stray bytes, or not JSON at all. */
const malformed = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.jsonValue({ maxDepth: 3 }).chain((v) => {
    const text = JSON.stringify(v);
    return fc.nat({ max: Math.max(0, text.length - 1) }).map((cut) => text.slice(0, cut));
  }),
  fc.constantFrom("{", "[", '{"a":', "{'a':1}", "NaN", "undefined", "\uFEFF{}", "{}{}", '{"a":1,}', "\u0000", "1".repeat(400), "[".repeat(5000)),
);

// ---- fixtures ----

beforeAll(async () => {
  folders = useTempFolders();
  w = await buildWorld();
  const p = w.people;
  draftSlug = await draftTechnique(p.senior);
  inReviewSlug = await inReviewTechnique(p.senior);
  retireSlug = await approvedTechnique(p.senior, p.lead);
  useId = (await logUse(p.artist, w.approved, { shot: w.shot, outcome: "clean", note: "" })).id;
  questionId = (await askQuestion(p.artist, w.approved, doc)).id;
  mergeTag = (await createTagRow(p.lead, { kind: "problem", name: `Boom shadow ${uniq()}`, description: "", aliases: [] })).slug;
  personId = (await createPerson("artist")).id;
  await createRequest(p.artist, { query: "Lens flare over markers", note: "" });
}, 120_000);

afterAll(() => folders?.cleanup());

describe("every JSON route's handler under arbitrary and mutated bodies", () => {
  it("covers every route that reads a JSON body", () => {
    const fuzzed = new Set(targets().map((t) => `${t.method} ${t.path}`));
    expect([...fuzzed].sort()).toEqual([...FUZZED].sort());
    // Routes whose handlers read a JSON body (`json()`), from the route table (kept in step by hand; a new JSON route belongs here).
    const jsonRoutes = ROUTE_TABLE.filter((e) => ["POST", "PUT", "PATCH", "DELETE"].includes(e.method)).map((e) => `${e.method} ${e.path}`);
    const bodyless = new Set([
      "POST /api/[...unknown]", "PUT /api/[...unknown]", "PATCH /api/[...unknown]", "DELETE /api/[...unknown]",
      "POST /api/auth/[...nextauth]", "POST /api/unsubscribe", "POST /api/stills", "POST /api/techniques/[slug]/submit",
      "POST /api/questions/[id]/resolve", "POST /api/requests/[id]/claim", "DELETE /api/tokens/[id]", "DELETE /api/uses/[id]",
      "DELETE /api/stills/pairs/[id]", "POST /api/admin/outbox/[id]/retry",
    ]);
    expect(jsonRoutes.filter((k) => !bodyless.has(k) && !fuzzed.has(k))).toEqual([]);
  });

  for (const label of FUZZED) {
    it(label, { timeout: 120_000 }, async () => {
      const tg = targets().find((t) => `${t.method} ${t.path}` === label)!;
      // The valid body itself is accepted (or refused with a 4xx for a state reason): the baseline.
      await wellBehaved(await send(tg, JSON.stringify(tg.valid()), "application/json"), `${label} valid`);
      // Every string of the valid body with a NUL in it: PostgreSQL cannot store U+0000 (found by the mutated runs).
      for (const at of allPaths(tg.valid()).filter((a) => typeof a.reduce<unknown>((v, k) => (v as Record<string, unknown>)[k], tg.valid()) === "string")) {
        const body = setAt(tg.valid(), at, (old) => `${String(old)}\u0000x`);
        await wellBehaved(await send(tg, JSON.stringify(body), "application/json"), `${label} NUL at ${at.join(".")}`);
      }
      await fc.assert(
        fc.asyncProperty(jsonish, async (body) => {
          await wellBehaved(await send(tg, JSON.stringify(body), "application/json"), `${label} arbitrary`);
        }),
        { numRuns: RUNS.arbitrary },
      );
      await fc.assert(
        fc.asyncProperty(mutated(tg.valid()), async (body) => {
          await wellBehaved(await send(tg, JSON.stringify(body), "application/json"), `${label} mutated`);
        }),
        { numRuns: RUNS.mutated },
      );
      await fc.assert(
        fc.asyncProperty(malformed, async (text) => {
          const res = await send(tg, text, "application/json");
          await wellBehaved(res, `${label} malformed`);
        }),
        { numRuns: RUNS.malformed },
      );
      // Wrong or missing content types with a valid body: refused with the shape, or read as JSON, never a 500.
      for (const type of [null, "text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "application/xml", "application/json; charset=utf-16", "image/png"]) {
        await wellBehaved(await send(tg, JSON.stringify(tg.valid()), type), `${label} as ${type}`);
      }
    });
  }
});

describe("NUL and other hostile characters in path and query parameters", () => {
  it("never answers 500 on any route (PostgreSQL refuses U+0000 in text)", { timeout: 120_000 }, async () => {
    for (const e of ROUTE_TABLE) {
      if (e.path.includes("[...nextauth]")) continue;
      const mod = (await import(/* @vite-ignore */ path.resolve(routeFileOf(e.path)))) as Record<string, (r: Request, c: unknown) => Promise<Response>>;
      const names = [...e.path.matchAll(/\[(?:\.\.\.)?(\w+)\]/g)].map((m) => m[1]!);
      const who = e.path.includes("/admin/") || e.path.includes("/people") ? w.people.admin : w.people.lead;
      for (const bad of ["a\u0000b", "%00", "../../etc/passwd", "\uFFFF\u202E", "x".repeat(5000)]) {
        const q = encodeURIComponent(bad);
        const url = `http://localhost${e.path}?q=${q}&technique=${q}&kind=show&key=${q}&scope=open&token=${q}&tag=${q}&x=${q}&y=${q}&from=1&to=1`;
        const res = await mod[e.method]!(new Request(url, { method: e.method, headers: { Authorization: `Bearer ${who.token}` } }), params(Object.fromEntries(names.map((n) => [n, bad]))));
        await wellBehaved(res, `${e.method} ${e.path} with ${JSON.stringify(bad.slice(0, 12))}`);
      }
    }
  });
});

describe("the one-click unsubscribe under hostile tokens and bodies", () => {
  it("never answers 500 and keeps the error shape", { timeout: 60_000 }, async () => {
    const { POST } = await import("@/app/api/unsubscribe/route");
    const good = createUnsubscribeToken({ userId: w.people.artist.id, kind: "all", key: "" });
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(fc.string({ maxLength: 300 }), fc.constant(good), fc.constant(`${good}x`), fc.constant(good.slice(0, -3))),
        fc.oneof(fc.string({ maxLength: 100 }), fc.constant("List-Unsubscribe=One-Click")),
        fc.constantFrom("application/x-www-form-urlencoded", "multipart/form-data; boundary=zz", "text/plain", ""),
        async (token, body, type) => {
          const headers = type ? { "Content-Type": type } : undefined;
          const res = await POST(new Request(`http://localhost/api/unsubscribe?token=${encodeURIComponent(token)}`, { method: "POST", body, headers }), params({}));
          await wellBehaved(res, "unsubscribe");
        },
      ),
      { numRuns: RUNS.mutated },
    );
  });
});
