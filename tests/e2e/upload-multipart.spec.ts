import { expect, test } from "@playwright/test";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { fillNewUnit, freshSerial, signIn } from "./support";

test("a 40 MB capture goes from the browser to storage in parts (multipart), and the captures list follows its analysis without a reload", async ({ page }) => {
  test.setTimeout(180_000);
  const run = Date.now() % 1_000_000;
  // 1e6 rows × 3 channels: above the 32 MiB multipart threshold, below Playwright's 50 MB buffer limit.
  const csv = makeThreePhaseCsv({ sampleRateHz: 100_000, cycles: 500, variant: run });
  expect(Buffer.byteLength(csv)).toBeGreaterThan(32 * 1024 ** 2);
  await signIn(page, "operator");
  await page.goto("/upload");
  const serial = freshSerial("KG45-M");
  await fillNewUnit(page, serial);
  await page.getByLabel("Capture files").setInputFiles([{ name: `long-record-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(csv) }]);
  const file = page.getByTestId("upload-file");
  await expect(file.getByLabel("Role of V_BN (V)")).toHaveValue("vbn");
  const parts: string[] = [];
  page.on("request", (r) => { if (r.method() === "PUT" && /partNumber=/.test(r.url())) parts.push(r.url()); });
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  await expect(file.getByRole("progressbar", { name: "Upload" })).toHaveAttribute("aria-valuenow", "100", { timeout: 90_000 });
  expect(parts.length).toBeGreaterThanOrEqual(2);
  // The upload is only done once it is completed (queued): leaving earlier would abandon it.
  await expect(file.getByTestId("state-trail")).toContainText("Queued", { timeout: 60_000 });

  // Straight to the captures list while the worker is on it: the row updates by itself.
  await page.goto("/captures");
  let loads = 0;
  page.on("load", () => loads++);
  const row = page.getByRole("row").filter({ hasText: `long-record-${run}.csv` });
  const first = await row.getByTestId("capture-state").getAttribute("data-state");
  if (first !== "analysed") await expect(page.getByTestId("refreshing")).toBeAttached();
  await expect(row.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 90_000 });
  await expect(page.getByTestId("refreshing")).toHaveCount(0);
  expect(loads, "the page was reloaded").toBe(0);
  await row.getByRole("link", { name: serial }).click();
  const unitRow = page.getByRole("table", { name: "Captures" }).getByRole("row").filter({ hasText: `long-record-${run}.csv` });
  await expect(unitRow.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed");
});
