import { expect, test } from "@playwright/test";
import { signIn } from "./support";

test("a lab manager creates a station key shown once, the bench API accepts it, and refuses it after revocation", async ({ page, request }) => {
  const label = `Bench PC ${Date.now() % 100_000}`;
  await signIn(page, "admin");
  await page.goto("/stations");
  await page.getByLabel("Key label").fill(label);
  await page.getByRole("button", { name: "Create station key" }).click();
  const token = (await page.getByTestId("new-station-key").textContent())?.trim() ?? "";
  expect(token).toMatch(/^emk_[0-9a-f]{12}\.[A-Za-z0-9_-]{32}$/);

  const ok = await request.get("/api/v1/units/KG45-260301", { headers: { Authorization: `Bearer ${token}` } });
  expect(ok.status()).toBe(200);
  expect((await ok.json()).serial).toBe("KG45-260301");

  await page.reload();
  await expect(page.getByText(token)).toHaveCount(0);
  const row = page.getByRole("row").filter({ hasText: label });
  // Revoking asks first; a click before React has hydrated the page does nothing, so retry.
  await expect(async () => {
    await row.getByRole("button", { name: "Revoke" }).click({ timeout: 2000 });
    await expect(row.getByRole("alertdialog")).toBeVisible({ timeout: 2000 });
  }).toPass({ timeout: 30_000 });
  await row.getByRole("button", { name: "Yes, revoke" }).click();
  await expect(row).toContainText("Revoked");
  const refused = await request.get("/api/v1/units/KG45-260301", { headers: { Authorization: `Bearer ${token}` } });
  expect(refused.status()).toBe(401);
  expect((await refused.json()).error).toMatch(/revoked/);
});
