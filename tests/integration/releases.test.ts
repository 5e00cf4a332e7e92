import { PutObjectCommand } from "@aws-sdk/client-s3";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { captureInstruments, instruments, reports, signatures, unitNotes, units, users } from "@/db/schema";
import { takeReportNumber } from "@/db/queries/lab-settings";
import { DEMO_PASSWORD } from "@/db/seed-data";
import type { Actor } from "@/lib/dal/actor";
import { releaseReport, supersedeInputSchema, supersedeReport, withdrawReport } from "@/lib/dal/releases";
import { readReleasedReport, renderUnitDraft } from "@/lib/dal/report-files";
import { verifyReportNumber } from "@/lib/dal/verification";
import { sha256Hex } from "@/lib/server/report-store";
import { getEnv } from "@/lib/server/env";
import { getS3 } from "@/lib/server/storage";
import { seededOrgs } from "./helpers";
import { pageTexts, pdfPageCount, renderedPageCount, wholeText, writeTemp } from "./pdf-text";
import { closeConnections, demoActor } from "./pipeline-support";
import { completeUnit, createReleaseRating, createUnit, storeAnalysedCapture, type ReleaseRating } from "./release-support";

// Releasing reports through the DAL against the test database and object store: numbering under
// concurrency, refusals, signatures, stored bytes, supersede and withdraw, drafts and verification.

const tag = `${Date.now() % 1_000_000}`;
const ADDRESS = "198.51.100.7";
let labId: string;
let rating: ReleaseRating;
let qa: Actor;
let operator: Actor;
let client: Actor;
let serialNo = 0;
const serial = () => `RL${tag}-${++serialNo}`;

beforeAll(async () => {
  const orgs = await seededOrgs();
  labId = orgs.lab.id;
  rating = await createReleaseRating(labId, orgs.kestrum.id, tag);
  [qa, operator, client] = await Promise.all([demoActor("qa"), demoActor("operator"), demoActor("manufacturer")]);
});

afterAll(async () => {
  await closeConnections();
});

describe("releaseReport(actor, input, address)", () => {
  it("releaseReport stores a PDF whose text carries every item of a test report, whose pages all render, and whose downloaded bytes hash to the recorded sha256", async () => {
    const s = serial();
    const unitId = await completeUnit(labId, rating, s, 1);
    // An instrument on one capture and a note for the client, so both sections have content.
    const { captureId } = await storeAnalysedCapture(labId, unitId, rating, rating.steps[0]!.id, 901);
    const [scope] = await getDb().insert(instruments).values({ labId, kind: "oscilloscope", make: "Corvane", model: "DS-4", serial: `SC${tag}`, assetTag: `A-${tag}`, calibrationDue: "2027-03-31" }).returning();
    await getDb().insert(captureInstruments).values({ captureId, instrumentId: scope!.id });
    const [qaUser] = await getDb().select().from(users).where(eq(users.id, qa.userId!));
    await getDb().insert(unitNotes).values({ unitId, authorId: qaUser!.id, visibility: "client", body: `Rotor balanced before the run ${tag}.` });

    const row = await releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS);
    expect(row.revision).toBe(1);
    expect(row.status).toBe("valid");
    expect(row.number).toMatch(/^[A-Z0-9]+-\d{6}$/);

    const { bytes } = await readReleasedReport(qa, row.id);
    expect(sha256Hex(bytes)).toBe(row.sha256);
    expect(bytes.byteLength).toBe(row.sizeBytes);
    const file = writeTemp(bytes);
    expect(pdfPageCount(file)).toBe(row.pageCount);
    expect(renderedPageCount(file)).toBe(row.pageCount);

    const text = wholeText(file);
    const pages = pageTexts(file, row.pageCount);
    const items: { name: string; pattern: RegExp }[] = [
      { name: "title", pattern: /Test report/ },
      { name: "lab name", pattern: /Harrowgate Rotating Machines Lab/ },
      { name: "lab address", pattern: /Unit 4, Fellside Works, Harrowgate HG9 2QT/ },
      { name: "report number", pattern: new RegExp(`Report number ${row.number}`) },
      { name: "revision", pattern: /Revision 1/ },
      { name: "client name", pattern: /Kestrum Generators/ },
      { name: "client address", pattern: /12 Brindle Quay, Portmarren PM3 8LW/ },
      { name: "unit serial", pattern: new RegExp(`Serial ${s}`) },
      { name: "rating with human labels", pattern: /Rated voltage 400 V, line-to-line RMS|Rated voltage 400 V/ },
      { name: "rated frequency", pattern: /Rated frequency 50 Hz/ },
      { name: "dates of testing", pattern: /Dates of testing \(captures\) \d{4}-\d\d-\d\d \d\d:\d\d UTC/ },
      { name: "date of issue", pattern: /Date of issue \d{4}-\d\d-\d\d \d\d:\d\d UTC/ },
      { name: "methods: standard and clause", pattern: /IEC 60034-1/ },
      { name: "methods: analysis engine version", pattern: /Analysis engine version \d+\.\d+\.\d+/ },
      { name: "conditions: speed", pattern: /Speed 1500 rpm/ },
      { name: "conditions: magnet temperature", pattern: /magnet temperature not given/ },
      { name: "plan step 1 by name", pattern: /Step 1: Open circuit at rated speed/ },
      { name: "plan step 2 by name", pattern: /Step 2: Open circuit, second run/ },
      { name: "capture of record", pattern: /Capture of record run-\d+\.csv · sha256 [0-9a-f]{64}/ },
      { name: "results table header", pattern: /Check Measured Unit Limit Verdict/ },
      { name: "result with unit and limit", pattern: /Frequency 50(\.\d+)? Hz [\d.]+ – [\d.]+ Hz Within/ },
      { name: "verdict words", pattern: /Within/ },
      { name: "overall against the plan", pattern: /Overall against the plan Within/ },
      { name: "unit-level results", pattern: /Unit-level results/ },
      { name: "decision rule", pattern: /Simple acceptance \(ILAC/ },
      { name: "marginal band from the profile", pattern: /within 10 % of the distance from nominal to the limit is "Near edge"/ },
      { name: "measurement uncertainty", pattern: /Measurement uncertainty: not evaluated/ },
      { name: "instruments with calibration due", pattern: new RegExp(`oscilloscope Corvane DS-4 \\(asset A-${tag}\\) SC${tag} 2027-03-31`) },
      { name: "deviations section", pattern: /Deviations, concessions and confirmations/ },
      { name: "notes for the client", pattern: new RegExp(`Rotor balanced before the run ${tag}`) },
      { name: "who authorised: name, role, date, meaning", pattern: /Authorised by Ines Vardy, Quality engineer, on \d{4}-\d\d-\d\d \d\d:\d\d UTC: reviewed and approved for release/ },
      { name: "results relate only to the item tested", pattern: /The results relate only to the item tested\./ },
      { name: "safety and advisory note", pattern: /Safety and advisory note: the captures were taken from energised terminals/ },
      { name: "verification address", pattern: new RegExp(`/verify/${row.number}`) },
      { name: "waveform plot", pattern: /Waveform \(min\/max envelope\)/ },
      { name: "spectrum plot", pattern: /Harmonics, % of fundamental/ },
      { name: "end of report", pattern: /End of report\./ },
    ];
    const missing = items.filter((i) => !i.pattern.test(text)).map((i) => i.name);
    expect(missing).toEqual([]);
    // Never the engine's raw codes or the old "Capture note" lines.
    expect(text).not.toMatch(/Capture note|implausible-|few-cycles/);
    pages.forEach((page, i) => {
      expect(page, `page ${i + 1}`).toContain(`Report ${row.number} · revision 1 · Page ${i + 1} of ${row.pageCount}`);
      expect(page, `page ${i + 1}`).not.toContain("DRAFT");
    });
    // One waveform and one spectrum per plan step.
    expect(text.match(/Waveform \(min\/max envelope\)/g)?.length).toBe(rating.steps.length);
    // The stored content is what the PDF was drawn from.
    const content = row.content as { steps: { checks: unknown[] }[]; authorisedBy: { name: string } };
    expect(content.steps).toHaveLength(2);
    expect(content.authorisedBy.name).toBe("Ines Vardy");
    const [signature] = await getDb().select().from(signatures).where(eq(signatures.id, row.signatureId));
    expect(signature?.purpose).toBe("release");
  });

  it("releaseReport gives 20 concurrent releases 20 different, consecutive numbers", async () => {
    const ids = await Promise.all(Array.from({ length: 20 }, (_, i) => completeUnit(labId, rating, serial(), 100 + i)));
    const rows = await Promise.all(ids.map((unitId) => releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS)));
    const numbers = rows.map((r) => r.number);
    expect(new Set(numbers).size).toBe(20);
    const sequence = numbers.map((n) => Number(n.split("-").pop())).sort((a, b) => a - b);
    expect(sequence[19]! - sequence[0]!).toBe(19);
    // The database alone keeps numbers apart too: 20 transactions taking a number at once, outside the in-process queue.
    const taken = await Promise.all(Array.from({ length: 20 }, () => getDb().transaction((tx) => takeReportNumber(tx, labId))));
    expect(new Set(taken).size).toBe(20);
    expect(taken.some((n) => numbers.includes(n))).toBe(false);
  }, 240_000);

  it("releaseReport refuses a unit whose plan is incomplete and names the missing step", async () => {
    const unitId = await createUnit(labId, rating, serial());
    await storeAnalysedCapture(labId, unitId, rating, rating.steps[0]!.id, 300);
    await expect(releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 422, message: expect.stringContaining("Open circuit, second run") });
    expect(await getDb().select().from(reports).where(eq(reports.unitId, unitId))).toHaveLength(0);
  });

  it("releaseReport releases an incomplete unit accepted with concession and says so in the report", async () => {
    const unitId = await createUnit(labId, rating, serial());
    await storeAnalysedCapture(labId, unitId, rating, rating.steps[0]!.id, 310);
    await getDb().update(units).set({ disposition: "accepted-with-concession" }).where(eq(units.id, unitId));
    const row = await releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS);
    const text = wholeText(writeTemp((await readReleasedReport(qa, row.id)).bytes));
    expect(text).toContain('Plan step "Open circuit, second run" has no capture of record');
    expect(text).toContain("accepted under the client's concession");
  });

  it("releaseReport refuses a scrapped unit", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 320);
    await getDb().update(units).set({ disposition: "scrapped" }).where(eq(units.id, unitId));
    await expect(releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 422, message: expect.stringContaining("scrapped") });
  });

  it("releaseReport refuses a wrong password (403) and stores neither a signature nor a report", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 330);
    await expect(releaseReport(qa, { unitId, password: "not-the-password" }, ADDRESS)).rejects.toMatchObject({ status: 403 });
    expect(await getDb().select().from(reports).where(eq(reports.unitId, unitId))).toHaveLength(0);
    expect(await getDb().select().from(signatures).where(and(eq(signatures.subjectId, unitId), eq(signatures.purpose, "release")))).toHaveLength(0);
    // The right password afterwards works (and clears the failure count).
    expect((await releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS)).revision).toBe(1);
  });

  it("releaseReport refuses an operator and a client user (403), and another lab's unit answers 404", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 340);
    await expect(releaseReport(operator, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 403 });
    await expect(releaseReport(client, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 403 });
    const other = await demoActorOfOtherLab();
    await expect(releaseReport(other, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 404 });
  });
});

async function demoActorOfOtherLab(): Promise<Actor> {
  const { actorForStoredUser } = await import("@/lib/dal/actor");
  const [row] = await getDb().select().from(users).where(eq(users.email, "wren.obuya@calderwick.example"));
  return actorForStoredUser(row!.id);
}

describe("supersedeReport and withdrawReport", () => {
  it("supersedeReport keeps the number, adds a revision, marks the old one superseded; the verification says so; withdrawReport then marks it withdrawn", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 400);
    const first = await releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS);
    expect(supersedeInputSchema.safeParse({ unitId, password: DEMO_PASSWORD, reason: "" }).error?.issues[0]?.message).toMatch(/Say why/);
    await expect(releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS)).rejects.toMatchObject({ status: 409 });
    const second = await supersedeReport(qa, { unitId, password: DEMO_PASSWORD, reason: "Client name corrected" }, ADDRESS);
    expect(second.number).toBe(first.number);
    expect(second.revision).toBe(2);
    const [old] = await getDb().select().from(reports).where(eq(reports.id, first.id));
    expect(old?.status).toBe("superseded");
    expect(old?.supersededById).toBe(second.id);
    const text = wholeText(writeTemp((await readReleasedReport(qa, second.id)).bytes));
    expect(text).toContain("replaces revision 1: Client name corrected");
    expect(text).toContain("reviewed and approved this revision, replacing the earlier one");

    const view = await verifyReportNumber(first.number, "203.0.113.1");
    if (typeof view === "string") throw new Error(view);
    expect(view.revisions.map((r) => [r.revision, r.statusWords, r.sha256])).toEqual([[1, "superseded by revision 2", first.sha256], [2, "valid", second.sha256]]);
    expect(view.serial).toBe((await getDb().select({ s: units.serial }).from(units).where(eq(units.id, unitId)))[0]?.s);
    expect(view.client).toBe("Kestrum Generators");

    await withdrawReport(qa, { unitId, password: DEMO_PASSWORD, reason: "Wrong unit tested" }, ADDRESS);
    const after = await verifyReportNumber(first.number, "203.0.113.1");
    if (typeof after === "string") throw new Error(after);
    expect(after.revisions.map((r) => r.statusWords)).toEqual(["superseded by revision 2", "withdrawn"]);
    await expect(withdrawReport(qa, { unitId, password: DEMO_PASSWORD, reason: "Again and again" }, ADDRESS)).rejects.toMatchObject({ status: 409 });
  });
});

describe("readReleasedReport, renderUnitDraft, verifyReportNumber", () => {
  it("readReleasedReport serves the unit's client, answers another client 404, and refuses bytes that no longer match the recorded sha256", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 500);
    const row = await releaseReport(qa, { unitId, password: DEMO_PASSWORD }, ADDRESS);
    expect(sha256Hex((await readReleasedReport(client, row.id)).bytes)).toBe(row.sha256);
    const { actorForStoredUser } = await import("@/lib/dal/actor");
    const [poldane] = await getDb().select().from(users).where(eq(users.email, "sela.ambrose@poldane.example"));
    await expect(readReleasedReport(await actorForStoredUser(poldane!.id), row.id)).rejects.toMatchObject({ status: 404 });
    // The store's object replaced behind the app's back: the download is refused, never re-rendered.
    await getS3().send(new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: row.objectKey, Body: Buffer.from("%PDF-1.7 tampered"), ContentType: "application/pdf" }));
    await expect(readReleasedReport(qa, row.id)).rejects.toMatchObject({ status: 500, message: expect.stringContaining("does not match its recorded checksum") });
  });

  it("renderUnitDraft marks DRAFT on every page, carries no verification address, and answers a client 404", async () => {
    const unitId = await completeUnit(labId, rating, serial(), 600);
    const { bytes } = await renderUnitDraft(qa, unitId);
    const file = writeTemp(bytes);
    const count = pdfPageCount(file);
    expect(count).toBeGreaterThan(1);
    pageTexts(file, count).forEach((page, i) => {
      expect(page, `page ${i + 1}`).toContain("DRAFT");
      expect(page, `page ${i + 1}`).toContain(`Page ${i + 1} of ${count}`);
    });
    expect(wholeText(file)).not.toContain("/verify/");
    await expect(renderUnitDraft(client, unitId)).rejects.toMatchObject({ status: 404 });
  });

  it("verifyReportNumber answers an unknown and a malformed number alike, and limits look-ups per address", async () => {
    expect(await verifyReportNumber("NOPE-999999", "203.0.113.9")).toBe("unknown");
    expect(await verifyReportNumber("../etc/passwd", "203.0.113.9")).toBe("unknown");
    const answers: string[] = [];
    for (let i = 0; i < 35; i++) {
      const v = await verifyReportNumber("NOPE-000001", "203.0.113.10");
      answers.push(typeof v === "string" ? v : "found");
    }
    // 30 per minute per address (lib/server/reports/verify-limit.ts); the two earlier look-ups were from another address.
    expect(answers.filter((a) => a === "unknown")).toHaveLength(30);
    expect(answers.slice(30)).toEqual(["limited", "limited", "limited", "limited", "limited"]);
    expect(await verifyReportNumber("NOPE-000001", "203.0.113.11")).toBe("unknown");
  });
});
