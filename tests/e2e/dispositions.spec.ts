import { expect, test } from "@playwright/test";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { ACCOUNTS, DEMO_PASSWORD, signIn, signOut } from "./support";

// Needs the test server and the worker that scripts/test.sh starts beside it. The unit is registered with
// its own serial in this run, so the spec passes in any order and twice in a row.

test("a quality engineer cannot plainly accept an outside unit, then accepts it with a concession, a reference and their password", async ({ page }) => {
  test.setTimeout(180_000);
  const run = Date.now() % 1_000_000_000;
  const serial = `KG45-DC${run}`;

  // An operator registers the unit and uploads a capture whose 5th harmonic (8 %) puts THD outside its band.
  await signIn(page, "operator");
  await page.goto("/upload");
  await page.getByLabel("Unit serial").fill(serial);
  const rating = page.getByLabel("Rating of the new unit");
  const kg45 = await rating.locator("option", { hasText: "KG-45T" }).first().getAttribute("value");
  await rating.selectOption(kg45 ?? { index: 1 });
  await page.getByLabel(`Register ${serial} as a new unit`).check();
  await page.getByLabel("Shaft speed (rpm)").fill("1500");
  await page.getByLabel("Capture files").setInputFiles([{ name: `outside-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(makeThreePhaseCsv({ variant: run, fifth: 0.08 })) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  await expect(page.getByTestId("upload-file").getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 90_000 });
  await signOut(page);

  await signIn(page, "qa");
  // The review queue names what is outside, with measured value and limit; the engineer takes the unit.
  await expect(async () => {
    await page.goto("/review");
    await expect(page.getByTestId("queue-row").filter({ hasText: serial })).toContainText("THD", { timeout: 1000 });
  }).toPass({ timeout: 60_000 });
  await page.waitForLoadState("networkidle");
  const row = page.getByTestId("queue-row").filter({ hasText: serial });
  await expect(row).toContainText(/THD.*outside, measured .*limit at most/);
  await row.getByLabel(`Select ${serial}`).check();
  await page.getByRole("button", { name: "Take the ticked units" }).click();
  await expect(page.getByText("You took 1 unit.")).toBeVisible();
  await expect(page.getByTestId("queue-row").filter({ hasText: serial })).toContainText("Assigned to you");

  await page.goto(`/units?q=${serial}`);
  await expect(page.getByRole("row", { name: new RegExp(serial) }).getByText("Outside")).toBeVisible({ timeout: 30_000 });
  await page.getByRole("link", { name: serial }).click();
  await expect(page.getByRole("heading", { name: `Unit ${serial}` })).toBeVisible();

  // Interact once React has hydrated the form (a click before that posts the form without the page's script).
  await page.waitForLoadState("networkidle");
  const panel = page.getByRole("form", { name: "Disposition" });
  await panel.getByLabel("New disposition").selectOption("accepted");
  await panel.getByLabel("Reason for the record").fill("Customer wants it shipped");
  await panel.getByRole("button", { name: "Record disposition" }).click();
  await expect(panel.getByText(/Plain acceptance is refused: .*latest verdict is outside tolerance/).first()).toBeVisible();
  await expect(page.getByTestId("unit-disposition")).toHaveText("open (no decision)");

  await page.waitForLoadState("networkidle");
  await panel.getByLabel("New disposition").selectOption("accepted-with-concession");
  await panel.getByLabel("Reason for the record").fill("THD 8 % accepted by the client for bench use only");
  await panel.getByLabel("Client's concession reference").fill(`KC-${run}`);
  await panel.getByLabel("Your password, to sign").fill(DEMO_PASSWORD);
  await panel.getByRole("button", { name: "Sign and record" }).click();
  await expect(panel.getByText("Disposition recorded: accepted with concession, signed.")).toBeVisible();
  await expect(page.getByTestId("unit-disposition")).toHaveText("accepted with concession");
  const history = page.getByTestId("unit-history");
  await expect(history).toContainText(`${ACCOUNTS.qa.name} changed the disposition from open (no decision) to accepted with concession`);
  await expect(history).toContainText(`Concession reference: KC-${run}`);
  await expect(history.getByTestId("signature").first()).toContainText(`Signed by ${ACCOUNTS.qa.name}, Quality engineer`);
  await expect(history.getByTestId("signature").first()).toContainText("accepted the unit under the client's concession");
});
