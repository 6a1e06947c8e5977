import crypto from "node:crypto";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { ROUTE_TABLE, rolesPassing, routeFileOf, type RouteEntry } from "@/tests/integration/security/route-table";
import { MAX_UPLOAD_BODY_BYTES } from "@/lib/stills/upload";
import { createPerson, params, type TestPerson } from "@/tests/factories";
import { expectErrorShape } from "./world";

/*
 * Bounded request bodies (issue 19 item 5: 8–300 MB bodies used to be read and parsed in full).
 * Sources: RFC 9110 §15.5.14 (413 Content Too Large: the server refuses content larger than it is
 * willing to process, and may close the connection) and §8.6 (Content-Length); OWASP Denial of
 * Service Cheat Sheet and REST Security Cheat Sheet, "limit request size" (from memory).
 * The body here is a stream that counts what the server pulls from it, so "refused without
 * reading" is measured, not assumed.
 */

type RouteModule = Record<string, (req: Request, ctx?: unknown) => Promise<Response>>;

/** Routes that read a body, and the limit each one documents (lib/api/body-limits.ts). */
const READS_BODY: Record<string, number> = {
  "POST /api/techniques": BODY_LIMITS.document,
  "PUT /api/techniques/[slug]": BODY_LIMITS.document,
  "POST /api/techniques/[slug]/questions": BODY_LIMITS.document,
  "POST /api/questions/[id]/answers": BODY_LIMITS.document,
  "POST /api/shows/[code]/shots": BODY_LIMITS.shotList,
  "POST /api/unsubscribe": BODY_LIMITS.form,
};
for (const key of [
  "POST /api/techniques/[slug]/review", "POST /api/techniques/[slug]/retire", "POST /api/techniques/[slug]/revisions/[number]/restore",
  "POST /api/techniques/[slug]/uses", "PATCH /api/uses/[id]", "POST /api/requests", "POST /api/tags", "PATCH /api/tags/[slug]",
  "POST /api/tags/[slug]/merge", "PUT /api/tags/[slug]/house-method", "POST /api/shows", "PATCH /api/shows/[code]", "POST /api/stills/pairs",
  "POST /api/lab/run", "POST /api/lab/analyse", "POST /api/lab/sample", "POST /api/lab/solve", "POST /api/people", "PATCH /api/people/[id]",
  "POST /api/tokens", "POST /api/subscriptions", "DELETE /api/subscriptions", "PUT /api/subscriptions/mode",
]) READS_BODY[key] = BODY_LIMITS.json;

const CHUNK = 64 * 1024;
const key = (e: Pick<RouteEntry, "method" | "path">) => `${e.method} ${e.path}`;
let people: Record<"artist" | "senior" | "lead" | "admin", TestPerson>;

beforeAll(async () => {
  people = { artist: await createPerson("artist"), senior: await createPerson("senior"), lead: await createPerson("lead"), admin: await createPerson("admin") };
});

/** A body of `total` bytes of JSON-ish filler that counts how many bytes the reader pulled; nothing is made ahead of a read. */
function countingBody(total: number): { stream: ReadableStream<Uint8Array>; pulled: () => number } {
  let sent = 0;
  const chunk = new TextEncoder().encode("[" + "1,".repeat(CHUNK / 2 - 1) + "1");
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (sent >= total) return controller.close();
        const piece = chunk.subarray(0, Math.min(CHUNK, total - sent));
        sent += piece.byteLength;
        controller.enqueue(piece);
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, pulled: () => sent };
}

/** Params that pass the handlers' own checks before they read the body. */
const PARAMS = { slug: "edge-blend", id: crypto.randomUUID(), number: "1", code: "KYD" };

function callerFor(entry: RouteEntry): TestPerson | null {
  if (entry.access === "public") return null;
  return rolesPassing(entry.access).includes("lead") ? people.lead : people.admin;
}

async function send(entry: RouteEntry, body: ReadableStream<Uint8Array>, headers: Record<string, string>, as = callerFor(entry)): Promise<Response> {
  const mod = (await import(/* @vite-ignore */ path.resolve(routeFileOf(entry.path)))) as RouteModule;
  const h = new Headers({ "Content-Type": entry.path === "/api/unsubscribe" ? "application/x-www-form-urlencoded" : "application/json", ...headers });
  if (as) h.set("Authorization", `Bearer ${as.token}`);
  const req = new Request(`http://localhost${entry.path.replace(/\[(\w+)\]/g, (_, n: string) => PARAMS[n as keyof typeof PARAMS])}?token=x`, { method: entry.method, headers: h, body, duplex: "half" } as RequestInit);
  return mod[entry.method]!(req, params(PARAMS));
}

async function expectTooLarge(res: Response, label: string): Promise<void> {
  expect(res.status, label).toBe(413);
  expect((await expectErrorShape(res, label)).code, label).toBe("too_large");
}

describe("RFC 9110 §15.5.14: a body over the route's limit is 413 in the error shape", () => {
  const entries = ROUTE_TABLE.filter((e) => READS_BODY[key(e)] !== undefined);

  it("knows every route that reads a body", () => {
    expect(entries.map(key).sort()).toEqual(Object.keys(READS_BODY).sort());
  });

  for (const entry of entries) {
    it(`${key(entry)}: refused on its Content-Length without reading a byte, and while streaming at the limit`, async () => {
      const limit = READS_BODY[key(entry)]!;
      // Declared too large: refused before the handler reads anything.
      const declared = countingBody(limit + 1);
      await expectTooLarge(await send(entry, declared.stream, { "Content-Length": String(limit + 1) }), `${key(entry)} declared`);
      expect(declared.pulled(), `${key(entry)}: bytes read of a body declared too large`).toBe(0);
      // No Content-Length (chunked): counted while it streams and abandoned just past the limit.
      const streamed = countingBody(limit * 3);
      await expectTooLarge(await send(entry, streamed.stream, {}), `${key(entry)} streamed`);
      expect(streamed.pulled(), `${key(entry)}: bytes read of a streamed body`).toBeGreaterThan(limit);
      expect(streamed.pulled(), `${key(entry)}: bytes read of a streamed body`).toBeLessThanOrEqual(limit + CHUNK);
    });
  }

  it("refuses a declared oversized upload before reading it, at PLATEROOM_MAX_UPLOAD_BYTES plus the form", async () => {
    const entry = ROUTE_TABLE.find((e) => key(e) === "POST /api/stills")!;
    const body = countingBody(1024);
    await expectTooLarge(await send(entry, body.stream, { "Content-Length": String(MAX_UPLOAD_BODY_BYTES + 1), "Content-Type": "multipart/form-data; boundary=x" }), "upload");
    expect(body.pulled()).toBe(0);
  });

  it("accepts a body of exactly the limit and refuses one byte more", async () => {
    const entry = ROUTE_TABLE.find((e) => key(e) === "POST /api/tokens")!;
    const exact = (size: number) => {
      const head = '{"name":"limit probe","pad":"';
      const text = head + "x".repeat(size - head.length - 2) + '"}';
      expect(Buffer.byteLength(text)).toBe(size);
      return new Blob([text]).stream();
    };
    expect((await send(entry, exact(BODY_LIMITS.json), {}, people.senior)).status).toBe(201);
    await expectTooLarge(await send(entry, exact(BODY_LIMITS.json + 1), {}, people.senior), "limit + 1");
  });

  it("checks the role before the size: an artist's oversized technique write is 403", async () => {
    const entry = ROUTE_TABLE.find((e) => key(e) === "POST /api/techniques")!;
    const body = countingBody(BODY_LIMITS.document * 2);
    const res = await send(entry, body.stream, { "Content-Length": String(BODY_LIMITS.document * 2) }, people.artist);
    expect(res.status).toBe(403);
    expect(body.pulled()).toBe(0);
  });

  it("refuses 20 concurrent oversized bodies, reading no more than each limit of any", async () => {
    const targets = ["POST /api/lab/run", "POST /api/tokens", "POST /api/techniques", "PUT /api/subscriptions/mode"].map((k) => ROUTE_TABLE.find((e) => key(e) === k)!);
    const bodies = Array.from({ length: 20 }, (_, i) => ({ entry: targets[i % targets.length]!, body: countingBody(64 * 1024 * 1024) }));
    const answers = await Promise.all(bodies.map(({ entry, body }) => send(entry, body.stream, {})));
    for (const [i, res] of answers.entries()) await expectTooLarge(res, `body ${i}`);
    for (const { entry, body } of bodies) expect(body.pulled()).toBeLessThanOrEqual(READS_BODY[key(entry)]! + CHUNK);
  });
});
