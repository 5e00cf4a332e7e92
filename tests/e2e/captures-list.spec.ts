import { expect, test } from "@playwright/test";
import { signIn } from "./support";

// Reads the demo captures that scripts/test.sh pushes through the pipeline before the browser tests.

test("a quality engineer filters the captures list by verdict and sorts it on THD, and the URL keeps the view", async ({ page }) => {
  await signIn(page, "qa");
  await page.goto("/captures");
  const table = page.getByRole("table", { name: "Captures" });
  await expect(table.getByRole("row")).not.toHaveCount(1);

  await expect(async () => {
    await page.getByLabel("Verdict").selectOption("fail");
    await page.getByRole("button", { name: "Show" }).click();
    await expect(page).toHaveURL(/overall=fail/, { timeout: 2_000 });
  }).toPass({ timeout: 20_000 });
  const rows = table.getByRole("row").filter({ hasNot: page.getByRole("columnheader") });
  await expect(rows).not.toHaveCount(0);
  for (const row of await rows.all()) await expect(row).toContainText("Outside");

  await page.goto("/captures");
  await table.getByRole("link", { name: "THD (%)" }).click();
  await expect(page).toHaveURL(/sort=thd/);
  await expect(table.getByRole("columnheader", { name: /THD/ })).toHaveAttribute("aria-sort", "descending");
  const thdColumn = await table.getByRole("columnheader").evaluateAll((cells) => cells.findIndex((c) => c.textContent?.startsWith("THD")));
  const values = (await rows.evaluateAll((trs, col) => trs.map((tr) => tr.children[col]?.textContent ?? ""), thdColumn))
    .filter((t) => t !== "—").map(Number);
  expect(values.length).toBeGreaterThan(1);
  expect([...values].sort((a, b) => b - a)).toEqual(values);

  await table.getByRole("link", { name: /THD/ }).click();
  await expect(table.getByRole("columnheader", { name: /THD/ })).toHaveAttribute("aria-sort", "ascending");
});

test("the captures API pages and filters the same way, and names a bad parameter", async ({ page }) => {
  await signIn(page, "qa");
  const ok = await page.request.get("/api/captures?overall=fail&sort=thd");
  expect(ok.status()).toBe(200);
  const body = (await ok.json()) as { captures: { overall: string | null }[]; page: number };
  expect(body.page).toBe(1);
  expect(body.captures.length).toBeGreaterThan(0);
  expect(body.captures.every((c) => c.overall === "fail")).toBe(true);
  const bad = await page.request.get("/api/captures?sort=price");
  expect(bad.status()).toBe(400);
  expect(((await bad.json()) as { error: string }).error).toContain("sort");
});
