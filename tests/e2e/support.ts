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

/** A serial no other run uses: `${prefix}${time-based digits}${suffix}`. */
export function freshSerial(prefix: string, suffix = ""): string {
  return `${prefix}${Date.now() % 1_000_000_000}${Math.floor(Math.random() * 90 + 10)}${suffix}`;
}

/** Picks the option of a select whose text contains `part` (option labels carry title and owner). */
export async function selectOptionContaining(page: Page, label: string, part: string) {
  const select = page.getByLabel(label);
  const text = await select.locator("option", { hasText: part }).first().textContent();
  await select.selectOption({ label: (text ?? "").trim() });
}

/** On /upload: a serial not on file, its rating and the confirmation that it is a new unit. */
export async function fillNewUnit(page: Page, serial: string, ratingPart = "KG-45T") {
  await page.getByLabel("Unit serial").fill(serial);
  await selectOptionContaining(page, "Rating of the new unit", ratingPart);
  await page.getByLabel(`Register ${serial} as a new unit`).check();
}

/** Registers a unit on /units/new (lab managers and operators) and returns its page's address. */
export async function registerUnit(page: Page, serial: string, ratingPart = "KG-45T"): Promise<string> {
  await page.goto("/units/new");
  await page.getByLabel("Serial number").fill(serial);
  await selectOptionContaining(page, "Rating", ratingPart);
  await page.getByLabel("This is a new unit, not one already on file").check();
  await page.getByRole("button", { name: "Register the unit" }).click();
  await expect(page).toHaveURL(/\/units\/[0-9a-f-]{36}$/);
  return new URL(page.url()).pathname;
}

/**
 * Registers a new unit from the upload form (first rating offered) and uploads one capture for it;
 * resolves when the upload card reads analysed. Each call should pass its own serial.
 */
export async function uploadForNewUnit(page: Page, serial: string, file: { name: string; csv: string }, instruments: string[] = []) {
  await page.goto("/upload");
  await page.getByLabel("Unit serial").fill(serial);
  await page.getByLabel("Rating of the new unit").selectOption({ index: 1 });
  await page.getByLabel(`Register ${serial} as a new unit`).check();
  await page.getByLabel("Shaft speed (rpm)").fill("1500");
  // Ticked on top of the bench's default set (asset tags).
  for (const tag of instruments) await page.getByRole("group", { name: "Instruments" }).getByLabel(new RegExp(`^${tag} `)).check();
  await page.getByLabel("Capture files").setInputFiles([{ name: file.name, mimeType: "text/csv", buffer: Buffer.from(file.csv) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  const card = page.getByTestId("upload-file");
  await expect(card.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 90_000 });
  return card;
}
