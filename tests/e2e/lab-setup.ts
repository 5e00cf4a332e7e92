import { expect, type Page } from "@playwright/test";

// Lab set-up steps several specs take in the browser as a lab manager: a client, a 400 V 50 Hz
// rating from the IEC 60034-1 preset, plan steps and a voltage band.

export async function addClient(page: Page, c: { name: string; reference: string; email: string }) {
  await page.goto("/admin/clients");
  const form = page.getByRole("form", { name: "New client" });
  await form.getByLabel("Client name").fill(c.name);
  await form.getByLabel("Their reference code").fill(c.reference);
  await form.getByLabel("Contact e-mail").fill(c.email);
  await form.getByRole("button", { name: "Add client" }).click();
  await expect(page.getByText(`${c.name} added as a client of your lab.`)).toBeVisible();
}

/** On /ratings/new: creates a 45 kVA, 4-pole, 1500 rpm, 400 V 50 Hz rating for the client; ends on the new rating's page. */
export async function createRating(page: Page, r: { clientName: string; modelCode: string; title: string }) {
  const form = page.getByRole("form", { name: "New rating" });
  await form.getByLabel("Client", { exact: true }).selectOption({ label: r.clientName });
  await form.getByLabel("Model code").fill(r.modelCode);
  await form.getByLabel("Title").fill(r.title);
  await form.getByLabel("Poles").fill("4");
  await form.getByLabel("Rated speed, rpm").fill("1500");
  await form.getByLabel("Rated frequency, Hz").fill("50");
  await form.getByLabel("Rated voltage, V").fill("400");
  await form.getByLabel("Rated apparent power, kVA").fill("45");
  await form.getByLabel("Start the tolerance profile from").selectOption("iec-60034-1");
  await form.getByRole("button", { name: "Create rating" }).click();
  await expect(page.getByText("Rating created with profile version 1.")).toBeVisible();
}

/** Adds a plan step on the rating page (speed window ± 2 %). */
export async function addPlanStep(page: Page, step: { name: string; kind: string; speed: string }) {
  const add = page.getByRole("form", { name: "New plan step" });
  await add.getByLabel("Step name").fill(step.name);
  await add.getByLabel("Test kind").selectOption(step.kind);
  await add.getByLabel("Speed, rpm").fill(step.speed);
  await add.getByLabel("± %").fill("2");
  await add.getByRole("button", { name: "Add step" }).click();
  await expect(page.getByRole("listitem", { name: new RegExp(`: ${step.name}$`) })).toBeVisible();
}

/** Saves a new profile version on the rating page with the voltage band at lower … upper % of nominal. */
export async function setVoltageBand(page: Page, lower: string, upper: string, why: string) {
  await page.getByText("Edit the profile (saves a new version)").click();
  const voltage = page.getByRole("group", { name: "Voltage", exact: true });
  await voltage.getByLabel("Lower limit, % of nominal").fill(lower);
  await voltage.getByLabel("Upper limit, % of nominal").fill(upper);
  await page.getByLabel("Why the profile changes").fill(why);
  await page.getByRole("button", { name: "Save as a new version" }).click();
  await expect(page.getByText("New profile version saved.")).toBeVisible();
}
