import { expect, test } from "@playwright/test";
import { OVERDUE_DEMO_TACHOMETER } from "../../db/seed-data";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { DEMO_PASSWORD, freshSerial, signIn, signOut, uploadForNewUnit } from "./support";

// Relies on the demo register (db/seed-data.ts), read only; the capture it confirms is its own.
test.setTimeout(180_000);
const run = `${Date.now() % 1_000_000}`;

test("a lab manager adds an instrument; a due date before the calibration date is refused beside its field", async ({ page }) => {
  await signIn(page, "admin");
  await page.goto("/admin/instruments");
  await expect(page.getByRole("table", { name: "Instrument register" }).getByText("HG-TAC-11")).toBeVisible();
  const form = page.getByRole("form", { name: "New instrument" });
  await form.getByLabel("Kind").selectOption("tachometer");
  await form.getByLabel("Make").fill("Quillon");
  await form.getByLabel("Model").fill("OT-90");
  await form.getByLabel("Serial").fill(`E2E-${run}`);
  await form.getByLabel("Asset tag").fill(`E2E-TAC-${run}`);
  await form.getByLabel("Speed-reading accuracy, ± % of reading").fill("0.02");
  await form.getByLabel("Calibration date").fill("2026-06-01");
  await form.getByLabel("Calibration due").fill("2026-05-01");
  await form.getByRole("button", { name: "Add instrument" }).click();
  await expect(page.getByText("The due date cannot be before the calibration date")).toBeVisible();
  await page.getByRole("form", { name: "New instrument" }).getByLabel("Calibration due").fill("2027-06-01");
  await page.getByRole("form", { name: "New instrument" }).getByRole("button", { name: "Add instrument" }).click();
  await expect(page.getByText(`E2E-TAC-${run} added to the register.`)).toBeVisible();
  await expect(page.getByRole("table", { name: "Instrument register" }).getByText(`E2E-TAC-${run}`)).toBeVisible();
});

test("a quality engineer reads the register but cannot change it", async ({ page }) => {
  await signIn(page, "qa");
  await page.goto("/admin/instruments");
  await expect(page.getByRole("table", { name: "Instrument register" }).getByText("HG-OSC-07")).toBeVisible();
  await expect(page.getByRole("form", { name: "New instrument" })).toHaveCount(0);
});

test("an operator is refused the instrument register (403 in place)", async ({ page }) => {
  await signIn(page, "operator");
  const response = await page.goto("/admin/instruments");
  expect(response?.status()).toBe(403);
});

test("a capture taken with an overdue tachometer warns, shows its uncertainty budget, and a quality engineer confirms it", async ({ page }) => {
  // Its own unit and capture, spun with the demo's overdue tachometer HG-TAC-11 (db/seed-data.ts):
  // the confirmation changes the capture, so a second run needs a capture of its own.
  await signIn(page, "operator");
  const card = await uploadForNewUnit(page, freshSerial("KG45-OD"), { name: `overdue-${run}.csv`, csv: makeThreePhaseCsv({ variant: Number(run) }) }, [OVERDUE_DEMO_TACHOMETER]);
  const href = await card.getByRole("link", { name: "Open capture" }).getAttribute("href");
  expect(href).toMatch(/^\/captures\//);
  await signOut(page);
  await signIn(page, "qa");
  await page.goto(href ?? "/");
  const warning = page.getByRole("alert", { name: "Overdue instrument" });
  await expect(warning).toContainText(OVERDUE_DEMO_TACHOMETER);
  // The page refreshes itself while the analysis finishes, which closes an opened budget: open it
  // again until it stays open.
  const budget = page.getByRole("table", { name: /Uncertainty budget/ }).first();
  await expect(async () => {
    if (!(await budget.isVisible())) await page.getByText("Show the budget").first().click();
    await expect(budget).toContainText("rectangular", { timeout: 2_000 });
  }).toPass({ timeout: 30_000 });
  const confirm = page.getByRole("form", { name: "Confirm overdue instrument" });
  await confirm.getByLabel("Why the capture may still be reported").fill("Speed cross-checked against the drive encoder on the day.");
  await confirm.getByLabel("Your password (signature)").fill(DEMO_PASSWORD);
  await confirm.getByRole("button", { name: "Confirm and sign" }).click();
  // The confirmation replaces the form in the warning.
  await expect(warning.getByText(/^Confirmed \d{4}-\d{2}-\d{2}: /)).toContainText("drive encoder");
  await expect(page.getByRole("form", { name: "Confirm overdue instrument" })).toHaveCount(0);
});
