import { expect, test } from "@playwright/test";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { fillNewUnit, freshSerial, signIn, signOut } from "./support";

test("a quality engineer re-runs an analysed capture; the page follows it live and the earlier run stays in history", async ({ page }) => {
  test.setTimeout(120_000);
  const run = Date.now() % 1_000_000;
  await signIn(page, "operator");
  await page.goto("/upload");
  await fillNewUnit(page, freshSerial("KG45-A"));
  await page.getByLabel("Capture files").setInputFiles([{ name: `rerun-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(makeThreePhaseCsv({ variant: run })) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  const file = page.getByTestId("upload-file");
  await expect(file.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 60_000 });
  const href = await file.getByRole("link", { name: "Open capture" }).getAttribute("href");
  await signOut(page);

  await signIn(page, "qa");
  await page.goto(href ?? "/");
  await expect(page.getByRole("heading", { name: "Analysis history" })).toHaveCount(0);
  const currentRun = page.getByTestId("current-run");
  const firstRun = await currentRun.getAttribute("datetime");
  expect(firstRun).toBeTruthy();
  // A click before React has hydrated the page does nothing: retry until the request goes out.
  await expect(async () => {
    const posted = page.waitForResponse((r) => /\/reanalyse$/.test(r.url()) && r.request().method() === "POST", { timeout: 10_000 });
    await page.getByRole("button", { name: "Re-run analysis" }).click();
    expect((await posted).ok()).toBe(true);
  }).toPass({ timeout: 40_000 });
  // The live panel picks up the new run without a reload (a small capture may be analysed before the first poll).
  await expect(currentRun).not.toHaveAttribute("datetime", firstRun ?? "", { timeout: 60_000 });
  await expect(page.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 60_000 });
  const history = page.getByRole("heading", { name: "Analysis history" }).locator("xpath=..").getByRole("listitem");
  await page.reload();
  await expect(history).toHaveCount(2);
  await expect(history.first()).toContainText("current");
});
