import { and, eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { analyses, captures, mailOutbox, notificationPrefs } from "@/db/schema";
import { getEnv } from "@/lib/server/env";
import { alertOnCaptureResult } from "@/lib/server/mail-capture-alerts";
import { queueMail } from "@/lib/server/mail-outbox";
import { closeMailQueue } from "@/lib/server/mail-queue";
import { notifyReportEvent } from "@/lib/server/mail-report-events";
import { startTcpProxy, type TcpProxy } from "@/tests/support/tcp-proxy";
import { seededOrgs } from "./helpers";
import { closeConnections, startWorker } from "./pipeline-support";
import { run, SEEDED, sessionUserOf } from "./ratings-support";
import { firstUnitOf, insertReport } from "./report-fixtures";

let labId: string;
let unit: { id: string; serial: string };
let qaId: string;

async function mailsWhere(dedupePrefix: string) {
  return getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `${dedupePrefix}%`));
}

async function failingCapture(tag: string, overall: "fail" | "inconclusive" | "pass") {
  const [c] = await getDb().insert(captures).values({
    unitId: unit.id, labId, testKind: "no-load", originalName: `alert-${run}-${tag}.csv`, objectKey: `test/alert-${run}-${tag}`, sizeBytes: 10,
    sha256: `${run}${tag}`.padEnd(64, "0").slice(0, 64), state: "analysed",
  }).returning();
  await getDb().insert(analyses).values({ captureId: c!.id, analysisVersion: "test", toleranceDigest: "t", report: {}, overall });
  return c!.id;
}

beforeAll(async () => {
  const orgs = await seededOrgs();
  labId = orgs.lab.id;
  unit = await firstUnitOf(labId, orgs.kestrum.id);
  qaId = (await sessionUserOf(SEEDED.qa)).id;
  await getDb().insert(notificationPrefs).values({ userId: qaId, prefs: { captureAlerts: "hourly" } })
    .onConflictDoUpdate({ target: notificationPrefs.userId, set: { prefs: { captureAlerts: "hourly" } } });
});
afterAll(async () => {
  await closeMailQueue();
  await closeConnections();
});

describe("alertOnCaptureResult (capture alerts)", () => {
  // A fresh hour per run (the test database is kept between runs); counts are per engineer, since other
  // tests may add quality engineers to the lab.
  const hourOf = (d: Date) => d.toISOString().slice(0, 13);
  const base = new Date(Date.UTC(2031, 0, 1, 10, 5) + Number(run) * 7_200_000);
  const mine = async (at: Date) => (await mailsWhere(`capture-alert:${unit.id}:${qaId}:${hourOf(at)}`)).length;

  it("queues one alert per unit and engineer per hour; a second result in the hour adds none; a pass adds none", async () => {
    expect(await mine(base)).toBe(0);
    await alertOnCaptureResult(labId, await failingCapture("a", "fail"), { now: base, enqueue: false });
    expect(await mine(base)).toBe(1);
    await alertOnCaptureResult(labId, await failingCapture("b", "inconclusive"), { now: new Date(base.getTime() + 20 * 60_000), enqueue: false });
    await alertOnCaptureResult(labId, await failingCapture("c", "pass"), { now: base, enqueue: false });
    const rows = await mailsWhere(`capture-alert:${unit.id}:${qaId}:${hourOf(base)}`);
    expect(rows).toHaveLength(1);
    expect(rows[0]!.subject).toContain("outside tolerance");
    expect(rows[0]!.htmlBody).toContain("<a href=");
    const next = new Date(base.getTime() + 60 * 60_000);
    await alertOnCaptureResult(labId, await failingCapture("d", "fail"), { now: next, enqueue: false });
    expect(await mine(next)).toBe(1);
  });

  it("alertOnCaptureResult sends nothing to an engineer who chose the daily digest", async () => {
    await getDb().update(notificationPrefs).set({ prefs: { captureAlerts: "daily-digest" } }).where(eq(notificationPrefs.userId, qaId));
    const at = new Date(base.getTime() + 5 * 3_600_000);
    try {
      await alertOnCaptureResult(labId, await failingCapture("e", "fail"), { now: at, enqueue: false });
      expect(await mine(at)).toBe(0);
    } finally {
      await getDb().update(notificationPrefs).set({ prefs: { captureAlerts: "hourly" } }).where(eq(notificationPrefs.userId, qaId));
    }
  });
});

describe("notifyReportEvent", () => {
  it("queues a mail with a text and an HTML part and a portal link, from the lab's name, once per report, event and user", async () => {
    const orgs = await seededOrgs();
    const { row } = await insertReport({ labId, signerId: qaId, clientId: orgs.kestrum.id, unit, number: `M${run}` });
    expect((await notifyReportEvent(row.id, "released")).queued).toBeGreaterThanOrEqual(1);
    expect((await notifyReportEvent(row.id, "released")).queued).toBe(0);
    const [mail] = await getDb().select().from(mailOutbox).where(and(like(mailOutbox.dedupeKey, `report:${row.id}:released:%`)));
    expect(mail!.fromName).toBe(orgs.lab.name);
    expect(mail!.textBody).toContain(`/portal?serial=${encodeURIComponent(unit.serial)}`);
    expect(mail!.htmlBody).toContain("Open the report in your portal");
    expect(mail!.textBody).not.toMatch(/%PDF/);
    expect((await notifyReportEvent("00000000-0000-4000-8000-000000000000", "withdrawn")).queued).toBe(0);
  });
});

describe("the mail job (worker)", () => {
  let proxy: TcpProxy | undefined;
  afterAll(async () => proxy?.close());

  it("a mail queued while the mail service is down is retried and sent once it is back; meanwhile the row says so in a sentence", async () => {
    proxy = await startTcpProxy(getEnv().SMTP_PORT);
    const worker = await startWorker({ SMTP_PORT: String(proxy.port) });
    try {
      await proxy.cut();
      const key = `retry-test:${run}`;
      expect(await queueMail({
        labId, toUserId: qaId, toAddress: "ines.vardy@harrowgate.example", kind: "test", subject: `Retry test ${run}`,
        textBody: "plain", htmlBody: "<p>html</p>", fromName: "Harrowgate", dedupeKey: key,
      })).toBe("queued");
      let row;
      for (let i = 0; i < 60; i += 1) {
        [row] = await mailsWhere(key);
        if (row && row.attempts >= 2) break;
        await new Promise((r) => setTimeout(r, 500));
      }
      expect(row!.status, worker.output()).toBe("queued");
      expect(row!.attempts).toBeGreaterThanOrEqual(2);
      expect(row!.lastError).toMatch(/did not answer/);
      expect(row!.lastError).not.toMatch(/127\.0\.0\.1|:\d{2,5}|ECONN/);
      await proxy.restore();
      for (let i = 0; i < 80; i += 1) {
        [row] = await mailsWhere(key);
        if (row?.status === "sent") break;
        await new Promise((r) => setTimeout(r, 500));
      }
      expect(row!.status, worker.output()).toBe("sent");
      expect(row!.sentAt).not.toBeNull();
    } finally {
      await proxy.restore().catch(() => undefined);
      await worker.stop();
    }
  }, 90_000);
});
