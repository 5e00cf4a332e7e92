import { expect, test } from "@playwright/test";
import { signIn, signOut } from "./support";

test("an admin invites a quality engineer, who sets a password from the mailed link and signs in", async ({ page }) => {
  const email = `new.engineer.${Date.now()}@harrowgate.example`;
  await signIn(page, "admin");
  await page.goto("/admin/people");
  await page.getByLabel("Name").fill("Noor Halloran");
  await page.getByLabel("Email").fill(email);
  await page.getByLabel("Role").selectOption("qa");
  await page.getByLabel("Organisation").selectOption({ label: "Harrowgate Rotating Machines Lab (lab)" });
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();

  // Mail goes through the outbox and the worker's mail job: reload until it arrives.
  const message = page.locator("details", { hasText: email }).first();
  await expect(async () => {
    await page.goto("/admin/mailbox");
    await expect(message).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 30_000 });
  await message.locator("summary").click();
  const body = await message.locator("pre").innerText();
  const link = body.match(/https?:\/\/\S+\/set-password\?token=\S+/)?.[0];
  expect(link).toBeTruthy();
  await signOut(page);

  await page.goto(link!);
  await page.getByLabel("New password").fill("copper-windings-42");
  await page.getByLabel("Repeat it").fill("copper-windings-42");
  await page.getByRole("button", { name: "Save password" }).click();
  await expect(page.getByText("Password saved. Sign in with it now.")).toBeVisible();
  await page.getByLabel("Email").fill(email);
  await page.getByLabel("Password").fill("copper-windings-42");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-as")).toHaveText("Noor Halloran");

  // The link works once.
  await page.goto(link!);
  await expect(page.getByText("This link does not work")).toBeVisible();
});
