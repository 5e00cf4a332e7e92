import { expect, test } from "@playwright/test";
import { signIn } from "./support";

// Makes its own client name and model code, so it passes in any order and twice in a row.
const tag = `${Date.now().toString(36)}`;
const clientName = `Fenwray Dynamics ${tag}`;
const modelCode = `FW-${tag}`.toUpperCase();

test("a lab manager creates a client, a rating from a preset, tightens a band and defines a three-step plan", async ({ page }) => {
  await signIn(page, "admin");
  await page.goto("/admin/clients");
  const newClient = page.getByRole("form", { name: "New client" });
  await newClient.getByLabel("Client name").fill(clientName);
  await newClient.getByLabel("Their reference code").fill(`REF-${tag}`);
  await newClient.getByLabel("Contact e-mail").fill("test-office@fenwray.example");
  await newClient.getByRole("button", { name: "Add client" }).click();
  await expect(page.getByText(`${clientName} added as a client of your lab.`)).toBeVisible();

  await page.getByRole("link", { name: "Ratings" }).click();
  await page.getByRole("link", { name: "New rating" }).click();
  const form = page.getByRole("form", { name: "New rating" });
  await form.getByLabel("Client", { exact: true }).selectOption({ label: clientName });
  await form.getByLabel("Model code").fill(modelCode);
  await form.getByLabel("Title").fill("45 kVA test alternator");
  await form.getByLabel("Poles").fill("4");
  await form.getByLabel("Rated speed, rpm").fill("1500");
  await form.getByLabel("Rated frequency, Hz").fill("50");
  await form.getByLabel("Rated voltage, V").fill("400");
  await form.getByLabel("Rated apparent power, kVA").fill("45");
  await form.getByLabel("Start the tolerance profile from").selectOption("iec-60034-1");
  await form.getByRole("button", { name: "Create rating" }).click();
  await expect(page.getByText("Rating created with profile version 1.")).toBeVisible();
  await expect(page.getByRole("heading", { name: `${modelCode} — 45 kVA test alternator` })).toBeVisible();
  await expect(page.getByText("400 V, line-to-line, RMS")).toBeVisible();
  await expect(page.getByRole("table", { name: "Profile in force" })).toContainText("−5 % to +5 % of rated voltage");

  await page.getByText("Edit the profile (saves a new version)").click();
  const voltage = page.getByRole("group", { name: "Voltage", exact: true });
  await voltage.getByLabel("Lower limit, % of nominal").fill("-3");
  await voltage.getByLabel("Upper limit, % of nominal").fill("3");
  await page.getByLabel("Why the profile changes").fill(`Client ${tag} asks for ±3 %`);
  await page.getByRole("button", { name: "Save as a new version" }).click();
  await expect(page.getByText("New profile version saved.")).toBeVisible();
  await expect(page.getByRole("heading", { name: /version 2 in force/ })).toBeVisible();
  const history = page.getByRole("list", { name: "Profile versions" });
  await expect(history).toContainText(`Why: Client ${tag} asks for ±3 %`);
  await expect(history).toContainText("Voltage: −5 % to +5 % of rated voltage → −3 % to +3 % of rated voltage");

  const steps = [
    { name: "Open circuit at rated speed", kind: "no-load", speed: "1500" },
    { name: "Open circuit at 110 % speed", kind: "no-load", speed: "1650" },
    { name: "Rated load", kind: "load", speed: "1500" },
  ];
  for (const step of steps) {
    const add = page.getByRole("form", { name: "New plan step" });
    await add.getByLabel("Step name").fill(step.name);
    await add.getByLabel("Test kind").selectOption(step.kind);
    await add.getByLabel("Speed, rpm").fill(step.speed);
    await add.getByLabel("± %").fill("2");
    await add.getByRole("button", { name: "Add step" }).click();
    await expect(page.getByRole("listitem", { name: new RegExp(`: ${step.name}$`) })).toBeVisible();
  }
  const plan = page.getByRole("region", { name: "Test plan" });
  await expect(plan.getByRole("listitem").filter({ hasText: /^\d\. / })).toHaveCount(3);
  await expect(plan).toContainText("1617 rpm to 1683 rpm");
});
