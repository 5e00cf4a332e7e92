import { execFileSync } from "node:child_process";
import { expect, test } from "@playwright/test";
import { signIn, signOut } from "./support";

let fixture: { number: string; serial: string };

test.beforeAll(() => {
  const out = execFileSync("node_modules/.bin/tsx", ["--import", "./scripts/support/server-only-hook.mjs", "tests/e2e/portal-fixture.ts"], { encoding: "utf8" });
  fixture = JSON.parse(out.trim().split("\n").pop() as string);
});

test("a client finds the report mail in the outbox, signs in, searches by serial, downloads the PDF and a zip of a selection", async ({ page }) => {
  // The lab manager's outbox shows what the mail catcher received (the client's mail, sent by the worker).
  await signIn(page, "admin");
  const message = page.locator("details", { hasText: `Test report ${fixture.number} revision 1` }).first();
  await expect(async () => {
    await page.goto("/admin/mailbox");
    await expect(message).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 40_000 });
  await message.locator("summary").click();
  const body = await message.locator("pre").innerText();
  const link = body.match(/https?:\/\/\S+\/portal\?serial=\S+/)?.[0];
  expect(link).toBeTruthy();
  await signOut(page);

  await signIn(page, "kestrum");
  await page.goto(new URL(link!).pathname + new URL(link!).search);
  await expect(page.getByLabel("Serial")).toHaveValue(fixture.serial);
  const row = page.getByTestId(`report-${fixture.number}-rev1`);
  await expect(row).toContainText("Valid");

  const pdf = page.waitForEvent("download");
  await row.getByRole("link", { name: /PDF/ }).click();
  const pdfFile = await pdf;
  expect(pdfFile.suggestedFilename()).toMatch(new RegExp(`^${fixture.number}-rev1-.*\\.pdf$`));

  await row.getByRole("checkbox").check();
  await page.getByTestId(`report-${fixture.number}B-rev1`).getByRole("checkbox").check();
  const zip = page.waitForEvent("download");
  await page.getByRole("button", { name: "Download the selection as a zip" }).click();
  expect((await zip).suggestedFilename()).toMatch(/^reports-\d{4}-\d{2}-\d{2}\.zip$/);
});
