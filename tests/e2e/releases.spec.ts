import { createHash, randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { expect, request as playwrightRequest, test, type Page } from "@playwright/test";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { closeDb } from "@/db/queries/connection";
import { organisations, ratings, units } from "@/db/schema";
import { renderDemoCsv } from "@/scripts/demo/waveforms";
import { ACCOUNTS, DEMO_PASSWORD, signIn } from "./support";

// A quality engineer releases a complete unit's report with a password, downloads it, checks the file
// on the public verification page (valid); the client finds the mail, signs in, downloads the same
// bytes from the portal and reads "valid"; the quality engineer issues a new revision, and the page
// then says superseded.

const LL3 = { "V_AB (V)": "vab", "V_BC (V)": "vbc", "V_CA (V)": "vca" };

async function orgId(slug: string): Promise<string> {
  const [row] = await getDb().select({ id: organisations.id }).from(organisations).where(eq(organisations.slug, slug));
  if (!row) throw new Error(`no organisation ${slug}: seed first`);
  return row.id;
}

/** A unit of its own serial on the demo's 45 kVA rating (one no-load step at 1500 rpm), with a healthy capture uploaded by the operator. */
async function completeUnit(baseURL: string, serial: string): Promise<string> {
  const [labId, clientId] = [await orgId("harrowgate-lab"), await orgId("kestrum")];
  const [rating] = await getDb().select().from(ratings).where(and(eq(ratings.labId, labId), eq(ratings.modelCode, "KG-45T"))).limit(1);
  if (!rating) throw new Error("no KG-45T rating: seed first");
  const [unit] = await getDb().insert(units).values({ serial, ratingId: rating.id, organisationId: clientId, labId }).returning();
  const ctx = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } });
  const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
  await ctx.post("/api/auth/callback/credentials", { form: { csrfToken, email: ACCOUNTS.operator.email, password: DEMO_PASSWORD, json: "true" }, maxRedirects: 0 });
  const csv = renderDemoCsv({ lineVoltsRms: 400, frequencyHz: 50, phases: 3, harmonicsPercent: { 5: 0.9, 7: 0.6, 11: 0.3 }, seed: Date.now() % 100_000 });
  const body = {
    unitSerial: serial, testKind: "no-load", speedRpm: 1500, channelRoles: LL3, probeScales: {}, channelOffsets: {}, notes: "release spec",
    fileName: `${serial}.csv`, sizeBytes: Buffer.byteLength(csv), sha256: createHash("sha256").update(csv).digest("hex"),
  };
  const reg = await ctx.post("/api/captures", { data: body });
  expect(reg.status(), await reg.text()).toBeLessThan(300);
  const { capture, upload } = (await reg.json()) as { capture: { id: string }; upload: { kind: string; url: string; headers?: Record<string, string> } };
  const put = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv });
  expect(put.status).toBeLessThan(300);
  expect((await ctx.post(`/api/captures/${capture.id}/complete`, { data: {} })).status()).toBe(202);
  await ctx.dispose();
  return unit!.id;
}

async function dropFile(page: Page, file: string) {
  const b64 = readFileSync(file).toString("base64");
  const dataTransfer = await page.evaluateHandle(({ data }) => {
    const bytes = Uint8Array.from(atob(data), (c) => c.charCodeAt(0));
    const dt = new DataTransfer();
    dt.items.add(new File([bytes], "report.pdf", { type: "application/pdf" }));
    return dt;
  }, { data: b64 });
  await page.getByText("Drop the PDF here, or choose it").dispatchEvent("drop", { dataTransfer });
}

test.afterAll(async () => {
  await closeDb();
});

test("a quality engineer releases a complete unit's report; the client is mailed, downloads it from the portal and it verifies as valid; after a new revision it reads superseded", async ({ page, browser, baseURL }) => {
  test.setTimeout(240_000);
  const serial = `RLE-${randomUUID().slice(0, 6).toUpperCase()}`;
  const unitId = await completeUnit(baseURL ?? "", serial);

  await signIn(page, "qa");
  await expect(async () => {
    await page.goto(`/units/${unitId}`);
    await expect(page.getByTestId("plan-state")).toHaveText("Complete and within tolerance", { timeout: 1000 });
  }).toPass({ timeout: 120_000 });

  const release = page.getByRole("form", { name: "Release the report" });
  await release.getByLabel("Your password (signature)").fill("not-my-password");
  await release.getByRole("button", { name: "Sign and release" }).click();
  await expect(release.getByText("That password is not yours: nothing was signed.")).toBeVisible({ timeout: 30_000 });
  await release.getByLabel("Your password (signature)").fill(DEMO_PASSWORD);
  await release.getByRole("button", { name: "Sign and release" }).click();
  // The release form gives way to the new-revision form; the released revision is listed.
  const firstRow = page.getByTestId("report-revision-1");
  await expect(firstRow).toContainText("Valid", { timeout: 60_000 });
  const number = (await firstRow.getByRole("link").first().textContent())?.trim() ?? "";
  expect(number).toMatch(/^[A-Z0-9]+-\d{6}$/);
  const download = page.waitForEvent("download");
  await firstRow.getByRole("link", { name: /PDF, \d+ pages?/ }).click();
  const firstFile = await (await download).path();
  expect(readFileSync(firstFile).subarray(0, 5).toString()).toBe("%PDF-");

  // The verification page is public: a fresh browser context without a session.
  const visitor = await (await browser.newContext()).newPage();
  await visitor.goto(`/verify/${number}`);
  await expect(visitor.getByRole("heading", { name: `Report ${number}` })).toBeVisible();
  await expect(visitor.getByText(serial)).toBeVisible();
  await expect(visitor.getByTestId("latest-status")).toHaveText("valid");
  await expect(visitor.getByTestId("revision-1")).toContainText(createHash("sha256").update(readFileSync(firstFile)).digest("hex"));
  await dropFile(visitor, firstFile);
  await expect(visitor.getByTestId("file-outcome")).toContainText(`This is a released file of report ${number}: revision 1, status valid.`);

  // The client is mailed through the outbox and the worker; the lab manager's outbox shows the mail
  // the mail catcher received, with the portal link (clients do not open the outbox themselves).
  const lab = await (await browser.newContext()).newPage();
  await signIn(lab, "admin");
  const mail = lab.locator("details", { hasText: `Test report ${number} revision 1` }).first();
  await expect(async () => {
    await lab.goto("/admin/mailbox");
    await expect(mail).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 90_000 });
  await mail.locator("summary").click();
  const link = (await mail.locator("pre").innerText()).match(/https?:\/\/\S+\/portal\?serial=\S+/)?.[0];
  expect(link).toBeTruthy();
  // The client signs in, follows the link, downloads the released file and checks it on the public page.
  const client = await (await browser.newContext()).newPage();
  await signIn(client, "kestrum");
  await client.goto(new URL(link!).pathname + new URL(link!).search);
  const clientRow = client.getByTestId(`report-${number}-rev1`);
  await expect(clientRow).toContainText("Valid");
  const clientDownload = client.waitForEvent("download");
  await clientRow.getByRole("link", { name: /PDF/ }).click();
  const clientFile = await (await clientDownload).path();
  const hashOf = (file: string) => createHash("sha256").update(readFileSync(file)).digest("hex");
  expect(hashOf(clientFile)).toBe(hashOf(firstFile));
  await client.goto(`/verify/${number}`);
  await dropFile(client, clientFile);
  await expect(client.getByTestId("file-outcome")).toContainText(`This is a released file of report ${number}: revision 1, status valid.`);

  const supersede = page.getByRole("form", { name: "Issue a new revision" });
  await supersede.getByLabel("Why this revision replaces the earlier one").fill("Client address corrected on the first page");
  await supersede.getByLabel("Your password (signature)").fill(DEMO_PASSWORD);
  await supersede.getByRole("button", { name: "Sign and release the new revision" }).click();
  await expect(page.getByText(`Revision 2 of report ${number} released; the earlier revision is superseded.`)).toBeVisible({ timeout: 60_000 });

  await visitor.reload();
  await expect(visitor.getByTestId("revision-1")).toContainText("superseded by revision 2");
  await expect(visitor.getByTestId("latest-status")).toHaveText("valid");
  await visitor.getByTestId("verify-file").setInputFiles(firstFile);
  await expect(visitor.getByTestId("file-outcome")).toContainText(`revision 1, status superseded by revision 2`);
  // Any other file is not a released one; an unknown number is a 404.
  await visitor.getByTestId("verify-file").setInputFiles({ name: "other.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-1.7 not released") });
  await expect(visitor.getByTestId("file-outcome")).toContainText(`Not a released file of report ${number}.`);
  const unknown = await visitor.goto("/verify/NOPE-000000");
  expect(unknown?.status()).toBe(404);
  await expect(visitor.getByRole("heading", { name: "No released report has this number" })).toBeVisible();
});
