import { expect, test } from "@playwright/test";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { signIn } from "./support";

// Needs the test server and the worker that scripts/test.sh starts beside it. Every run makes its
// own unit serial and its own header (column names), so it passes in any order and twice in a row.

function benchCsv(run: number, variant: number): string {
  return makeThreePhaseCsv({ variant })
    .replace("V_AN (V)", `P${run}-1 (V)`)
    .replace("V_BN (V)", `P${run}-2 (V)`)
    .replace("V_CN (V)", `P${run}-3 (V)`);
}

test("the second upload of a file with a known header from the same bench is pre-filled from the bench's import profile", async ({ page }) => {
  test.setTimeout(120_000);
  const run = Date.now() % 1_000_000_000;
  const serial = `KG45-IP${run}`;
  await signIn(page, "operator");
  await page.goto("/upload");
  await page.getByLabel("Unit serial").fill(serial);
  await page.getByLabel("Rating of the new unit").selectOption({ index: 1 });
  await page.getByLabel(`Register ${serial} as a new unit`).check();
  await page.getByLabel("Shaft speed (rpm)").fill("1500");
  const bench = await page.getByLabel("Bench").inputValue();
  expect(bench).not.toBe("");
  await page.getByLabel("Capture files").setInputFiles([{ name: `profile-a-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(benchCsv(run, run)) }]);
  const first = page.getByTestId("upload-file");
  // Unknown column names: single voltages until the operator confirms the roles.
  await expect(first.getByLabel(`Role of P${run}-1 (V)`)).toHaveValue("v");
  await expect(first.getByTestId("import-profile-note")).toHaveCount(0);
  await first.getByLabel(`Role of P${run}-1 (V)`).selectOption("van");
  await first.getByLabel(`Role of P${run}-2 (V)`).selectOption("vbn");
  await first.getByLabel(`Role of P${run}-3 (V)`).selectOption("vcn");
  await first.getByLabel(`Probe scale of P${run}-2 (V)`).fill("10");
  await first.getByLabel(`Offset of P${run}-3 (V)`).fill("-0.5");
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  await expect(first.getByTestId("capture-state")).toHaveAttribute("data-state", /queued|analysing|analysed/, { timeout: 60_000 });

  // The same header from the same bench, another file: pre-filled from the profile.
  await page.goto("/upload");
  await page.getByLabel("Unit serial").fill(serial);
  await page.getByLabel("Capture files").setInputFiles([{ name: `profile-b-${run}.csv`, mimeType: "text/csv", buffer: Buffer.from(benchCsv(run, run + 1)) }]);
  const second = page.getByTestId("upload-file");
  await expect(second.getByTestId("import-profile-note")).toBeVisible();
  await expect(second.getByLabel(`Role of P${run}-1 (V)`)).toHaveValue("van");
  await expect(second.getByLabel(`Role of P${run}-2 (V)`)).toHaveValue("vbn");
  await expect(second.getByLabel(`Role of P${run}-3 (V)`)).toHaveValue("vcn");
  await expect(second.getByLabel(`Probe scale of P${run}-2 (V)`)).toHaveValue("10");
  await expect(second.getByLabel(`Offset of P${run}-3 (V)`)).toHaveValue("-0.5");

  // The bench page lists the profile with its header.
  await page.goto("/stations");
  await expect(page.getByTestId("import-profile").filter({ hasText: `P${run}-1 (V)` })).toContainText("van");
});
