import { expect, test } from "@playwright/test";
import { ACCOUNTS, signIn, signOut } from "./support";

test("each role signs in and sees its own navigation", async ({ page }) => {
  const expected = {
    admin: ["Overview", "Units", "Captures", "New capture", "Review queue", "Trends", "Ratings", "Benches", "Instruments", "Clients", "People", "Outbox", "Lab settings"],
    operator: ["Overview", "New capture", "Captures", "Units", "Ratings", "Benches"],
    qa: ["Overview", "Review queue", "Units", "Captures", "Trends", "Ratings", "Instruments"],
    kestrum: ["Overview", "Units", "Released reports", "API tokens"],
  } as const;
  for (const [who, links] of Object.entries(expected) as [keyof typeof expected, readonly string[]][]) {
    await signIn(page, who);
    const nav = page.getByRole("navigation", { name: "Main" });
    await expect(nav.getByRole("link")).toHaveText(["Emfolio", ...links, "Your sessions"]);
    await expect(page.getByRole("complementary", { name: "Safety caution" })).toBeVisible();
    await signOut(page);
  }
});

test("a wrong password shows an error and stays signed out", async ({ page }) => {
  await signIn(page, "qa", "definitely-wrong");
  await expect(page.getByText("That email and password do not match an active account.")).toBeVisible();
  await page.goto("/units");
  await expect(page).toHaveURL(/\/sign-in\?next=%2Funits/);
});

test("a client cannot open lab pages: 403 in place, with the app's menu", async ({ page }) => {
  await signIn(page, "kestrum");
  for (const path of ["/upload", "/review", "/admin/people", "/stations"]) {
    const response = await page.goto(path);
    expect(response?.status(), path).toBe(403);
    await expect(page, path).toHaveURL(new RegExp(`${path}$`));
    await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
    await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Units" })).toBeVisible();
  }
});

test("a client sees only its own units, and another organisation's unit id answers 404 on the page and the API", async ({ page }) => {
  await signIn(page, "poldane");
  await page.goto("/units?q=PX120");
  const poldaneLink = page.getByRole("link", { name: /^PX120-/ }).first();
  await expect(poldaneLink).toBeVisible();
  const href = await poldaneLink.getAttribute("href");
  await page.goto("/units?q=KG45");
  await expect(page.getByText("No units match")).toBeVisible();
  await signOut(page);

  await signIn(page, "kestrum");
  const unitId = href!.split("/").pop()!;
  const pageResponse = await page.goto(`/units/${unitId}`);
  expect(pageResponse?.status()).toBe(404);
  const api = await page.request.get(`/api/units/${unitId}`);
  expect(api.status()).toBe(404);
  expect(await api.json()).toEqual({ error: "No such unit." });
});

test("the API refuses a request without a session", async ({ request }) => {
  const response = await request.get("/api/units/00000000-0000-0000-0000-000000000000");
  expect(response.status()).toBe(401);
  void ACCOUNTS;
});

test("pages and the API are sent with anti-framing, no-sniff and referrer headers", async ({ request }) => {
  for (const path of ["/", "/sign-in", "/api/health"]) {
    const headers = (await request.get(path)).headers();
    expect(headers["x-frame-options"], path).toBe("DENY");
    expect(headers["content-security-policy"], path).toContain("frame-ancestors 'none'");
    expect(headers["x-content-type-options"], path).toBe("nosniff");
    expect(headers["referrer-policy"], path).toBe("same-origin");
  }
  // Downloads whose route sends its own sandbox policy get no second one from the site (it would replace
  // theirs); unsigned they answer 401 without one, and still with X-Frame-Options.
  const none = "00000000-0000-0000-0000-000000000000";
  for (const path of [`/api/attachments/${none}`, `/api/instruments/${none}/certificates/${none}`]) {
    const response = await request.get(path);
    expect(response.status(), path).toBe(401);
    expect(response.headers()["content-security-policy"], path).toBeUndefined();
    expect(response.headers()["x-frame-options"], path).toBe("DENY");
  }
});
