import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

/*
 * Issue 8 in Chromium: an artist follows a technique, a senior edits it, a lead approves, the
 * admin reads the resulting message in the app's mail view (as delivered to the local fake SMTP
 * server by the app's own sender), and the artist leaves with the message's unsubscribe link.
 */

const SLUG = "marker-channel-cleanup";
const ARTIST = "artist@kestrel.test";
const SENIOR = "senior@kestrel.test";
const LEAD = "lead@kestrel.test";
const ADMIN = "admin@kestrel.test";
const NEW_SUMMARY = "Hide tracking markers by rebuilding the channel they stand out in, then regrain the patch.";
const CHANGE_NOTE = "Regraining belongs in the one-line summary; people skipped it.";
// The app's sender runs every 5 s (lib/mail/sender.ts); allow for a slow machine.
const DELIVERY_TIMEOUT_MS = 60_000;

async function followButton(page: Page) {
  const button = page.getByTestId("subscribe-button");
  await button.waitFor();
  // "…" while the current state loads; wait for a real answer.
  await expect.poll(async () => (await button.textContent())?.trim(), { timeout: 15_000 }).not.toBe("…");
  return button;
}

describe.skipIf(!hasChromium())("subscriptions and mail in Chromium", () => {
  const running = useAppAndBrowser();
  let title = "";
  let subject = "";
  let unsubscribeLink = "";

  it("an artist follows the technique; a senior edits it and a lead approves", async () => {
    const artist = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await artist.page.goto(`/techniques/${SLUG}`);
    title = ((await artist.page.getByRole("heading", { level: 1 }).first().textContent()) ?? "").trim();
    expect(title.length).toBeGreaterThan(0);
    const follow = await followButton(artist.page);
    if ((await follow.getAttribute("aria-pressed")) !== "true") await follow.click();
    await expect.poll(() => follow.getAttribute("aria-pressed"), { timeout: 15_000 }).toBe("true");
    expect((await follow.textContent())?.trim()).toBe("Following ✓");
    await artist.context.close();

    const senior = await signIn(running.browser, running.app.baseUrl, SENIOR);
    await senior.page.goto(`/techniques/${SLUG}/edit`);
    await senior.page.getByRole("toolbar", { name: "Formatting" }).waitFor();
    await senior.page.getByLabel("One-line summary").fill(NEW_SUMMARY);
    await senior.page.getByLabel("What changed, and why").fill(CHANGE_NOTE);
    await senior.page.getByRole("button", { name: "Save and submit for review" }).click();
    await senior.page.waitForURL(new RegExp(`/techniques/${SLUG}$`), { timeout: 30_000 });
    await senior.context.close();

    const lead = await signIn(running.browser, running.app.baseUrl, LEAD);
    await lead.page.goto(`/techniques/${SLUG}`);
    const approve = lead.page.getByRole("button", { name: /^Approve revision \d+$/ });
    await approve.waitFor();
    const revision = /(\d+)$/.exec((await approve.textContent()) ?? "")?.[1];
    expect(revision).toBeDefined();
    // The subject revisionApprovedMail writes (lib/mail/templates.ts); the seed may have mailed earlier revisions.
    subject = `Updated: ${title} (revision ${revision})`;
    await approve.click();
    const dialog = lead.page.getByRole("dialog");
    await dialog.waitFor();
    await dialog.getByRole("button", { name: "Approve", exact: true }).click();
    await approve.waitFor({ state: "detached", timeout: 30_000 });
    expect(await isShown(lead.page.getByText(NEW_SUMMARY, { exact: true }))).toBe(true);
    await lead.context.close();
  });

  it("the admin sees the message to the artist in the mail view, headers and both parts", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, ADMIN);
    await page.goto("/mail");
    await page.getByRole("tab", { name: "Delivered" }).click();
    expect(await page.getByRole("tab", { name: "Delivered" }).getAttribute("aria-selected")).toBe("true");

    // The panel polls the local inbox; wait for the app's sender to deliver.
    const item = page.getByTestId("inbox-item").filter({ hasText: subject }).filter({ hasText: ARTIST });
    expect(await isShown(item, DELIVERY_TIMEOUT_MS)).toBe(true);
    // Exactly one message to the artist about this approval; none to the lead who approved.
    expect(await item.count()).toBe(1);
    expect(await page.getByTestId("inbox-item").filter({ hasText: subject }).filter({ hasText: LEAD }).count()).toBe(0);
    await item.click();

    const message = page.getByTestId("inbox-message");
    await message.waitFor();
    expect(await message.getByRole("heading", { name: subject }).count()).toBe(1);
    // RFC 2369 §3.2 (from memory): List-Unsubscribe is a URL in angle brackets; RFC 8058 §3.1: with List-Unsubscribe-Post.
    const listUnsubscribe = ((await page.getByTestId("header-list-unsubscribe").locator("dd").textContent()) ?? "").trim();
    expect(listUnsubscribe).toMatch(/^<http[^>]+\/api\/unsubscribe\?token=[^>]+>$/);
    expect((await page.getByTestId("header-list-unsubscribe-post").locator("dd").textContent())?.trim()).toBe("List-Unsubscribe=One-Click");
    unsubscribeLink = listUnsubscribe.slice(1, -1);

    // The HTML part, in a sandboxed frame (no scripts, no same-origin).
    const frame = page.getByTestId("mail-html");
    expect(await frame.getAttribute("sandbox")).toBe("");
    expect(await isShown(page.frameLocator('[data-testid="mail-html"]').getByText(CHANGE_NOTE))).toBe(true);
    await screenshot(page, "mail-delivered-html");
    // The plain-text part, from the same template: the change note and the same unsubscribe link.
    await message.getByRole("button", { name: "Plain text" }).click();
    const text = page.getByTestId("mail-text");
    expect(await isShown(text)).toBe(true);
    expect(await text.textContent()).toContain(CHANGE_NOTE);
    expect(await text.textContent()).toContain(unsubscribeLink);
    await screenshot(page, "mail-delivered-text");

    // The outbox shows the same message as sent.
    await page.getByRole("tab", { name: "Outbox" }).click();
    const row = page.getByTestId("outbox-row").filter({ hasText: ARTIST }).filter({ hasText: subject });
    expect(await isShown(row)).toBe(true);
    expect(await isShown(row.getByText("Sent", { exact: true }))).toBe(true);
    await row.getByRole("button", { name: subject, exact: true }).click();
    expect(await isShown(page.getByTestId("outbox-message"))).toBe(true);
    await screenshot(page, "mail-outbox");
    await context.close();
  });

  it("the link in the message leads, signed out, to a confirmation; confirming ends the subscription", async () => {
    expect(unsubscribeLink).not.toBe("");
    // Opened where nobody is signed in: the link itself is the authority.
    const anonymous = await running.browser.newContext({ baseURL: running.app.baseUrl });
    const page = await anonymous.newPage();
    await page.goto(unsubscribeLink);
    expect(new URL(page.url()).pathname).toBe("/unsubscribe");
    expect(await isShown(page.getByText(`You will no longer get mail about`))).toBe(true);
    expect(await isShown(page.getByText(title))).toBe(true);
    await screenshot(page, "unsubscribe-confirm");

    // Opening the link did not unsubscribe anyone (link scanners fetch GETs too, RFC 8058 §1, from memory).
    const artist = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await artist.page.goto(`/techniques/${SLUG}`);
    expect(await (await followButton(artist.page)).getAttribute("aria-pressed")).toBe("true");

    await page.getByRole("button", { name: "Unsubscribe" }).click();
    const done = page.getByTestId("unsubscribe-done");
    expect(await isShown(done, 15_000)).toBe(true);
    expect(await done.textContent()).toContain("Done");
    expect(await done.textContent()).toContain(title);
    await screenshot(page, "unsubscribe-done");

    await artist.page.reload();
    const follow = await followButton(artist.page);
    expect(await follow.getAttribute("aria-pressed")).toBe("false");
    expect((await follow.textContent())?.trim()).toBe("Follow");

    // A changed token is refused with a clear message.
    const token = new URL(unsubscribeLink).searchParams.get("token")!;
    await page.goto(`/unsubscribe?token=${encodeURIComponent(token.slice(0, -3) + "xyz")}`);
    expect(await isShown(page.getByTestId("unsubscribe-invalid"))).toBe(true);
    expect(await page.getByRole("button", { name: "Unsubscribe" }).count()).toBe(0);
    await artist.context.close();
    await anonymous.close();
  });

  it("non-admins are refused the mail view and its API", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await page.goto("/mail");
    expect(await isShown(page.getByTestId("refused"))).toBe(true);
    const res = await page.request.get("/api/admin/outbox");
    expect(res.status()).toBe(403);
    expect((await res.json()).error.code).toBe("forbidden");
    await context.close();
  });
});
