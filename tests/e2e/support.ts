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

/**
 * Registers a new unit from the upload form (first rating offered) and uploads one capture for it;
 * resolves when the upload card reads analysed. Each call should pass its own serial.
 */
export async function uploadForNewUnit(page: Page, serial: string, file: { name: string; csv: string }) {
  await page.goto("/upload");
  await page.getByLabel("Unit serial").fill(serial);
  await page.getByLabel("Rating of the new unit").selectOption({ index: 1 });
  await page.getByLabel(`Register ${serial} as a new unit`).check();
  await page.getByLabel("Shaft speed (rpm)").fill("1500");
  await page.getByLabel("Capture files").setInputFiles([{ name: file.name, mimeType: "text/csv", buffer: Buffer.from(file.csv) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  const card = page.getByTestId("upload-file");
  await expect(card.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 90_000 });
  return card;
}
