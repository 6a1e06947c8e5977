import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn, whenHydrated } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

// The seeded demo data (scripts/seed/data) makes "Marker channel cleanup" the department's approved
// method for the "Tracking markers" problem; the journeys below are issue 6's. Our own behaviour,
// no outside source.

describe.skipIf(!hasChromium())("search in Chromium", () => {
  const running = useAppAndBrowser();

  it("an artist opens the quick finder with the shortcut, types a misspelt problem and lands on the method", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await expect(isShown(page.getByTestId("quick-finder-button"))).resolves.toBe(true);
    await whenHydrated(page);
    await page.keyboard.press("Control+k");
    const dialog = page.getByRole("dialog", { name: "Find a technique" });
    expect(await isShown(dialog)).toBe(true);
    const box = dialog.getByRole("combobox");
    await expect(box.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
    await page.keyboard.type("trakcing markrs");
    const option = dialog.getByRole("option", { name: /Marker channel cleanup/ });
    expect(await isShown(option)).toBe(true);
    // The matched word of the title is marked.
    expect(await option.locator("mark").first().textContent()).toBe("Marker");
    await screenshot(page, "search-quick-finder");
    await page.keyboard.press("ArrowDown");
    await expect(option.getAttribute("aria-selected")).resolves.toBe("true");
    await page.keyboard.press("Enter");
    await page.waitForURL("**/techniques/marker-channel-cleanup", { timeout: 30_000 });
    expect(await isShown(page.getByRole("heading", { level: 1, name: "Marker channel cleanup" }))).toBe(true);

    // "/" opens it too; the search just made is remembered; Escape closes it.
    await page.locator("body").click({ position: { x: 5, y: 400 } });
    await page.keyboard.press("/");
    expect(await isShown(dialog)).toBe(true);
    expect(await isShown(dialog.getByRole("option", { name: "trakcing markrs" }))).toBe(true);
    await page.keyboard.press("Escape");
    await dialog.waitFor({ state: "hidden" });
    await context.close();
  });

  it("does not open the finder while typing in a field", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/search");
    const field = page.getByRole("searchbox", { name: "Describe the problem you see" });
    await field.click();
    await page.keyboard.type("a/b");
    await page.keyboard.press("Control+k");
    expect(await field.inputValue()).toBe("a/b");
    expect(await page.getByRole("dialog", { name: "Find a technique" }).isVisible()).toBe(false);
    await context.close();
  });

  it("the search page highlights matches, says what it searched for, and keeps the query in the address", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/search");
    await page.getByRole("searchbox", { name: "Describe the problem you see" }).fill("trakcing markrs");
    await page.getByRole("button", { name: "Search" }).click();
    await page.waitForURL((u) => u.searchParams.get("q") === "trakcing markrs");
    const first = page.getByTestId("search-result").first();
    await expect(first.getByRole("link").first().textContent()).resolves.toBe("Marker channel cleanup");
    expect(await first.locator("mark").count()).toBeGreaterThan(0);
    expect(await isShown(first.getByText(/Department method/))).toBe(true);
    expect(await isShown(page.getByTestId("search-corrected"))).toBe(true);
    expect(await isShown(page.getByTestId("search-denials"))).toBe(false);
    // A problem facet narrows the search and lands in the address.
    await page.getByRole("group", { name: "Problem" }).getByLabel(/Tracking markers/).check();
    await page.waitForURL((u) => u.searchParams.getAll("tag").includes("tracking-markers"));
    await screenshot(page, "search-page-results");
    await context.close();
  });

  it("says what it read as missing from the plate ('no tracking data')", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/search?q=" + encodeURIComponent("markers on a moving shot but no tracking data"));
    const note = page.getByTestId("search-denials");
    expect(await isShown(note)).toBe(true);
    expect(await note.textContent()).toContain("“no tracking data”");
    await context.close();
  });

  it("a search that finds only part of what was asked offers a request that seniors see on their home page", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/search?q=zebra+crossing+flicker");
    const offer = page.getByTestId("request-offer");
    expect(await isShown(offer)).toBe(true);
    // Only "flicker" matches: the partial results come first and the request, in full, after them.
    expect(await offer.textContent()).toContain("match only some of its words");
    const firstResult = await page.getByTestId("search-result").first().boundingBox();
    const offerBox = await offer.boundingBox();
    expect(firstResult && offerBox && firstResult.y < offerBox.y).toBe(true);
    expect(await offer.getByLabel("What do you need a method for?").inputValue()).toBe("zebra crossing flicker");
    await offer.getByLabel("Note (optional)").fill("SLM_040_0120: stripes strobe against the LED wall.");
    await screenshot(page, "search-request-offer");
    await offer.getByRole("button", { name: "Send the request" }).click();
    const sent = page.getByTestId("request-sent");
    expect(await isShown(sent)).toBe(true);
    expect(await sent.textContent()).toContain("Seniors will see your request on their home page");
    await context.close();

    const senior = await signIn(running.browser, running.app.baseUrl, "senior@kestrel.test");
    await senior.page.goto("/");
    const card = senior.page.locator("section", { has: senior.page.getByRole("heading", { name: "Requested write-ups" }) });
    expect(await isShown(card.getByText("“zebra crossing flicker”"))).toBe(true);
    await screenshot(senior.page, "search-request-on-senior-home");
    await senior.context.close();
  });

  it("a lead adds a thesaurus entry and an artist's search uses it at once, saying through which word", async () => {
    const lead = await signIn(running.browser, running.app.baseUrl, "lead@kestrel.test");
    await lead.page.goto("/thesaurus");
    await whenHydrated(lead.page);
    const form = lead.page.getByRole("form", { name: "New thesaurus entry" });
    await form.getByLabel("Kind").selectOption("narrower");
    await form.getByLabel("Broader term").fill("rolling shutter");
    await form.getByLabel("Narrower terms").fill("Judder, rubbery picture");
    await form.getByRole("button", { name: "Add entry" }).click();
    expect(await isShown(lead.page.getByText("Added. Search uses the new words from now on."))).toBe(true);
    // A group of one term is refused with the reason under the field.
    await form.getByLabel("Kind").selectOption("synonyms");
    await form.getByLabel("Terms that mean the same").fill("lonely");
    await form.getByRole("button", { name: "Add entry" }).click();
    expect(await isShown(lead.page.locator("#new-terms-error"))).toBe(true);
    // A stray quote in one term: the message names the term.
    await form.getByLabel("Terms that mean the same").fill('lonely", alone');
    await form.getByRole("button", { name: "Add entry" }).click();
    expect(await isShown(lead.page.getByText("“lonely\"”: quotes go around a whole term", { exact: false }))).toBe(true);
    await screenshot(lead.page, "thesaurus-lead");
    await lead.context.close();

    const artist = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await artist.page.goto("/search?q=judder");
    const first = artist.page.getByTestId("search-result").first();
    await expect(first.getByRole("link").first().textContent()).resolves.toBe("Rolling shutter skew correction");
    await expect(first.getByTestId("search-via").textContent()).resolves.toContain("“judder” found as “rolling shutter”");
    // The thesaurus is readable, not editable, for artists.
    await artist.page.goto("/thesaurus");
    expect(await isShown(artist.page.getByTestId("thesaurus-entry"))).toBe(true);
    expect(await artist.page.getByRole("form", { name: "New thesaurus entry" }).count()).toBe(0);
    await artist.context.close();
  });
});
