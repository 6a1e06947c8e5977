import type { Page } from "playwright-core";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

/*
 * Issue 13 in Chromium: writing and reviewing without losing work. The editor's dialogs keep the
 * technique form (their own form never submits the outer one).
 */

const SENIOR = "senior@kestrel.test";
const ARTIST = "artist@kestrel.test";
const LEAD = "lead@kestrel.test";
const ADMIN = "admin@kestrel.test";
const SLUG = "marker-channel-cleanup";

/** The editable body of the technique form, once Tiptap has mounted. */
async function editorBody(page: Page) {
  const toolbar = page.getByRole("toolbar", { name: "Formatting" });
  await toolbar.waitFor();
  return { toolbar, body: page.getByRole("textbox", { name: "Write-up" }) };
}

/** Marks the loaded document; a reload or a full navigation loses the mark. */
async function markDocument(page: Page): Promise<void> {
  await page.evaluate(() => ((window as unknown as { plateroomKept: boolean }).plateroomKept = true));
}
async function documentKept(page: Page): Promise<boolean> {
  return page.evaluate(() => (window as unknown as { plateroomKept?: boolean }).plateroomKept === true);
}

/** A small PNG a person might drop: a grey ramp. */
async function samplePng(): Promise<Buffer> {
  const w = 32;
  const h = 24;
  const px = Buffer.alloc(w * h * 3);
  for (let i = 0; i < w * h; i++) px.fill(((i % w) * 8) & 255, i * 3, i * 3 + 3);
  return sharp(px, { raw: { width: w, height: h, channels: 3 } }).png().toBuffer();
}

/** Types a word at the end of the body and selects it with the keyboard. */
async function typeAndSelect(page: Page, word: string): Promise<void> {
  const { body } = await editorBody(page);
  await body.click();
  await page.keyboard.press("Control+End");
  await page.keyboard.press("Enter");
  await page.keyboard.type(`Read the ${word}`);
  for (let i = 0; i < word.length; i++) await page.keyboard.press("Shift+ArrowLeft");
}

describe.skipIf(!hasChromium())("issue 13 in Chromium", () => {
  const running = useAppAndBrowser();

  describe("editor dialogs keep the form", () => {

    it("Ctrl+K on the edit page makes a link; the page does not reload and the form keeps its text", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto(`/techniques/${SLUG}/edit`);
      const { body } = await editorBody(page);
      const summary = "A summary typed before the link was added.";
      await page.getByLabel("One-line summary").fill(summary);
      await markDocument(page);

      await typeAndSelect(page, "notes");
      await page.keyboard.press("Control+k");
      const dialog = page.getByRole("dialog", { name: "Add link" });
      await dialog.waitFor();
      await dialog.getByLabel("Address").fill("/techniques/grain-restore-after-denoise");
      await page.keyboard.press("Enter");
      await dialog.waitFor({ state: "hidden" });

      expect(await isShown(body.locator('a[href="/techniques/grain-restore-after-denoise"]', { hasText: "notes" }))).toBe(true);
      expect(await documentKept(page)).toBe(true);
      expect(new URL(page.url()).pathname).toBe(`/techniques/${SLUG}/edit`);
      expect(new URL(page.url()).search).toBe("");
      expect(await page.getByLabel("One-line summary").inputValue()).toBe(summary);
      await context.close();
    });

    it("'Upload and insert' in the still dialog uploads the still into the body and keeps the form", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto(`/techniques/${SLUG}/edit`);
      const { toolbar, body } = await editorBody(page);
      const summary = "A summary typed before the still was added.";
      await page.getByLabel("One-line summary").fill(summary);
      await body.click();
      await page.keyboard.press("Control+End");
      await markDocument(page);
      const before = await body.locator("figure.still").count();

      await toolbar.getByRole("button", { name: "Add a still" }).click();
      const dialog = page.getByRole("dialog", { name: "Add a still" });
      await dialog.waitFor();
      await dialog.getByLabel("Image file").setInputFiles({ name: "ramp.png", mimeType: "image/png", buffer: await samplePng() });
      await dialog.getByLabel(/Description/).fill("A grey ramp for the test");
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      await dialog.waitFor({ state: "hidden", timeout: 30_000 });

      await expect.poll(() => body.locator("figure.still").count(), { timeout: 15_000 }).toBe(before + 1);
      expect(await body.locator('figure.still img[alt="A grey ramp for the test"]').count()).toBe(1);
      expect(await documentKept(page)).toBe(true);
      expect(new URL(page.url()).pathname).toBe(`/techniques/${SLUG}/edit`);
      expect(await page.getByLabel("One-line summary").inputValue()).toBe(summary);
      await screenshot(page, "writing-still-inserted");
      await context.close();
    });

    it("on a new technique, adding a link keeps the typed title and body", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto("/techniques/new");
      const { body } = await editorBody(page);
      const title = "Rig arm paint-out against a moving sky";
      await page.getByLabel("Title").fill(title);
      await markDocument(page);
      await typeAndSelect(page, "reference");
      await page.keyboard.press("Control+k");
      const dialog = page.getByRole("dialog", { name: "Add link" });
      await dialog.waitFor();
      await dialog.getByLabel("Address").fill("https://intranet.kestrel.test/sky");
      await dialog.getByRole("button", { name: "Apply" }).click();
      await dialog.waitFor({ state: "hidden" });

      expect(await isShown(body.locator('a[href="https://intranet.kestrel.test/sky"]', { hasText: "reference" }))).toBe(true);
      expect(await documentKept(page)).toBe(true);
      expect(new URL(page.url()).pathname).toBe("/techniques/new");
      expect(await page.getByLabel("Title").inputValue()).toBe(title);
      expect(await body.textContent()).toContain("Read the reference");
      await context.close();
    });
  });

  describe("stills while writing", () => {
    it("a new technique takes a still at once: the first still saves the draft, and the form says so", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto("/techniques/new");
      const { toolbar, body } = await editorBody(page);
      await page.getByLabel("Title").fill("Lens dust on a night exterior");
      await page.getByLabel("One-line summary").fill("Lift dust specks off a dark sky without smearing the stars.");
      await body.click();
      await page.keyboard.type("Start from the darkest frame.");
      await markDocument(page);

      const stillButton = toolbar.getByRole("button", { name: "Add a still" });
      expect(await stillButton.isDisabled()).toBe(false);
      await stillButton.click();
      const dialog = page.getByRole("dialog", { name: "Add a still" });
      await dialog.waitFor();
      expect(await dialog.textContent()).toContain("Adding a still saves this new technique as a draft first");
      await dialog.getByLabel("Image file").setInputFiles({ name: "IMG_0042.png", mimeType: "image/png", buffer: await samplePng() });
      await dialog.getByLabel(/Description/).fill("Dark sky with three dust specks");
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      await dialog.waitFor({ state: "hidden", timeout: 30_000 });

      // Saved in place: the address names the draft, nothing typed was lost, the form says what happened.
      await page.waitForURL(/\/techniques\/lens-dust-on-a-night-exterior\/edit$/);
      expect(await documentKept(page)).toBe(true);
      expect(await isShown(page.getByText("Saved as a draft so the still could be stored."))).toBe(true);
      expect(await body.locator('figure.still img[alt="Dark sky with three dust specks"]').count()).toBe(1);
      expect(await body.textContent()).toContain("Start from the darkest frame.");
      await screenshot(page, "writing-new-with-still");

      await page.keyboard.type(" Then the next one.");
      await page.getByRole("button", { name: "Save draft" }).click();
      await page.waitForURL(/\/techniques\/lens-dust-on-a-night-exterior$/, { timeout: 30_000 });
      // Lazy-loaded images below the fold have no size yet: count them rather than wait for them to show.
      await page.getByRole("heading", { name: "Lens dust on a night exterior" }).waitFor();
      expect(await page.locator('.prose-plate figure.still img[alt="Dark sky with three dust specks"]').count()).toBe(1);
      const saved = (await (await page.request.get("/api/techniques/lens-dust-on-a-night-exterior")).json()) as { latestRevision: number; status: string };
      expect(saved).toMatchObject({ latestRevision: 2, status: "draft" });
      await context.close();
    });

    it("an image dropped into the body asks for its description instead of taking the file name", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto(`/techniques/${SLUG}/edit`);
      const { body } = await editorBody(page);
      const before = await body.locator("figure.still").count();
      const png = (await samplePng()).toString("base64");
      await body.evaluate((el, data) => {
        const bytes = Uint8Array.from(atob(data), (c) => c.charCodeAt(0));
        const transfer = new DataTransfer();
        transfer.items.add(new File([bytes], "plate_v003_final-FINAL.png", { type: "image/png" }));
        const box = el.getBoundingClientRect();
        el.dispatchEvent(new DragEvent("drop", { dataTransfer: transfer, clientX: box.left + 20, clientY: box.top + 20, bubbles: true, cancelable: true }));
      }, png);

      const dialog = page.getByRole("dialog", { name: "Add a still" });
      await dialog.waitFor();
      expect(await dialog.getByText("plate_v003_final-FINAL.png").count()).toBe(1);
      const description = dialog.getByLabel(/Description/);
      expect(await description.inputValue()).toBe("");
      // Nothing is uploaded without a description.
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      expect(await isShown(dialog.getByRole("alert").filter({ hasText: "Describe the still" }))).toBe(true);
      expect(await body.locator("figure.still").count()).toBe(before);
      await screenshot(page, "writing-drop-asks-description");

      await description.fill("Blue screen plate with the marker cleaned");
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      await dialog.waitFor({ state: "hidden", timeout: 30_000 });
      await expect.poll(() => body.locator("figure.still").count(), { timeout: 15_000 }).toBe(before + 1);
      expect(await body.locator('figure.still img[alt="Blue screen plate with the marker cleaned"]').count()).toBe(1);
      expect(await body.locator('figure.still img[alt*="plate v003"]').count()).toBe(0);
      await context.close();
    });

    it("without a title, the first still says what is missing and keeps the form", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto("/techniques/new");
      const { toolbar } = await editorBody(page);
      await toolbar.getByRole("button", { name: "Add a still" }).click();
      const dialog = page.getByRole("dialog", { name: "Add a still" });
      await dialog.getByLabel("Image file").setInputFiles({ name: "a.png", mimeType: "image/png", buffer: await samplePng() });
      await dialog.getByLabel(/Description/).fill("Anything");
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      const alert = dialog.getByRole("alert");
      expect(await isShown(alert)).toBe(true);
      expect(await alert.textContent()).toMatch(/title/i);
      expect(new URL(page.url()).pathname).toBe("/techniques/new");
      await context.close();
    });
  });

  describe("technique page, lab and recipe", () => {
    it("a long page has in-page contents linking to its sections", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, ARTIST);
      await page.goto(`/techniques/${SLUG}`);
      const contents = page.getByRole("navigation", { name: "On this page" });
      expect(await isShown(contents)).toBe(true);
      const links = contents.getByRole("link");
      expect(await links.allTextContents()).toEqual(expect.arrayContaining(["Recognising the problem", "Why it works", "Steps", "Parameter guidance"]));
      await contents.getByRole("link", { name: "Parameter guidance" }).click();
      await page.waitForURL(/#s-parameter-guidance$/);
      const heading = page.locator(".prose-plate h2#s-parameter-guidance");
      expect(await heading.textContent()).toBe("Parameter guidance");
      // The section is scrolled to the top of the window.
      const top = await heading.evaluate((el) => el.getBoundingClientRect().top);
      expect(top).toBeGreaterThanOrEqual(0);
      expect(top).toBeLessThan(100);
      await context.close();
    });

    it("the lab opens on the before still of the first pair, whatever was uploaded first", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      const identity = { op: "matrix", m: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] };
      const created = await page.request.post("/api/techniques", { data: { title: "Lab start still check", summary: "Which still the lab opens on.", recipe: [identity] } });
      expect(created.status()).toBe(201);
      const { slug } = (await created.json()) as { slug: string };
      const upload = async (alt: string, role: string) => {
        const res = await page.request.post("/api/stills", { multipart: { file: { name: `${role}.png`, mimeType: "image/png", buffer: await samplePng() }, alt, technique: slug, role } });
        expect(res.status()).toBe(201);
        return ((await res.json()) as { id: string }).id;
      };
      // A reference image and the after still come first, the before still last.
      await upload("Reference: lens chart", "reference");
      const after = await upload("After the cleanup", "after");
      const before = await upload("Before the cleanup", "before");
      expect((await page.request.post("/api/stills/pairs", { data: { technique: slug, before, after } })).status()).toBe(201);

      await page.goto(`/techniques/${slug}`);
      const lab = page.getByRole("region", { name: "Still lab" });
      expect(await isShown(lab, 30_000)).toBe(true);
      expect(await lab.getByLabel("Still", { exact: true }).inputValue()).toBe(before);
      // A page without headings needs no contents.
      expect(await page.getByRole("navigation", { name: "On this page" }).count()).toBe(0);
      await context.close();
    });

    it("the grain step picks the denoised plate by thumbnail, and the page names it by its description", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, SENIOR);
      await page.goto(`/techniques/${SLUG}/edit`);
      await editorBody(page);
      const picker = page.getByRole("group", { name: /Denoised plate/ });
      expect(await isShown(picker)).toBe(true);
      expect(await page.getByText("Denoised still (id)").count()).toBe(0);
      const checked = picker.locator("label").filter({ has: page.locator("input:checked") });
      expect(await checked.getByRole("img").getAttribute("alt")).toBe("The same plate denoised, used for grain restore");
      // Picking another still by its thumbnail changes the step.
      const otherAlt = (await picker.locator("label").filter({ hasNot: page.locator("input:checked") }).first().getByRole("img").getAttribute("alt"))!;
      await picker.getByRole("img", { name: otherAlt, exact: true }).click();
      expect(await picker.locator("label").filter({ has: page.getByRole("img", { name: otherAlt, exact: true }) }).locator("input").isChecked()).toBe(true);
      await screenshot(page, "grain-step-picker");

      await page.goto(`/techniques/${SLUG}`);
      const cards = page.getByRole("region", { name: "Parameters" });
      const grainCard = cards.getByRole("listitem").filter({ hasText: "denoised plate" });
      expect(await grainCard.textContent()).toContain("The same plate denoised, used for grain restore");
      expect(await grainCard.textContent()).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}/);
      await context.close();
    });
  });

  describe("department method", () => {
    it("marking asks first, names the method it replaces, and moves the badge", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, LEAD);
      // Tag the grain technique with a second problem, which already has its own department method.
      const grain = "grain-restore-after-denoise";
      const t = (await (await page.request.get(`/api/techniques/${grain}`)).json()) as {
        title: string; summary: string; aliases: string[]; tags: { slug: string }[]; body: unknown; recipe: unknown[]; latestRevision: number;
      };
      const saved = await page.request.put(`/api/techniques/${grain}`, {
        data: { title: t.title, summary: t.summary, aliases: t.aliases, tags: [...t.tags.map((x) => x.slug), "dust-and-scratches"], body: t.body, recipe: t.recipe, baseRevision: t.latestRevision, changeNote: "Also answers dust." },
      });
      expect(saved.status()).toBe(200);
      const revision = ((await saved.json()) as { revision: number }).revision;
      expect((await page.request.post(`/api/techniques/${grain}/submit`)).status()).toBe(200);
      expect((await page.request.post(`/api/techniques/${grain}/review`, { data: { revision, decision: "approve" } })).status()).toBe(200);

      await page.goto(`/techniques/${grain}`);
      await page.getByLabel("Department method for", { exact: true }).selectOption({ label: "Dust and scratches" });
      await page.getByRole("button", { name: "Mark…" }).click();
      const dialog = page.getByRole("dialog", { name: "Replace the department method for Dust and scratches?" });
      await dialog.waitFor();
      expect(await dialog.textContent()).toContain("Dust busting with a temporal median is the department method for Dust and scratches now");
      await screenshot(page, "department-method-confirm");
      // Cancel changes nothing.
      await dialog.getByRole("button", { name: "Cancel" }).click();
      await page.goto("/problems/dust-and-scratches");
      const first = page.locator("li").filter({ hasText: "Department method" }).first();
      expect(await first.textContent()).toContain("Dust busting with a temporal median");

      await page.goto(`/techniques/${grain}`);
      await page.getByLabel("Department method for", { exact: true }).selectOption({ label: "Dust and scratches" });
      await page.getByRole("button", { name: "Mark…" }).click();
      await page.getByRole("dialog").getByRole("button", { name: "Replace" }).click();
      await page.getByRole("dialog").waitFor({ state: "hidden" });
      await page.goto("/problems/dust-and-scratches");
      expect(await page.locator("li").filter({ hasText: "Department method" }).first().textContent()).toContain("Grain restore after denoise");
      await context.close();
    });
  });

  describe("review", () => {
    it("the queue opens the diff against the approved revision, with stills as thumbnails and the pair change", async () => {
      const senior = await signIn(running.browser, running.app.baseUrl, SENIOR);
      const pairs = (await (await senior.page.request.get(`/api/stills/pairs?technique=${SLUG}`)).json()) as { items: { before: { id: string }; after: { id: string } }[] };
      expect(pairs.items.length).toBeGreaterThan(0);
      const [first] = pairs.items;
      // A pair made on the approved technique starts a draft revision.
      const made = await senior.page.request.post("/api/stills/pairs", { data: { technique: SLUG, before: first!.after.id, after: first!.before.id, caption: "Cleaned first, for comparison" } });
      expect(made.status()).toBe(201);
      const { revision } = (await made.json()) as { revision: number };

      await senior.page.goto(`/techniques/${SLUG}/edit`);
      const { toolbar, body } = await editorBody(senior.page);
      await body.click();
      await senior.page.keyboard.press("Control+End");
      await toolbar.getByRole("button", { name: "Add a still" }).click();
      const dialog = senior.page.getByRole("dialog", { name: "Add a still" });
      await dialog.getByLabel("Image file").setInputFiles({ name: "ramp.png", mimeType: "image/png", buffer: await samplePng() });
      await dialog.getByLabel(/Description/).fill("Grey ramp for the reviewer");
      await dialog.getByRole("button", { name: "Upload and insert" }).click();
      await dialog.waitFor({ state: "hidden", timeout: 30_000 });
      await senior.page.getByLabel("What changed, and why").fill("A reference ramp, and the pair the other way round.");
      await senior.page.getByRole("button", { name: "Save and submit for review" }).click();
      await senior.page.waitForURL(new RegExp(`/techniques/${SLUG}$`), { timeout: 30_000 });
      await senior.context.close();

      const { context, page } = await signIn(running.browser, running.app.baseUrl, LEAD);
      await page.goto("/review");
      await page.getByRole("link", { name: "Review the changes to Marker channel cleanup" }).click();
      await page.waitForURL(new RegExp(`/techniques/${SLUG}/review$`));
      const changes = page.getByRole("region", { name: /compared with approved revision/ });
      expect(await isShown(changes)).toBe(true);
      expect(await (await changes.getByRole("heading").first().textContent())).toContain(`Revision ${revision + 1} compared with approved revision ${revision - 1}`);
      // The new still is a thumbnail inside the added text, not "[still: …]".
      const added = changes.locator("ins").getByRole("img", { name: "Grey ramp for the reviewer" });
      expect(await isShown(added)).toBe(true);
      expect(await changes.getByText(/\[still/).count()).toBe(0);
      const pairChange = changes.getByRole("listitem").filter({ hasText: "Pair added" });
      expect(await isShown(pairChange)).toBe(true);
      expect(await pairChange.getByRole("img").count()).toBe(2);
      expect(await pairChange.textContent()).toContain("Cleaned first, for comparison");
      await screenshot(page, "review-diff");

      await page.getByRole("button", { name: `Approve revision ${revision + 1}` }).click();
      await page.getByRole("dialog").getByRole("button", { name: "Approve", exact: true }).click();
      expect(await isShown(page.getByText("Nothing of this technique is waiting for review."), 30_000)).toBe(true);
      await context.close();

      const artist = await signIn(running.browser, running.app.baseUrl, ARTIST);
      const seen = (await (await artist.page.request.get(`/api/stills/pairs?technique=${SLUG}`)).json()) as { items: { caption: string }[] };
      expect(seen.items.map((p) => p.caption)).toContain("Cleaned first, for comparison");
      await artist.context.close();
    });
  });

  describe("audit log", () => {
    it("reads as sentences with links, filters by person, action and day, and pages", async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, ADMIN);
      await page.goto("/audit");
      const entries = page.getByTestId("audit-entry");
      expect(await entries.count()).toBe(50);
      expect(await isShown(page.getByRole("navigation", { name: "Pages of the audit log" }).getByText(/^Page 1 of \d+$/))).toBe(true);
      const text = (await page.getByRole("list", { name: "Audit entries" }).textContent()) ?? "";
      // No raw JSON, no action codes, no cut-off ids.
      expect(text).not.toMatch(/[{}]|technique\.approve|"revision"|\b[0-9a-f]{8}\b/);
      await screenshot(page, "audit-log");

      await page.getByRole("link", { name: "Older →" }).click();
      await page.waitForURL(/\/audit\?page=2$/);
      expect(await entries.count()).toBeGreaterThan(0);

      // The department method change from the test above, found by person and action.
      await page.getByLabel("Person").selectOption({ label: "Ines Varrow" });
      await page.getByLabel("Action").selectOption({ label: "Chose a department method" });
      const today = new Date().toISOString().slice(0, 10);
      await page.getByLabel("From (UTC day)").fill(today);
      await page.getByLabel("To (UTC day)").fill(today);
      await page.getByRole("button", { name: "Show" }).click();
      await page.waitForURL(/action=tag\.house-method\.set/);
      // Only that person's department method choices today (the demo's own are there too).
      expect(await entries.count()).toBeGreaterThan(0);
      for (const text of await entries.allTextContents()) expect(text).toMatch(/Ines Varrow made .* the department method for /);
      const sentence = entries.filter({ hasText: "in place of Dust busting with a temporal median" });
      expect(await sentence.count()).toBe(1);
      expect(await sentence.textContent()).toContain(
        "Ines Varrow made Grain restore after denoise the department method for Dust and scratches, in place of Dust busting with a temporal median.",
      );
      expect(await sentence.getByRole("link", { name: "Dust busting with a temporal median" }).getAttribute("href")).toBe("/techniques/dust-busting-with-a-temporal-median");
      await screenshot(page, "audit-log-filtered");
      await context.close();
    });
  });

  describe("page status codes", () => {
    let draftSlug = "";

    it("missing pages and someone else's draft answer 404 with the one friendly page", async () => {
      const senior = await signIn(running.browser, running.app.baseUrl, SENIOR);
      const created = await senior.page.request.post("/api/techniques", {
        data: { title: "Unfinished notes on lens dirt", summary: "Half written.", aliases: [], tags: [], recipe: [] },
      });
      expect(created.status()).toBe(201);
      draftSlug = ((await created.json()) as { slug: string }).slug;
      // The senior sees their own draft; a missing page under edit is a 404 for them too.
      expect((await senior.page.goto(`/techniques/${draftSlug}`))?.status()).toBe(200);
      expect((await senior.page.goto("/techniques/no-such-thing/edit"))?.status()).toBe(404);
      await senior.context.close();

      const { context, page } = await signIn(running.browser, running.app.baseUrl, ARTIST);
      for (const path of ["/techniques/no-such-thing", `/techniques/${draftSlug}`, `/techniques/${draftSlug}/history`, "/problems/nope", "/shots/NOPE_000_0000", "/shows/NOPE", "/no/such/page"]) {
        const res = await page.goto(path);
        expect(res?.status(), path).toBe(404);
        expect(await isShown(page.getByRole("heading", { name: "Nothing here" })), path).toBe(true);
      }
      // Inside the app the page keeps its navigation.
      await page.goto("/problems/nope");
      expect(await isShown(page.getByRole("navigation").first())).toBe(true);
      await screenshot(page, "status-404");
      await context.close();
    });

    it("pages refused for a role answer 403 with the 'not for your role' page", async () => {
      const refused: Record<string, string[]> = {
        [ARTIST]: ["/techniques/new", "/review", "/audit", "/people", "/mail", `/techniques/${SLUG}/edit`],
        [ADMIN]: ["/techniques/new", `/techniques/${SLUG}/edit`, "/review"],
        [SENIOR]: ["/review", "/audit", "/people", "/mail"],
      };
      for (const [email, paths] of Object.entries(refused)) {
        const { context, page } = await signIn(running.browser, running.app.baseUrl, email);
        for (const path of paths) {
          const res = await page.goto(path);
          expect(res?.status(), `${email} ${path}`).toBe(403);
          expect(await isShown(page.getByRole("heading", { name: "Not for your role" })), `${email} ${path}`).toBe(true);
        }
        if (email === ARTIST) await screenshot(page, "status-403");
        await context.close();
      }
      // The same pages open for the roles they are for.
      const lead = await signIn(running.browser, running.app.baseUrl, LEAD);
      for (const path of ["/techniques/new", "/review", `/techniques/${SLUG}/edit`]) expect((await lead.page.goto(path))?.status(), path).toBe(200);
      await lead.context.close();
    });
  });
});
