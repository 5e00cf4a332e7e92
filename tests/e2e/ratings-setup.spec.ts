import { expect, test } from "@playwright/test";
import { addClient, addPlanStep, createRating, setVoltageBand } from "./lab-setup";
import { signIn } from "./support";

// Makes its own client name and model code, so it passes in any order and twice in a row.
const tag = `${Date.now().toString(36)}`;
const clientName = `Fenwray Dynamics ${tag}`;
const modelCode = `FW-${tag}`.toUpperCase();

test("a lab manager creates a client, a rating from a preset, tightens a band and defines a three-step plan", async ({ page }) => {
  await signIn(page, "admin");
  await addClient(page, { name: clientName, reference: `REF-${tag}`, email: "test-office@fenwray.example" });
  await page.getByRole("link", { name: "Ratings" }).click();
  await page.getByRole("link", { name: "New rating" }).click();
  await createRating(page, { clientName, modelCode, title: "45 kVA test alternator" });
  await expect(page.getByRole("heading", { name: `${modelCode} — 45 kVA test alternator` })).toBeVisible();
  await expect(page.getByText("400 V, line-to-line, RMS")).toBeVisible();
  await expect(page.getByRole("table", { name: "Profile in force" })).toContainText("−5 % to +5 % of rated voltage");

  await setVoltageBand(page, "-3", "3", `Client ${tag} asks for ±3 %`);
  await expect(page.getByRole("heading", { name: /version 2 in force/ })).toBeVisible();
  const history = page.getByRole("list", { name: "Profile versions" });
  await expect(history).toContainText(`Why: Client ${tag} asks for ±3 %`);
  await expect(history).toContainText("Voltage: −5 % to +5 % of rated voltage → −3 % to +3 % of rated voltage");

  const steps = [
    { name: "Open circuit at rated speed", kind: "no-load", speed: "1500" },
    { name: "Open circuit at 110 % speed", kind: "no-load", speed: "1650" },
    { name: "Rated load", kind: "load", speed: "1500" },
  ];
  for (const step of steps) await addPlanStep(page, step);
  const plan = page.getByRole("region", { name: "Test plan" });
  await expect(plan.getByRole("listitem").filter({ hasText: /^\d\. / })).toHaveCount(3);
  await expect(plan).toContainText("1617 rpm to 1683 rpm");
});
