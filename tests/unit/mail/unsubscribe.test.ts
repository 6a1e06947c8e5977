import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { createUnsubscribeToken, UNSUBSCRIBE_VALID_MS, unsubscribeUrl, verifyUnsubscribeToken } from "@/lib/mail/unsubscribe";

const target = { userId: "5f0e8c1e-2f55-4a43-9a51-0d1b6b3f9e01", kind: "technique" as const, key: "clean-plate-patch" };

describe("unsubscribe tokens", () => {
  it("round-trips the target", () => {
    expect(verifyUnsubscribeToken(createUnsubscribeToken(target))).toEqual(target);
  });

  it("is URL-safe as a query value (RFC 4648 §5 base64url alphabet, from memory) ", () => {
    const token = createUnsubscribeToken(target);
    expect(token).toMatch(/^[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+$/);
    expect(new URL(unsubscribeUrl(target)).searchParams.get("token")).toMatch(/^[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+$/);
  });

  it("refuses any single changed character", () => {
    const token = createUnsubscribeToken(target);
    for (let i = 0; i < token.length; i++) {
      if (token[i] === ".") continue;
      const swapped = token.slice(0, i) + (token[i] === "A" ? "B" : "A") + token.slice(i + 1);
      // base64url's last character can carry unused bits; a swap there may decode to the same bytes.
      const same = Buffer.from(swapped.split(".")[1]!, "base64url").equals(Buffer.from(token.split(".")[1]!, "base64url")) && swapped.split(".")[0] === token.split(".")[0];
      if (same) continue;
      expect(() => verifyUnsubscribeToken(swapped), `position ${i}`).toThrow(/not valid/);
    }
  });

  it("refuses a payload re-signed without the server secret", () => {
    const payload = Buffer.from(JSON.stringify({ u: target.userId, k: "all", s: "*", e: Math.floor(Date.now() / 1000) + 3600 })).toString("base64url");
    const forged = `${payload}.${crypto.createHmac("sha256", "guessed-secret").update(payload).digest("base64url")}`;
    expect(() => verifyUnsubscribeToken(forged)).toThrow(/not valid/);
  });

  it("expires after its validity", () => {
    const issued = new Date("2031-03-01T12:00:00Z");
    const token = createUnsubscribeToken(target, issued);
    expect(verifyUnsubscribeToken(token, new Date(issued.getTime() + UNSUBSCRIBE_VALID_MS - 1000))).toEqual(target);
    expect(() => verifyUnsubscribeToken(token, new Date(issued.getTime() + UNSUBSCRIBE_VALID_MS + 1000))).toThrow(/expired/);
  });

  it("refuses garbage", () => {
    for (const bad of ["", ".", "a.b.c", "abc", "%%%.%%%"]) expect(() => verifyUnsubscribeToken(bad)).toThrow();
  });
});
