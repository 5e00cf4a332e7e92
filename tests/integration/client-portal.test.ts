import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import Papa from "papaparse";
import { getDb } from "@/db/client";
import { clientTokens, users } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/options";
import { GET as bySerial } from "@/app/api/v1/reports/route";
import { GET as statusRoute } from "@/app/api/v1/reports/[number]/route";
import { GET as apiPdf } from "@/app/api/v1/reports/[number]/pdf/route";
import { GET as portalPdf } from "@/app/api/portal/reports/[id]/pdf/route";
import { GET as portalCsv } from "@/app/api/portal/reports/[id]/csv/route";
import { POST as portalZip } from "@/app/api/portal/zip/route";
import { createClientToken, revokeMyOrganisationToken } from "@/lib/dal/client-tokens";
import { ZIP_MAX_BYTES, ZIP_MAX_REPORTS } from "@/lib/dal/portal-files";
import { getPortalView, PORTAL_PAGE_SIZE } from "@/lib/dal/portal";
import { portalQueryFrom } from "@/lib/reports/portal-query";
import { REPORT_CSV_COLUMNS } from "@/lib/reports/report-csv";
import { seededOrgs } from "./helpers";
import { closeConnections } from "./pipeline-support";
import { run, SEEDED, sessionUserOf } from "./ratings-support";
import { firstUnitOf, insertReport, reportContent } from "./report-fixtures";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

let kestrumUser: SessionUser;
let poldaneUser: SessionUser;
let kestrumToken: string;
let poldaneToken: string;
const ids: Record<string, string> = {};
const n = (tag: string) => `T${run}-${tag}`;
const bearer = (token: string, path: string) => new Request(`http://test${path}`, { headers: { authorization: `Bearer ${token}` } });
const num = (number: string) => ({ params: Promise.resolve({ number }) });
const idp = (id: string) => ({ params: Promise.resolve({ id }) });
const zipOf = (list: string[]) => new Request("http://test/api/portal/zip", {
  method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams(list.map((i) => ["ids", i])).toString(),
});

beforeAll(async () => {
  const orgs = await seededOrgs();
  kestrumUser = await sessionUserOf(SEEDED.manufacturer);
  poldaneUser = await sessionUserOf("sela.ambrose@poldane.example");
  const qa = await sessionUserOf(SEEDED.qa);
  const kUnit = await firstUnitOf(orgs.lab.id, orgs.kestrum.id);
  const pUnit = await firstUnitOf(orgs.lab.id, orgs.poldane.id);
  const base = { labId: orgs.lab.id, signerId: qa.id };
  ids.k1 = (await insertReport({ ...base, clientId: orgs.kestrum.id, unit: kUnit, number: n("K1"), status: "superseded" })).row.id;
  ids.k2 = (await insertReport({ ...base, clientId: orgs.kestrum.id, unit: kUnit, number: n("K1"), revision: 2 })).row.id;
  ids.kBad = (await insertReport({ ...base, clientId: orgs.kestrum.id, unit: kUnit, number: n("KBAD"), recordedSha: "0".repeat(64) })).row.id;
  ids.p1 = (await insertReport({ ...base, clientId: orgs.poldane.id, unit: pUnit, number: n("P1") })).row.id;
  ids.kSerial = kUnit.serial;
  ids.pSerial = pUnit.serial;
  session.current = kestrumUser;
  kestrumToken = (await createClientToken({ label: "quality system", days: 30 })).token;
  session.current = poldaneUser;
  poldaneToken = (await createClientToken({ label: "erp", days: 30 })).token;
});
afterAll(closeConnections);

describe("/api/v1/reports with a client token", () => {
  it("GET ?serial= lists the client's revisions with their status, and nothing of another client's serial", async () => {
    const own = await (await bySerial(bearer(kestrumToken, `/api/v1/reports?serial=${encodeURIComponent(ids.kSerial!)}`))).json();
    const mine = own.reports.filter((r: { number: string }) => r.number === n("K1"));
    expect(mine.map((r: { revision: number; status: string }) => `${r.revision}:${r.status}`).sort()).toEqual(["1:superseded", "2:valid"]);
    const foreign = await (await bySerial(bearer(kestrumToken, `/api/v1/reports?serial=${encodeURIComponent(ids.pSerial!)}`))).json();
    expect(foreign.reports.filter((r: { number: string }) => r.number === n("P1"))).toEqual([]);
  });

  it("GET /{number}/pdf serves the stored bytes of the valid revision; another client's number is a 404", async () => {
    const res = await apiPdf(bearer(kestrumToken, `/api/v1/reports/${n("K1")}/pdf`), num(n("K1")));
    expect(res.status).toBe(200);
    expect(res.headers.get("x-report-revision")).toBe("2");
    expect(new TextDecoder().decode(await res.arrayBuffer())).toContain(`test report ${n("K1")} rev 2`);
    expect((await apiPdf(bearer(kestrumToken, `/api/v1/reports/${n("P1")}/pdf`), num(n("P1")))).status).toBe(404);
    expect((await statusRoute(bearer(poldaneToken, `/api/v1/reports/${n("K1")}`), num(n("K1")))).status).toBe(404);
  });

  it("GET /{number}/pdf?revision=1 of a superseded revision says so in its file name and headers", async () => {
    const res = await apiPdf(bearer(kestrumToken, `/api/v1/reports/${n("K1")}/pdf?revision=1`), num(n("K1")));
    expect(res.headers.get("x-report-status")).toBe("superseded");
    expect(res.headers.get("content-disposition")).toContain("-SUPERSEDED.pdf");
  });

  it("a stored PDF whose sha256 differs from the row is refused with a sentence, not served", async () => {
    const res = await apiPdf(bearer(kestrumToken, `/api/v1/reports/${n("KBAD")}/pdf`), num(n("KBAD")));
    expect(res.status).toBe(500);
    expect((await res.json()).error).toMatch(/does not match its recorded checksum/);
  });

  it("a revoked token answers 401 with a sentence", async () => {
    session.current = kestrumUser;
    const made = await createClientToken({ label: "to revoke", days: 30 });
    const [row] = await getDb().select().from(clientTokens).where(eq(clientTokens.prefix, made.token.slice(4, 16)));
    expect(await revokeMyOrganisationToken(row!.id)).toBe(true);
    const res = await bySerial(bearer(made.token, `/api/v1/reports?serial=${ids.kSerial}`));
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/was revoked on \d{4}-\d{2}-\d{2}/);
  });

  it("an expired token answers 401 with a sentence; a malformed one too", async () => {
    session.current = kestrumUser;
    const made = await createClientToken({ label: "to expire", days: 1 });
    await getDb().update(clientTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(clientTokens.prefix, made.token.slice(4, 16)));
    const res = await bySerial(bearer(made.token, `/api/v1/reports?serial=${ids.kSerial}`));
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/expired on/);
    expect((await bySerial(bearer("emk_000000000000.xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx", "/api/v1/reports?serial=x"))).status).toBe(401);
    expect((await bySerial(new Request("http://test/api/v1/reports?serial=x"))).status).toBe(401);
  });

  it("createClientToken is refused to a client user who is not the organisation's administrator", async () => {
    const [other] = await getDb().insert(users).values({ email: `plain-${run}@kestrum.example`, name: "Plain User", role: "manufacturer", organisationId: kestrumUser.organisationId, passwordHash: "x" }).returning();
    session.current = { ...kestrumUser, id: other!.id, email: other!.email };
    await expect(createClientToken({ label: "nope", days: 5 })).rejects.toThrow(/administrator/);
  });

  it("GET without serial is a 400 that names the parameter", async () => {
    const res = await bySerial(bearer(kestrumToken, "/api/v1/reports"));
    expect(res.status).toBe(400);
    expect((await res.json()).error).toMatch(/serial/);
  });
});

describe("portal downloads (session)", () => {
  it("portalCsv has one row per check of each step, equal to the stored content, with number, revision and status", async () => {
    session.current = kestrumUser;
    const res = await portalCsv(new Request("http://test"), idp(ids.k2!));
    const parsed = Papa.parse<string[]>((await res.text()).trim(), { skipEmptyLines: true });
    const [header, ...rows] = parsed.data;
    expect(header).toEqual([...REPORT_CSV_COLUMNS]);
    const content = reportContent(n("K1"), 2, ids.kSerial!);
    const expected = content.steps.flatMap((s) => s.checks.map((c) => [s.name, c.checkId, c.value === null ? "" : String(Number(c.value.toPrecision(8)))]));
    const col = (name: string) => header!.indexOf(name);
    expect(rows.map((r) => [r[col("step")], r[col("check")], r[col("measured")]])).toEqual(expected);
    expect(new Set(rows.map((r) => `${r[col("report_number")]}|${r[col("revision")]}|${r[col("report_status")]}|${r[col("disposition")]}`))).toEqual(new Set([`${n("K1")}|2|valid|accepted`]));
    // A label starting with "=" is defused (common practice against spreadsheet formula injection).
    expect(rows.some((r) => r[col("label")]?.startsWith("'=HYPERLINK"))).toBe(true);
  });

  it("portalPdf of another client's report is a 404 like a missing one", async () => {
    session.current = kestrumUser;
    expect((await portalPdf(new Request("http://test"), idp(ids.p1!))).status).toBe(404);
    expect((await portalPdf(new Request("http://test"), idp("00000000-0000-4000-8000-000000000000"))).status).toBe(404);
  });

  it("portalZip streams a zip of the selection (PDF + CSV each)", async () => {
    session.current = kestrumUser;
    const res = await portalZip(zipOf([ids.k1!, ids.k2!]));
    expect(res.status).toBe(200);
    const bytes = new Uint8Array(await res.arrayBuffer());
    expect([...bytes.slice(0, 4)]).toEqual([0x50, 0x4b, 0x03, 0x04]);
    const text = new TextDecoder("latin1").decode(bytes);
    expect(text).toContain(`${n("K1")}-rev1-${ids.kSerial!.replace(/[^A-Za-z0-9._-]+/g, "_")}-SUPERSEDED.pdf`);
    expect(text).toContain(`test report ${n("K1")} rev 2`);
  });

  it("portalZip refuses more reports than the count cap, and more bytes than the size cap, with a sentence", async () => {
    const orgs = await seededOrgs();
    const qa = await sessionUserOf(SEEDED.qa);
    const unit = await firstUnitOf(orgs.lab.id, orgs.kestrum.id);
    const many: string[] = [];
    for (let i = 0; i <= ZIP_MAX_REPORTS; i += 1) {
      many.push((await insertReport({ labId: orgs.lab.id, signerId: qa.id, clientId: orgs.kestrum.id, unit, number: n(`CAP${i}`) })).row.id);
    }
    session.current = kestrumUser;
    const over = await portalZip(zipOf(many));
    expect(over.status).toBe(413);
    expect((await over.json()).error).toMatch(new RegExp(`at most ${ZIP_MAX_REPORTS} reports; you selected ${ZIP_MAX_REPORTS + 1}`));
    const big = (await insertReport({ labId: orgs.lab.id, signerId: qa.id, clientId: orgs.kestrum.id, unit, number: n("BIG"), sizeBytes: ZIP_MAX_BYTES + 1 })).row.id;
    const tooBig = await portalZip(zipOf([big]));
    expect(tooBig.status).toBe(413);
    expect((await tooBig.json()).error).toMatch(/MiB a zip may hold/);
  }, 60_000);

  it("getPortalView shows one page of PORTAL_PAGE_SIZE reports without their content, the pages together listing each report once", async () => {
    session.current = kestrumUser;
    const first = await getPortalView({});
    expect(first.reports.length).toBeLessThanOrEqual(PORTAL_PAGE_SIZE);
    expect(first.reports[0]).not.toHaveProperty("content");
    expect(first.reports[0]).not.toHaveProperty("objectKey");
    const seen = [...first.reports];
    for (let page = 2, more = first.hasMore; more && page <= 50; page++) {
      const next = await getPortalView({ page });
      seen.push(...next.reports);
      more = next.hasMore;
    }
    expect(new Set(seen.map((r) => r.id)).size).toBe(seen.length);
    expect(seen.map((r) => r.id)).toEqual(expect.arrayContaining([ids.k1, ids.k2, ids.kBad]));
    expect(seen.map((r) => r.id)).not.toContain(ids.p1);
    expect((await getPortalView({ page: Math.floor(seen.length / PORTAL_PAGE_SIZE) + 2 })).reports).toEqual([]);
    expect(portalQueryFrom({ page: "0" }).error?.issues[0]?.message).toMatch(/^page:/);
    expect(portalQueryFrom({ page: "3" }).data?.page).toBe(3);
  });

  it("portalZip refuses another client's id among the selection as missing", async () => {
    session.current = kestrumUser;
    const foreign = await portalZip(zipOf([ids.k2!, ids.p1!]));
    expect(foreign.status).toBe(404);
    expect((await foreign.json()).error).toMatch(/1 of the selected reports do not exist/);
  });
});
