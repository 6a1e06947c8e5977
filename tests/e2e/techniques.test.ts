import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

/*
 * The technique life cycle as each role meets it in Chromium (issue 3): a senior writes with the
 * toolbar, a lead approves, an artist reads from the problem page and keeps seeing the approved
 * text while an edit waits; two people saving the same revision get a conflict, not an overwrite.
 */

const SENIOR = "senior@kestrel.test";
const LEAD = "lead@kestrel.test";
const ARTIST = "artist@kestrel.test";

const TITLE = "Sky patch over a safety wire";
const SUMMARY = "Hide a thin safety wire against open sky with a tracked clean-plate patch.";
const NEW_SUMMARY = "Hide a thin safety wire against open sky with a tracked patch and matched grain.";
const PROBLEM = { slug: "wire-or-rig", name: "Wire or rig" };

/** The editable body of the technique form (role textbox, labelled "Write-up"), once Tiptap has mounted. */
async function editorBody(page: Page) {
  const toolbar = page.getByRole("toolbar", { name: "Formatting" });
  await toolbar.waitFor();
  return { toolbar, body: page.getByRole("textbox", { name: "Write-up" }) };
}

/** Clicks a button and waits for the page it leads to (client-side navigation). */
async function saveAndLand(page: Page, button: string, path: RegExp): Promise<void> {
  await page.getByRole("button", { name: button }).click();
  await page.waitForURL(path, { timeout: 30_000 });
}

/** A lead approves the waiting revision from the technique page: "Approve revision N", then the dialog's "Approve". */
async function approve(page: Page, slug: string, revision: number): Promise<void> {
  await page.goto(`/techniques/${slug}`);
  await page.getByRole("button", { name: `Approve revision ${revision}` }).click();
  const dialog = page.getByRole("dialog");
  await dialog.waitFor();
  await dialog.getByRole("button", { name: "Approve", exact: true }).click();
  // The page refreshes: the review controls for this revision go away.
  await page.getByRole("button", { name: `Approve revision ${revision}` }).waitFor({ state: "detached", timeout: 30_000 });
}

describe.skipIf(!hasChromium())("technique pages in Chromium", () => {
  const running = useAppAndBrowser();
  let slug = "";

  it("a senior writes a technique with a table and a callout, tags it, saves and submits it", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
    await page.goto("/techniques/new");
    await page.getByLabel("Title").fill(TITLE);
    await page.getByLabel("One-line summary").fill(SUMMARY);
    await page.getByLabel("Other phrasings").fill("wire paint-out, sky wire");
    const chip = page.getByRole("button", { name: PROBLEM.name, exact: true });
    await chip.click();
    expect(await chip.getAttribute("aria-pressed")).toBe("true");

    const { toolbar, body } = await editorBody(page);
    await body.click();
    await page.keyboard.type("Check the wire is thinner than the grain pattern before patching.");
    await page.keyboard.press("Enter");
    await page.keyboard.type("Soft cloud edges hide the patch seam.");
    // Wraps the current paragraph in a "works when" callout.
    await toolbar.getByRole("button", { name: "Works when note" }).click();
    expect(await isShown(body.locator("aside.callout-works"))).toBe(true);

    // Back to the first paragraph, then a table after it.
    await page.keyboard.press("ArrowUp");
    await page.keyboard.press("End");
    await toolbar.getByRole("button", { name: "Insert table" }).click();
    expect(await isShown(body.locator("table"))).toBe(true);
    for (const [i, cell] of ["Setting", "Value", "Why", "Patch feather", "2 px", "Hides the seam"].entries()) {
      if (i > 0) await page.keyboard.press("Tab");
      await page.keyboard.type(cell);
    }
    expect(await isShown(body.locator("td", { hasText: "Hides the seam" }))).toBe(true);
    await screenshot(page, "technique-write");

    await saveAndLand(page, "Save draft", /\/techniques\/(?!new)[^/]+$/);
    slug = new URL(page.url()).pathname.split("/").pop()!;
    expect(await isShown(page.getByRole("heading", { name: TITLE }))).toBe(true);
    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.getByRole("button", { name: "Submit for review" }).waitFor({ state: "detached", timeout: 30_000 });
    expect(await page.getByRole("alert").filter({ hasText: /fail|could not/i }).count()).toBe(0);
    await screenshot(page, "technique-submitted");
    await context.close();
  });

  it("the artist does not see the unapproved technique on the problem page", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await page.goto(`/problems/${PROBLEM.slug}`);
    await page.getByRole("heading", { name: PROBLEM.name, level: 1 }).waitFor();
    expect(await page.getByRole("link", { name: TITLE }).count()).toBe(0);
    const res = await page.request.get(`/api/techniques/${slug}`);
    expect(res.status()).toBe(404);
    await context.close();
  });

  it("a lead finds it in the review queue and approves it", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, LEAD);
    await page.goto("/review");
    const link = page.getByRole("link", { name: TITLE, exact: true });
    expect(await isShown(link)).toBe(true);
    await link.click();
    // The queue opens the review: a new technique compares with nothing, so its text shows as added.
    await page.waitForURL(new RegExp(`/techniques/${slug}/review$`));
    expect(await isShown(page.getByRole("heading", { name: /compared with nothing/ }))).toBe(true);
    expect(await isShown(page.locator("ins", { hasText: "Check the wire is thinner" }))).toBe(true);
    await approve(page, slug, 1);
    const res = await page.request.get(`/api/techniques/${slug}`);
    expect(((await res.json()) as { status: string; approvedRevision: number }).status).toBe("approved");
    await screenshot(page, "technique-approved");
    await context.close();
  });

  it("an artist finds it from the problem page and reads the table and the callout", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await page.goto(`/problems/${PROBLEM.slug}`);
    const link = page.getByRole("link", { name: TITLE });
    expect(await isShown(link)).toBe(true);
    await link.click();
    await page.waitForURL(new RegExp(`/techniques/${slug}$`));
    const rendered = page.locator(".prose-plate");
    expect(await isShown(rendered.locator("table th", { hasText: "Setting" }))).toBe(true);
    expect(await isShown(rendered.locator("table td", { hasText: "Hides the seam" }))).toBe(true);
    // The table's third row was left empty: it keeps a line's height rather than collapsing.
    const rows = rendered.locator("table tr");
    expect(await rows.count()).toBe(3);
    const [filled, empty] = [(await rows.nth(1).boundingBox())!, (await rows.nth(2).boundingBox())!];
    expect(empty.height).toBeGreaterThanOrEqual(filled.height - 2);
    const callout = rendered.locator("aside.callout-works");
    expect(await isShown(callout.getByText("Works when", { exact: true }))).toBe(true);
    expect(await isShown(callout.getByText("Soft cloud edges hide the patch seam."))).toBe(true);
    expect(await isShown(page.getByText(SUMMARY, { exact: true }))).toBe(true);
    // Artists only read: no edit or review controls.
    expect(await page.getByRole("link", { name: "Edit", exact: true }).count()).toBe(0);
    await screenshot(page, "technique-artist-reads");
    await context.close();
  });

  it("an edit waits for the lead: the artist keeps the approved text until it is approved", async () => {
    const senior = await signIn(running.browser, running.app.baseUrl, SENIOR);
    await senior.page.goto(`/techniques/${slug}/edit`);
    await editorBody(senior.page);
    await senior.page.getByLabel("One-line summary").fill(NEW_SUMMARY);
    await senior.page.getByLabel("What changed, and why").fill("Grain matching belongs in the summary.");
    await saveAndLand(senior.page, "Save and submit for review", new RegExp(`/techniques/${slug}$`));
    // The senior sees the pending revision with a banner.
    expect(await isShown(senior.page.getByTestId("pending-banner"))).toBe(true);
    expect(await isShown(senior.page.getByText(NEW_SUMMARY, { exact: true }))).toBe(true);
    await screenshot(senior.page, "technique-pending-senior");
    await senior.context.close();

    const artist = await signIn(running.browser, running.app.baseUrl, ARTIST);
    await artist.page.goto(`/techniques/${slug}`);
    expect(await isShown(artist.page.getByText(SUMMARY, { exact: true }))).toBe(true);
    expect(await artist.page.getByText(NEW_SUMMARY).count()).toBe(0);
    // The problem page's list shows the approved summary too.
    await artist.page.goto(`/problems/${PROBLEM.slug}`);
    expect(await isShown(artist.page.getByText(SUMMARY, { exact: true }))).toBe(true);
    expect(await artist.page.getByText(NEW_SUMMARY).count()).toBe(0);
    await artist.page.goto(`/techniques/${slug}`);

    const lead = await signIn(running.browser, running.app.baseUrl, LEAD);
    await approve(lead.page, slug, 2);
    await lead.context.close();

    await artist.page.reload();
    expect(await isShown(artist.page.getByText(NEW_SUMMARY, { exact: true }))).toBe(true);
    expect(await artist.page.getByText(SUMMARY, { exact: true }).count()).toBe(0);
    await artist.context.close();
  });

  it("a stale save shows who saved first and keeps the second person's text", async () => {
    const senior = await signIn(running.browser, running.app.baseUrl, SENIOR);
    const lead = await signIn(running.browser, running.app.baseUrl, LEAD);
    for (const { page } of [senior, lead]) {
      await page.goto(`/techniques/${slug}/edit`);
      await editorBody(page);
    }
    await senior.page.getByLabel("One-line summary").fill("Senior's wording of the summary.");
    await senior.page.getByLabel("What changed, and why").fill("Senior tidies the summary.");
    await saveAndLand(senior.page, "Save draft", new RegExp(`/techniques/${slug}$`));

    const leadSummary = "Lead's wording, written at the same time.";
    const leadNote = "Lead tightens the summary.";
    await lead.page.getByLabel("One-line summary").fill(leadSummary);
    await lead.page.getByLabel("What changed, and why").fill(leadNote);
    const { body } = await editorBody(lead.page);
    await body.click();
    await lead.page.keyboard.press("Control+End");
    await lead.page.keyboard.press("Enter");
    await lead.page.keyboard.type("A line only the lead wrote.");
    await lead.page.getByRole("button", { name: "Save draft" }).click();

    const alert = lead.page.getByRole("alert").filter({ hasText: "Someone else saved first" });
    expect(await isShown(alert, 30_000)).toBe(true);
    // The 409 names who saved and which revision (issue 3: "says who saved what and when"); the
    // senior is Joel Brackwell in scripts/seed/data/people.ts.
    const said = (await alert.textContent()) ?? "";
    expect(said).toContain("Joel Brackwell saved revision 3");
    // Said in words a person reads, not a raw ISO 8601 stamp.
    expect(said).not.toMatch(/\d{4}-\d\d-\d\dT\d\d:/);
    const compare = alert.getByRole("link", { name: /Compare their revision 3/ });
    expect(await compare.getAttribute("href")).toBe(`/techniques/${slug}/history?from=2&to=3`);
    // Nothing lost: the lead is still on the form with their own text.
    expect(new URL(lead.page.url()).pathname).toBe(`/techniques/${slug}/edit`);
    expect(await lead.page.getByLabel("One-line summary").inputValue()).toBe(leadSummary);
    expect(await lead.page.getByLabel("What changed, and why").inputValue()).toBe(leadNote);
    expect(await isShown(body.getByText("A line only the lead wrote."))).toBe(true);
    await screenshot(lead.page, "technique-conflict");

    // The server holds the senior's save, untouched by the refused one.
    const held = await lead.page.request.get(`/api/techniques/${slug}`);
    expect(((await held.json()) as { summary: string; latestRevision: number })).toMatchObject({ summary: "Senior's wording of the summary.", latestRevision: 3 });

    // Re-applying on top of the senior's revision saves the lead's text as the next revision.
    await lead.page.getByRole("button", { name: "Re-apply my changes on top" }).click();
    await saveAndLand(lead.page, "Save draft", new RegExp(`/techniques/${slug}$`));
    const after = await lead.page.request.get(`/api/techniques/${slug}`);
    const saved = (await after.json()) as { summary: string; latestRevision: number; revision: { changeNote: string }; body: unknown };
    expect(saved).toMatchObject({ summary: leadSummary, latestRevision: 4, revision: { changeNote: leadNote } });
    expect(JSON.stringify(saved.body)).toContain("A line only the lead wrote.");
    await senior.context.close();
    await lead.context.close();
  });
});
