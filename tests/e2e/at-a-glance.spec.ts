import { expect, test, type Page } from "@playwright/test";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { signIn, uploadForNewUnit } from "./support";

// Needs the test server and the worker that scripts/test.sh starts beside it. Each test makes its
// own unit, so they pass in any order and twice in a row.

const PHONE = { width: 390, height: 844 };

/** The element's right edge lies inside the phone's width. */
async function expectInsideViewport(page: Page, selector: ReturnType<Page["getByTestId"]>) {
  await expect(selector).toBeVisible();
  const box = await selector.boundingBox();
  expect(box).not.toBeNull();
  expect(box!.x).toBeGreaterThanOrEqual(0);
  expect(box!.x + box!.width).toBeLessThanOrEqual(PHONE.width);
}

test("a three-phase capture shows its verdict in the upload list, the verdict first on its page and a phasor diagram", async ({ page }) => {
  test.setTimeout(240_000);
  const run = Date.now() % 1_000_000_000;
  await signIn(page, "operator");
  const card = await uploadForNewUnit(page, `KG45-AG${run}`, { name: `glance-${run}.csv`, csv: makeThreePhaseCsv({ variant: run }) });
  // The upload list says the verdict, not only that the file was analysed.
  await expect(card.getByTestId("upload-verdict")).toHaveText(/Within|Near edge|Inconclusive|Outside/);
  await card.getByRole("link", { name: "Open capture" }).click();

  const summary = page.getByTestId("verdict-summary");
  await expect(summary.getByTestId("overall-word")).toHaveText(/Within|Near edge|Inconclusive|Outside/);
  // The summary comes before the state panel and the verdict table.
  const summaryTop = (await summary.boundingBox())!.y;
  expect(summaryTop).toBeLessThan((await page.getByRole("table", { name: "Verdicts" }).boundingBox())!.y);

  const diagram = page.getByTestId("phasor-diagram");
  await expect(diagram).toBeVisible();
  await expect(diagram.locator("[data-phasor]:not([data-phasor=v2])")).toHaveCount(3);
  await expect(diagram.getByTestId("phasor-sequence")).toHaveText("A → B → C (positive)");
  const rows = diagram.getByRole("table", { name: "Fundamental phasors" }).getByRole("row");
  // The generated set is 230.94 V per phase, B lagging A by 120° (tests/fixtures/pipeline/make-capture.ts).
  await expect(rows.nth(1)).toContainText("0.0°");
  await expect(rows.nth(2)).toContainText("-120.0°");
  await expect(rows.nth(3)).toContainText("120.0°");
  await expect(rows.nth(1)).toContainText("230.9 V");
  // No figure printed past its resolution, and no "-0".
  await expect(page.getByRole("main")).not.toContainText(/\d\.\d{6,} Hz|-0(\.0+)?(?!\d)[ °%V]/);
});

test("at 390 px the menu folds away and the verdict column stays in view", async ({ page }) => {
  test.setTimeout(240_000);
  const run = Date.now() % 1_000_000_000;
  await signIn(page, "operator");
  const card = await uploadForNewUnit(page, `KG45-PH${run}`, { name: `phone-${run}.csv`, csv: makeThreePhaseCsv({ variant: run }) });
  const href = await card.getByRole("link", { name: "Open capture" }).getAttribute("href");
  await page.setViewportSize(PHONE);
  await page.goto(href ?? "/");

  const menu = page.getByTestId("main-menu");
  await expect(menu).toBeHidden();
  await expect(async () => {
    await page.getByRole("button", { name: "Menu" }).click({ timeout: 2000 });
    await expect(menu).toBeVisible({ timeout: 2000 });
  }).toPass({ timeout: 30_000 });
  await expect(menu.getByRole("link", { name: "Captures" })).toBeVisible();
  await page.getByRole("button", { name: "Close menu" }).click();
  await expect(menu).toBeHidden();

  await expectInsideViewport(page, page.getByTestId("overall-word"));
  const verdicts = page.getByRole("table", { name: "Verdicts" });
  // Scroll the table to its far side: the pinned verdict column stays in view.
  await verdicts.evaluate((table) => { (table.parentElement as HTMLElement).scrollLeft = 10_000; });
  await expectInsideViewport(page, verdicts.getByTestId("verdict-cell").first());
  await expectInsideViewport(page, page.getByTestId("phasor-diagram").locator("svg"));

  await page.goto("/captures");
  const list = page.getByRole("table", { name: "Captures" });
  await list.evaluate((table) => { (table.parentElement as HTMLElement).scrollLeft = 10_000; });
  await expectInsideViewport(page, list.getByTestId("verdict-cell").first());
});

test("retiring a unit asks for confirmation, and backing out leaves it in use", async ({ page }) => {
  test.setTimeout(90_000);
  const serial = `KG45-RT${Date.now() % 1_000_000_000}`;
  await signIn(page, "admin");
  await page.goto("/units/new");
  await page.getByLabel("Serial number").fill(serial);
  await page.getByLabel("Rating", { exact: true }).selectOption({ index: 1 });
  await page.getByLabel("This is a new unit, not one already on file").check();
  await page.getByRole("button", { name: "Register the unit" }).click();
  await expect(page.getByRole("heading", { name: `Unit ${serial}` })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("nameplate")).toContainText("Rated voltage");
  await expect(page.getByTestId("nameplate")).not.toContainText(/line-line-rms|wound-field-alternator|pm-generator/);

  await page.getByText("Edit or retire this unit").click();
  await page.getByLabel("Why retire it (e.g. registered by mistake)").fill("registered twice by mistake");
  const dialog = page.getByRole("alertdialog");
  await expect(async () => {
    await page.getByRole("button", { name: "Retire the unit" }).click({ timeout: 2000 });
    await expect(dialog).toBeVisible({ timeout: 2000 });
  }).toPass({ timeout: 30_000 });
  await expect(dialog).toContainText("Retire this unit?");
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(dialog).toHaveCount(0);
  await page.reload();
  await expect(page.getByRole("heading", { name: `Unit ${serial}` })).toBeVisible();

  await page.getByText("Edit or retire this unit").click();
  await page.getByLabel("Why retire it (e.g. registered by mistake)").fill("registered twice by mistake");
  await page.getByRole("button", { name: "Retire the unit" }).click();
  await page.getByRole("alertdialog").getByRole("button", { name: "Yes, retire it" }).click();
  await expect(page.getByRole("heading", { name: `Unit ${serial} (retired)` })).toBeVisible({ timeout: 30_000 });
});
