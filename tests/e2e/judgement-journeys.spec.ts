import { expect, test, type Page } from "@playwright/test";
import { renderDemoCsv } from "../../scripts/demo/waveforms";
import { makeThreePhaseCsv } from "../fixtures/pipeline/make-capture";
import { addClient, addPlanStep, createRating, setVoltageBand } from "./lab-setup";
import { fillNewUnit, signIn, signOut } from "./support";

// Judgement a lab can sign, as its people use it in the browser. Needs the test server and the worker
// that scripts/test.sh starts. Every test makes its own serials (and its own client and rating where it
// edits a profile), so the specs pass in any order and twice in a row against the same database.

const run = Date.now() % 1_000_000_000;

/** Uploads one file on /upload and waits for its analysis; returns the capture page's address. */
async function uploadOne(page: Page, o: { serial: string; newRating?: string; testKind?: string; speed: string; name: string; csv: string }) {
  await page.goto("/upload");
  if (o.newRating) await fillNewUnit(page, o.serial, o.newRating);
  else await page.getByLabel("Unit serial").fill(o.serial);
  if (o.testKind) await page.getByLabel("Test").selectOption(o.testKind);
  await page.getByLabel("Shaft speed (rpm)").fill(o.speed);
  await page.getByLabel("Capture files").setInputFiles([{ name: o.name, mimeType: "text/csv", buffer: Buffer.from(o.csv) }]);
  await page.getByRole("button", { name: "Upload 1 file" }).click();
  const file = page.getByTestId("upload-file");
  await expect(file.getByTestId("capture-state")).toHaveAttribute("data-state", "analysed", { timeout: 90_000 });
  return (await file.getByRole("link", { name: "Open capture" }).getAttribute("href")) ?? "/";
}

test("an operator registers a new PM generator and uploads its three back-EMF captures: the plan reads complete and within", async ({ page }) => {
  test.setTimeout(240_000);
  const serial = `PX120-J${run}`;
  await signIn(page, "operator");
  let capture = "/";
  for (const [i, speedRpm] of [1000, 2000, 3000].entries()) {
    // PX-120: Ke 120 V/krpm line-line RMS, 8 poles, so f = 8·n/120 (DOMAIN §1); a healthy rotor.
    const csv = renderDemoCsv({
      lineVoltsRms: 0.12 * speedRpm, frequencyHz: (8 * speedRpm) / 120, phases: 3, harmonicsPercent: { 5: 1.2, 7: 0.6 },
      sampleRateHz: 20_000 * Math.max(1, speedRpm / 1000), seed: run + i,
    });
    capture = await uploadOne(page, {
      serial, newRating: i === 0 ? "PX-120" : undefined, testKind: "back-emf", speed: String(speedRpm), name: `bemf-${speedRpm}-${run}.csv`, csv,
    });
  }
  await page.goto(capture);
  await page.getByRole("link", { name: serial }).click();
  await expect(page.getByTestId("plan-state")).toHaveText("Complete and within tolerance", { timeout: 30_000 });
  const steps = page.getByTestId("plan-step");
  await expect(steps).toHaveCount(3);
  for (let i = 0; i < 3; i++) await expect(steps.nth(i)).toContainText("Passed");
  await expect(page.getByTestId("ke-fit")).toBeVisible();
});

test("a lab manager tightens the voltage band and re-judges from the rating page: the new verdict shows and the earlier one stays in history", async ({ page }) => {
  test.setTimeout(240_000);
  const tag = `${run.toString(36)}j`;
  const clientName = `Orlent Machines ${tag}`;
  const modelCode = `OR-${tag}`.toUpperCase();
  await signIn(page, "admin");
  await addClient(page, { name: clientName, reference: `ORL-${tag}`, email: "bench-office@orlent.example" });
  await page.goto("/ratings/new");
  await createRating(page, { clientName, modelCode, title: "45 kVA re-judge alternator" });
  const ratingPage = page.url();
  await addPlanStep(page, { name: "Open circuit at rated speed", kind: "no-load", speed: "1500" });

  // 3 % high: within IEC 60034-1's ±5 % (clause 7.3, zone A), outside the ±2 % the client then asks for.
  const capture = await uploadOne(page, {
    serial: `OR-J${run}`, newRating: modelCode, speed: "1500", name: `rejudge-${run}.csv`, csv: makeThreePhaseCsv({ phaseRmsV: 230.94 * 1.03, variant: run }),
  });
  await page.goto(capture);
  await expect(page.getByTestId("overall")).toContainText("Within");

  await page.goto(ratingPage);
  await setVoltageBand(page, "-2", "2", `Client ${tag} asks for ±2 %`);
  await page.getByRole("button", { name: /^Re-judge 1 capture/ }).click();
  await expect(page.getByText(/1 capture\(s\) re-judged/)).toBeVisible({ timeout: 60_000 });

  await page.goto(capture);
  await expect(page.getByTestId("overall")).toContainText("Outside", { timeout: 30_000 });
  const history = page.getByRole("heading", { name: "Analysis history" }).locator("xpath=..").getByRole("listitem");
  await expect(history).toHaveCount(2);
  await expect(history.filter({ hasText: "re-judged" })).toContainText("profile v2");
  await expect(history.filter({ hasText: /^(?!.*re-judged).*analysed/ })).toContainText("Within");
});

test("an operator corrects a forgotten probe ratio in the browser: inconclusive becomes within, the first result kept", async ({ page }) => {
  test.setTimeout(180_000);
  await signIn(page, "operator");
  // 400 V line-line written as if 100:1 probes were 1:1 (2.3094 V line-neutral).
  const capture = await uploadOne(page, {
    serial: `KG45-J${run}`, newRating: "KG-45T", speed: "1500", name: `probe-${run}.csv`, csv: makeThreePhaseCsv({ phaseRmsV: 2.3094, variant: run }),
  });
  await page.goto(capture);
  await expect(page.getByTestId("overall")).toContainText("Inconclusive");
  await expect(page.getByText(/probe ratio/i).first()).toBeVisible();
  await expect(async () => {
    await page.getByRole("button", { name: "Correct settings…" }).click({ timeout: 2000 });
    await expect(page.getByRole("form", { name: "Correct capture settings" })).toBeVisible({ timeout: 2000 });
  }).toPass({ timeout: 30_000 });
  const correction = page.getByRole("form", { name: "Correct capture settings" });
  for (const column of ["V_AN (V)", "V_BN (V)", "V_CN (V)"]) await correction.getByLabel(`Probe ratio of ${column}`).fill("100");
  await correction.getByLabel("Why").fill("100:1 probes were fitted, the scope was left at 1:1");
  await correction.getByRole("button", { name: "Save and analyse again" }).click();
  await expect(page.getByTestId("overall")).toContainText("Within", { timeout: 90_000 });
  await page.reload();
  const history = page.getByRole("heading", { name: "Analysis history" }).locator("xpath=..").getByRole("listitem");
  await expect(history).toHaveCount(2);
  await expect(history.filter({ hasText: "Inconclusive" })).toHaveCount(1);
  await signOut(page);
});
