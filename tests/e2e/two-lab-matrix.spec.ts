import { createHash, randomUUID } from "node:crypto";
import { expect, request as playwrightRequest, test, type APIRequestContext } from "@playwright/test";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { closeDb } from "@/db/queries/connection";
import { captures, organisations, ratings, units } from "@/db/schema";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { DEMO_PASSWORD } from "./support";

// Two labs (Harrowgate, Calderwick), one client shared by both (Kestrum), one client of Harrowgate
// only (Poldane). Every page and API route that shows a unit or a capture is requested by every
// account for a resource of each tenant; a resource the account may not see must answer exactly like
// a missing one (status and body, the id masked), and no list page may name anything it may not see.

type Who = { key: string; email: string | null; lab: "H" | "C" | null; client: "kestrum" | "poldane" | null };
const ACCOUNTS: Who[] = [
  { key: "H admin", email: "maren.ilsley@harrowgate.example", lab: "H", client: null },
  { key: "H operator", email: "tobiah.crane@harrowgate.example", lab: "H", client: null },
  { key: "H qa", email: "ines.vardy@harrowgate.example", lab: "H", client: null },
  { key: "C admin", email: "odile.fenner@calderwick.example", lab: "C", client: null },
  { key: "C operator", email: "jory.haskett@calderwick.example", lab: "C", client: null },
  { key: "C qa", email: "wren.obuya@calderwick.example", lab: "C", client: null },
  { key: "Kestrum", email: "ruan.petit@kestrum.example", lab: null, client: "kestrum" },
  { key: "Poldane", email: "sela.ambrose@poldane.example", lab: null, client: "poldane" },
  { key: "anonymous", email: null, lab: null, client: null },
];

type Resource = { name: string; lab: "H" | "C"; client: "kestrum" | "poldane"; unitId: string; serial: string; captureId: string | null };

async function signedIn(base: string, email: string | null): Promise<APIRequestContext> {
  const ctx = await playwrightRequest.newContext({ baseURL: base, extraHTTPHeaders: { origin: base } });
  if (!email) return ctx;
  const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await ctx.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: DEMO_PASSWORD, json: "true" }, maxRedirects: 0 });
  expect(res.status(), `sign-in of ${email}`).toBeLessThan(400);
  return ctx;
}

async function orgId(slug: string): Promise<string> {
  const [row] = await getDb().select({ id: organisations.id }).from(organisations).where(eq(organisations.slug, slug));
  if (!row) throw new Error(`no organisation ${slug}: seed first`);
  return row.id;
}

/** A unit of `lab` for `client` with its own serial, made the way the app would (or, for a lab not linked to the client, directly). */
async function unitFor(labSlug: string, clientSlug: string, serial: string): Promise<string> {
  const [labId, clientId] = [await orgId(labSlug), await orgId(clientSlug)];
  let [rating] = await getDb().select().from(ratings).where(and(eq(ratings.labId, labId), eq(ratings.organisationId, clientId))).limit(1);
  if (!rating) {
    // Calderwick has no rating of Poldane's (not its client): a stray row, as old data could hold.
    const [any] = await getDb().select().from(ratings).where(eq(ratings.organisationId, clientId)).limit(1);
    if (!any) throw new Error(`no rating of ${clientSlug}`);
    [rating] = await getDb().insert(ratings).values({ organisationId: clientId, labId, modelCode: `${any.modelCode}-${serial}`, title: any.title, nameplate: any.nameplate }).returning();
  }
  const [unit] = await getDb().insert(units).values({ serial, ratingId: rating!.id, organisationId: clientId, labId }).returning();
  return unit!.id;
}

/** Registers and uploads one capture through the session API as `ctx` (a lab operator). */
async function captureFor(ctx: APIRequestContext, serial: string, variant: number): Promise<string> {
  const csv = makeThreePhaseCsv({ variant });
  const body = { unitSerial: serial, testKind: "no-load", speedRpm: 1500, fileName: "matrix.csv", sizeBytes: Buffer.byteLength(csv), sha256: createHash("sha256").update(csv).digest("hex") };
  const reg = await ctx.post("/api/captures", { data: body });
  expect(reg.status(), await reg.text()).toBeLessThan(300);
  const { capture, upload } = (await reg.json()) as { capture: { id: string }; upload: { kind: string; url: string; headers?: Record<string, string> } };
  if (upload.kind === "single") {
    const put = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv });
    expect(put.status).toBeLessThan(300);
  }
  expect((await ctx.post(`/api/captures/${capture.id}/complete`, { data: {} })).status()).toBe(202);
  return capture.id;
}

const UNIT_ROUTES = ["/units/:id", "/api/units/:id", "/api/units/:id/report.csv", "/api/units/:id/report.pdf"];
const CAPTURE_ROUTES = ["/captures/:id", "/api/captures/:id", "/api/captures/:id/plot", "/api/captures/:id/raw"];
const LIST_ROUTES = ["/", "/units", "/units?q=MX", "/captures", "/captures?q=MX", "/api/captures", "/api/captures?q=MX", "/review", "/trends", "/stations", "/upload", "/admin/people", "/admin/mailbox", "/account"];

const mayRead = (who: Who, r: Resource) =>
  who.lab !== null ? who.lab === r.lab : who.client === r.client && (r.client === "kestrum" || r.lab === "H");

test("every account × every page and API route over two labs: no leaks", async ({ baseURL }) => {
  test.setTimeout(600_000);
  const tag = randomUUID().slice(0, 6).toUpperCase();
  const contexts = new Map<string, APIRequestContext>();
  for (const who of ACCOUNTS) contexts.set(who.key, await signedIn(baseURL ?? "", who.email));
  const resources: Resource[] = [];
  const add = async (name: string, lab: "H" | "C", labSlug: string, client: "kestrum" | "poldane", operator: string | null, variant: number) => {
    const serial = `MX${tag}-${name}`;
    const unitId = await unitFor(labSlug, client, serial);
    const captureId = operator ? await captureFor(contexts.get(operator)!, serial, variant) : null;
    resources.push({ name, lab, client, unitId, serial, captureId });
  };
  await add("HK", "H", "harrowgate-lab", "kestrum", "H operator", 9101);
  await add("HP", "H", "harrowgate-lab", "poldane", "H operator", 9102);
  await add("CK", "C", "calderwick-lab", "kestrum", "C operator", 9103);
  await add("CP", "C", "calderwick-lab", "poldane", null, 0);
  const missingId = randomUUID();

  let requests = 0;
  let readable = 0;
  const leaks: string[] = [];
  const fetchText = async (ctx: APIRequestContext, path: string) => {
    requests++;
    const res = await ctx.get(path, { maxRedirects: 0 });
    const type = res.headers()["content-type"] ?? "";
    const text = /json|text|html|csv/.test(type) ? await res.text() : `<${type} ${(await res.body()).length} bytes>`;
    return { status: res.status(), text };
  };
  // What differs per request and per id in an otherwise identical answer.
  const mask = (text: string, id: string) => text.replaceAll(id, ":id").replace(/"buildId":"[^"]+"|nonce="[^"]+"/g, "").replace(/\d{4}-\d\d-\d\dT[\d:.]+Z/g, "T");

  for (const who of ACCOUNTS) {
    const ctx = contexts.get(who.key)!;
    for (const template of [...UNIT_ROUTES, ...CAPTURE_ROUTES]) {
      const missing = await fetchText(ctx, template.replace(":id", missingId));
      for (const r of resources) {
        const id = template.startsWith("/captures") || template.startsWith("/api/captures") ? r.captureId : r.unitId;
        if (!id) continue;
        const got = await fetchText(ctx, template.replace(":id", id));
        if (mayRead(who, r)) {
          // The control: what the account may read it does read (else "no leaks" would prove nothing).
          if (got.status >= 500 || (template === "/api/units/:id" && got.status !== 200)) leaks.push(`${who.key} ${template} ${r.name}: ${got.status} for its own`);
          else readable++;
          continue;
        }
        if (got.status !== missing.status || mask(got.text, id) !== mask(missing.text, missingId)) {
          leaks.push(`${who.key} ${template} ${r.name}: ${got.status} differs from a missing id's ${missing.status}`);
        }
      }
    }
    for (const path of LIST_ROUTES) {
      const got = await fetchText(ctx, path);
      if (got.status >= 500) leaks.push(`${who.key} ${path}: ${got.status}`);
      for (const r of resources) {
        if (mayRead(who, r)) continue;
        if (got.text.includes(r.serial) || (r.captureId && got.text.includes(r.captureId)) || got.text.includes(r.unitId)) leaks.push(`${who.key} ${path} names ${r.name}`);
      }
      const otherLab = who.lab === "H" ? "calderwick.example" : who.lab === "C" ? "harrowgate.example" : null;
      if (otherLab && got.text.includes(`@${otherLab}`)) leaks.push(`${who.key} ${path} names people of the other lab`);
    }
  }
  console.log(`two-lab matrix: ${ACCOUNTS.length} accounts, ${resources.length} tenant resources, ${requests} requests (${readable} answers of readable resources), ${leaks.length} leaks`);
  expect(leaks).toEqual([]);
  expect(requests).toBeGreaterThan(300);
  expect(readable).toBeGreaterThan(50);
  await closeDb();
});
