import { expect, test } from "@playwright/test";
import { makeBrokenCsv, makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { fillNewUnit, freshSerial, signIn, signOut } from "./support";

// Needs the test server and the worker that scripts/test.sh starts beside it.

test("an operator uploads two CSV files, watches both go queued → analysed, then opens a capture with its plot and verdicts", async ({ page }) => {
  test.setTimeout(120_000);
  const run = Date.now() % 1_000_000;
  await signIn(page, "operator");
  await page.goto("/upload");
  await expect(page.getByRole("complementary", { name: "Safety caution" })).toBeVisible();
  await fillNewUnit(page, freshSerial("KG45-U"));
  await page.getByLabel("Shaft speed (rpm)").fill("1500");
  await page.getByLabel("Capture files").setInputFiles([
    { name: `no-load-a-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(makeThreePhaseCsv({ variant: run })) },
    { name: `no-load-b-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(makeThreePhaseCsv({ variant: run + 1, fifth: 0.03 })) },
  ]);
  const files = page.getByTestId("upload-file");
  await expect(files).toHaveCount(2);
  // The header row was read in the browser: roles are offered for the operator to confirm.
  await expect(files.first().getByLabel("Role of V_AN (V)")).toHaveValue("van");
  await page.getByRole("button", { name: "Upload 2 files" }).click();

  for (const file of await files.all()) {
    await expect(file.getByRole("progressbar", { name: "Upload" })).toHaveAttribute("aria-valuenow", "100", { timeout: 30_000 });
    await expect(file.getByTestId("state-trail")).toHaveText(/Queued.*Analysed/, { timeout: 60_000 });
    await expect(file.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed");
  }
  await expect(page).toHaveURL(/\/upload$/);

  await files.first().getByRole("link", { name: "Open capture" }).click();
  await expect(page).toHaveURL(/\/captures\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("table", { name: "Verdicts" })).toBeVisible();
  await expect(page.getByRole("table", { name: "Verdicts" }).getByRole("row")).not.toHaveCount(1);
  await expect(page.getByTestId("overall")).toBeVisible();
  await expect(page.getByTestId("waveform-plot").locator("canvas")).toBeVisible();
  await expect(page.getByTestId("spectrum-plot").locator("canvas")).toBeVisible();
  await expect(page.getByRole("table", { name: "Channel metrics" })).toContainText("V_BN (V)");

  // The unit's rating belongs to Kestrum: Poldane's client account must not see the capture, page or data.
  const captureUrl = new URL(page.url()).pathname;
  await signOut(page);
  await signIn(page, "poldane");
  const res = await page.goto(captureUrl);
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Nothing here" })).toBeVisible();
  expect((await page.request.get(`/api${captureUrl}`)).status()).toBe(404);
  expect((await page.request.get(`/api${captureUrl}/raw`, { maxRedirects: 0 })).status()).toBe(404);
});

test("a CSV whose body turns non-numeric is uploaded, then shown rejected with the engine's located message", async ({ page }) => {
  const run = Date.now() % 1_000_000;
  await signIn(page, "operator");
  await page.goto("/upload");
  await fillNewUnit(page, freshSerial("KG45-R"));
  await page.getByLabel("Capture files").setInputFiles([{ name: `broken-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(makeBrokenCsv(run)) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  const file = page.getByTestId("upload-file");
  await expect(file.getByTestId("capture-state")).toHaveAttribute("data-state", "rejected", { timeout: 60_000 });
  await expect(file).toContainText(/Not a number: "oops" \(line 501, column "V_BN \(V\)"\)/);
});

test("a file that is not a CSV export is refused in the browser before anything is uploaded", async ({ page }) => {
  await signIn(page, "operator");
  await page.goto("/upload");
  await page.getByLabel("Capture files").setInputFiles([{ name: "scope-screenshot.png", mimeType: "image/png", buffer: Buffer.from("\x89PNG\r\n\x1a\n") }]);
  await expect(page.getByTestId("upload-file")).toContainText("Only CSV exports are accepted");
  await expect(page.getByRole("button", { name: /Upload/ })).toBeDisabled();
});
