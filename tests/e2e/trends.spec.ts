import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support";

// Relies on the demo scenario's captures (the test command pushes them through the pipeline): KG-45T
// has 28 units, 27 with an open-circuit capture, one of them clipped. Other specs may add units of
// their own to KG-45T before this one runs, so counts are read off the page, never assumed.
const CLIPPED = "KG45-260309";
test.setTimeout(180_000);

const plotted = (page: Page) => page.getByTestId("trend-points").locator("tbody tr");

async function pointsOnPage(page: Page) {
  return plotted(page).evaluateAll((rows) => rows.map((r) => ({ serial: r.getAttribute("data-serial"), value: r.getAttribute("data-value"), flagged: r.getAttribute("data-flagged") })));
}

test("a quality engineer opens a model's voltage trend, filters it by date and exports the points drawn", async ({ page }) => {
  await signIn(page, "qa");
  await page.goto("/trends");
  const model = page.getByRole("navigation", { name: "Models" }).getByRole("link", { name: /^KG-45T/ });
  const href = await model.getAttribute("href");
  // The worker may still be analysing the scenario: wait for the production run to be in.
  await expect(async () => {
    await page.goto(href ?? "/trends");
    expect(await plotted(page).count()).toBeGreaterThanOrEqual(27);
  }).toPass({ timeout: 120_000 });
  await expect(page.getByRole("heading", { name: "KG-45T · Voltage" })).toBeVisible();

  // The band and the control limits: drawn (canvas) and stated.
  await expect(page.getByTestId("trend-chart").locator("canvas").first()).toBeVisible();
  await expect(page.getByTestId("trend-band")).toHaveText(/Band: 3\d\d(\.\d+)? … 4\d\d(\.\d+)? V/);
  await expect(page.locator('[data-stat="UCL"]')).toContainText(/\d{3}\.\d+ V/);
  await expect(page.locator('[data-stat="LCL"]')).toContainText(/\d{3}\.\d+ V/);
  const all = await pointsOnPage(page);
  const inStatistics = all.filter((p) => p.flagged !== "yes").length;
  expect(inStatistics).toBeGreaterThanOrEqual(26);
  await expect(page.locator('[data-stat="n"]')).toContainText(String(inStatistics));
  await expect(page.locator('[data-stat="Cpk"]')).not.toContainText("indicative");
  // The clipped capture is drawn apart and left out.
  await expect(plotted(page).and(page.locator(`[data-serial="${CLIPPED}"]`))).toHaveAttribute("data-flagged", "yes");

  // A date range that holds none of today's captures, then one that holds them all.
  const today = new Date().toISOString().slice(0, 10);
  const filters = page.getByRole("form", { name: "Trend filters" });
  await filters.getByLabel("From", { exact: true }).fill("2020-01-01");
  await filters.getByLabel("To", { exact: true }).fill("2020-12-31");
  await filters.getByRole("button", { name: "Show" }).click();
  await expect(page.getByText("No unit of this model has this figure for the filters chosen.")).toBeVisible();
  await expect(page).toHaveURL(/from=2020-01-01/);
  await filters.getByLabel("From", { exact: true }).fill(today);
  await filters.getByLabel("To", { exact: true }).fill(today);
  await filters.getByRole("button", { name: "Show" }).click();
  await expect(page).toHaveURL(new RegExp(`from=${today}`));
  // Every capture of the run is today's: the same points as without the filter.
  await expect(plotted(page)).toHaveCount(all.length);
  const shown = await pointsOnPage(page);

  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export these points (CSV)" }).click()]);
  const csv = readFileSync((await download.path()) as string, "utf8").trim().split("\r\n");
  expect(csv[0]?.split(",").slice(0, 5)).toEqual(["serial", "measured_at", "value", "unit", "in_statistics"]);
  const rows = csv.slice(1).map((line) => line.split(","));
  expect(rows.map((r) => ({ serial: r[0], value: r[2], flagged: r[4] === "no" ? "yes" : "no" }))).toEqual(shown);
});
