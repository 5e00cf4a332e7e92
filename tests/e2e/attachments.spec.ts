import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { makePng } from "../fixtures/attachments/make-png";
import { freshSerial, registerUnit, signIn, signOut } from "./support";

// A Kestrum unit of this run's own (registered by the operator first).
const SERIAL = freshSerial("KG60-T");
const run = Date.now() % 100_000;
const NAME = `nameplate-${run}.png`;
const png = makePng(run % 250);

async function openUnit(page: Page) {
  await page.goto(`/units?q=${SERIAL}`);
  await page.getByRole("link", { name: SERIAL }).click();
  await expect(page.getByRole("heading", { name: `Unit ${SERIAL}` })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Attachments" })).toBeVisible();
}

const attached = (page: Page) => page.getByRole("list", { name: "Attached files" }).getByRole("listitem", { name: NAME });

test("an operator attaches a PNG, a client of the unit's organisation reads it, another cannot, and QA's removal is in the unit history", async ({ page }) => {
  test.setTimeout(180_000);
  await signIn(page, "operator");
  await registerUnit(page, SERIAL, "KG-60T6");
  await openUnit(page);
  const form = page.getByRole("form", { name: "Attach files" });
  const input = form.getByLabel("Files", { exact: true });
  // The input is enabled once React has hydrated the form; files chosen before that would be lost.
  await expect(input).toBeEnabled();

  await input.setInputFiles({ name: "bench-notes.txt", mimeType: "text/plain", buffer: Buffer.from("not an image") });
  await expect(form.getByText("“bench-notes.txt” is not a PNG, JPEG, WebP or PDF file: only those can be attached.")).toBeVisible();
  await expect(form.getByRole("button", { name: "Attach files" })).toBeDisabled();

  await input.setInputFiles({ name: NAME, mimeType: "image/png", buffer: png });
  await form.getByLabel("Kind").selectOption("nameplate");
  await form.getByLabel("Caption").fill("Frame plate, drive end");
  await form.getByRole("button", { name: "Attach files" }).click();
  await expect(form.getByText(`Attached “${NAME}”.`)).toBeVisible();
  await expect(attached(page)).toBeVisible();
  await expect(attached(page).getByText(/Nameplate photo · .* · Tobiah Crane/)).toBeVisible();
  await expect(attached(page).getByText("Frame plate, drive end")).toBeVisible();

  const downloading = page.waitForEvent("download");
  await attached(page).getByRole("link", { name: `Download ${NAME}` }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toBe(NAME);
  expect(readFileSync(await download.path()).equals(png)).toBe(true);
  const href = (await attached(page).getByRole("link", { name: `Download ${NAME}` }).getAttribute("href")) ?? "";
  expect(href).toMatch(/^\/api\/attachments\/[0-9a-f-]{36}$/);
  const thumb = await page.request.get(`${href}?disposition=inline`);
  expect(thumb.headers()["content-type"]).toBe("image/png");
  // The route's own sandbox policy arrives whole: the site's frame policy would replace it (common practice: a
  // served upload never runs script in the app's origin).
  expect(thumb.headers()["content-security-policy"]).toMatch(/^sandbox; default-src 'none';/);
  await expect(page.getByRole("button", { name: `Remove ${NAME}` })).toHaveCount(0);
  await signOut(page);

  await signIn(page, "kestrum");
  await openUnit(page);
  await expect(attached(page)).toBeVisible();
  await expect(page.getByRole("form", { name: "Attach files" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: `Remove ${NAME}` })).toHaveCount(0);
  const asClient = await page.request.get(href);
  expect(asClient.status()).toBe(200);
  expect(Buffer.from(await asClient.body()).equals(png)).toBe(true);
  const unitPath = new URL(page.url()).pathname;
  await signOut(page);

  await signIn(page, "poldane");
  expect((await page.request.get(href)).status()).toBe(404);
  expect((await page.request.get(unitPath)).status()).toBe(404);
  await signOut(page);

  await signIn(page, "qa");
  await openUnit(page);
  const remove = attached(page).getByRole("button", { name: `Remove ${NAME}` });
  await expect(remove).toBeEnabled();
  await remove.click();
  await attached(page).getByRole("button", { name: `Remove “${NAME}”` }).click();
  await expect(attached(page)).toHaveCount(0);
  const removal = page.getByRole("listitem").filter({ hasText: `Removed attachment “${NAME}”` });
  await expect(removal).toContainText("Ines Vardy removed an attachment");
  await expect(removal).not.toContainText("changed the disposition");
  await expect(page.getByText(`Removed attachment “${NAME}” (nameplate, ${png.length} bytes): Frame plate, drive end`)).toBeVisible();
  expect((await page.request.get(href)).status()).toBe(404);
});
