import "server-only";
import crypto from "node:crypto";
import http from "node:http";
import net from "node:net";
import { env } from "@/lib/env";

/*
 * Who is calling, by network address, for the sign-in and reset limits (OWASP Authentication
 * Cheat Sheet: a client-supplied X-Forwarded-For is not evidence). Next.js keeps a client's own
 * X-Forwarded-For and writes the connection's address only when none was sent, so the
 * connection's address is recorded here, before Next.js sees the request, under a header name
 * no client can guess (random per process).
 */

const holder = globalThis as unknown as { __plateroomPeerHeader?: string };

/** Installs the recording on every HTTP server of this process (instrumentation.ts, at start). */
export function recordPeerAddresses(): void {
  if (holder.__plateroomPeerHeader) return;
  const header = `x-plateroom-peer-${crypto.randomBytes(12).toString("hex")}`;
  holder.__plateroomPeerHeader = header;
  const emit = http.Server.prototype.emit as (this: http.Server, event: string | symbol, ...args: unknown[]) => boolean;
  // Next.js creates its server before instrumentation runs; the prototype reaches it too.
  http.Server.prototype.emit = function emitWithPeer(this: http.Server, event: string | symbol, ...args: unknown[]): boolean {
    if (event === "request") {
      const req = args[0] as http.IncomingMessage;
      req.headers[header] = req.socket.remoteAddress ?? "";
    }
    return emit.call(this, event, ...args);
  } as typeof http.Server.prototype.emit;
}

/** The connection's address as recorded above, or null where nothing recorded it (tests calling handlers). */
export function peerAddress(headers: Headers): string | null {
  const header = holder.__plateroomPeerHeader;
  const value = header ? headers.get(header) : null;
  return value ? normaliseAddress(value) : null;
}

/** "::ffff:192.0.2.7" is the IPv4 address 192.0.2.7; anything that is not an address is null. */
export function normaliseAddress(value: string): string | null {
  const v = value.trim().replace(/^\[|\]$/g, "");
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(v);
  const address = mapped?.[1] ?? v;
  return net.isIP(address) ? address.toLowerCase() : null;
}

export function trustedProxyList(entries: readonly string[]): net.BlockList {
  const list = new net.BlockList();
  for (const entry of entries) {
    const [address = "", bits] = entry.split("/");
    const type = net.isIPv6(address) ? "ipv6" : "ipv4";
    if (bits === undefined) list.addAddress(address, type);
    else list.addSubnet(address, Number(bits), type);
  }
  return list;
}

function isTrusted(list: net.BlockList, address: string): boolean {
  return list.check(address, net.isIPv6(address) ? "ipv6" : "ipv4");
}

/**
 * The client's address: the connection's own, unless that is a trusted proxy; then the
 * X-Forwarded-For hops are read from the right (each proxy appends the address it saw) and the
 * first one that is not a trusted proxy is the client. Entries a client wrote itself sit left of
 * that and are never read. "unknown" only where no connection address was recorded.
 */
export function resolveClientAddress(peer: string | null, forwardedFor: string | null, trusted: net.BlockList): string {
  if (!peer) return "unknown";
  if (!isTrusted(trusted, peer)) return peer;
  let client = peer;
  const hops = (forwardedFor ?? "").split(",").map((h) => h.trim()).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = normaliseAddress(hops[i]!);
    // Not an address: a trusted proxy never writes that, so a client did; stop at the last good hop.
    if (!hop) return client;
    client = hop;
    if (!isTrusted(trusted, hop)) return hop;
  }
  return client;
}

let trustedCache: { key: string; list: net.BlockList } | null = null;

/** The client address of a request (see resolveClientAddress), with PLATEROOM_TRUSTED_PROXIES. */
export function clientAddress(headers: Headers): string {
  const key = env.PLATEROOM_TRUSTED_PROXIES.join(",");
  if (trustedCache?.key !== key) trustedCache = { key, list: trustedProxyList(env.PLATEROOM_TRUSTED_PROXIES) };
  return resolveClientAddress(peerAddress(headers), headers.get("x-forwarded-for"), trustedCache.list);
}
