import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "bench-demo-2026";

export const ACCOUNTS = {
  admin: { email: "maren.ilsley@harrowgate.example", name: "Maren Ilsley" },
  operator: { email: "tobiah.crane@harrowgate.example", name: "Tobiah Crane" },
  qa: { email: "ines.vardy@harrowgate.example", name: "Ines Vardy" },
  kestrum: { email: "ruan.petit@kestrum.example", name: "Ruan Petit" },
  poldane: { email: "sela.ambrose@poldane.example", name: "Sela Ambrose" },
} as const;

export async function signIn(page: Page, who: keyof typeof ACCOUNTS, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("Email").fill(ACCOUNTS[who].email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  if (password === DEMO_PASSWORD) await expect(page.getByTestId("signed-in-as")).toHaveText(ACCOUNTS[who].name);
}

export async function signOut(page: Page) {
  // The button works once React has hydrated the shell; a click before that does nothing, so retry.
  await expect(async () => {
    await page.getByRole("button", { name: "Sign out" }).click({ timeout: 2000 });
    await expect(page).toHaveURL(/\/sign-in/, { timeout: 3000 });
  }).toPass({ timeout: 30_000 });
  await expect(page.getByRole("button", { name: "Sign in" })).toBeVisible();
}
