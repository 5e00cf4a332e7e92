import { and, eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { listLabManagers } from "@/db/queries/instruments";
import { getUnitBySerial } from "@/db/queries/units";
import { captureInstruments, mailOutbox, ratings } from "@/db/schema";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { HttpError } from "@/lib/auth/guards";
import type { Actor } from "@/lib/dal/actor";
import { confirmOverdueCapture, getCaptureInstruments, releaseBlockersFromInstruments } from "@/lib/dal/capture-instruments";
import { benchInstruments, createInstrument, listRegister, retireRegisterEntry, setBenchInstruments } from "@/lib/dal/instruments";
import { addDays, utcDay } from "@/lib/instruments/status";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { queueCalibrationReminders, reminderKey } from "@/worker/calibration-reminders";
import { GET as getInstruments, PUT as putInstruments } from "@/app/api/v1/captures/[id]/instruments/route";
import { closeConnections, createStationToken, demoActor, registerViaApi } from "./pipeline-support";
import { seededOrgs } from "./helpers";

const run = `${Date.now() % 1_000_000}`;
const today = utcDay(new Date());
let labId: string;
let token: string;
let stationId: string;
let admin: Actor;
let qa: Actor;
let operator: Actor;
let client: Actor;
let ratingId: string;

const entry = (tag: string, over: Record<string, unknown> = {}) => ({
  // Invented names that no browser test's label lookup ("Test", "Bench", …) can collide with on the upload form.
  kind: "voltage-probe", make: "Fenwick Metrology", model: "FM-1", serial: `SN-${tag}`, assetTag: tag,
  spec: { gainPercentOfReading: 1 }, calibratedOn: addDays(today, -300), calibrationDue: addDays(today, 60), calibrationNote: "", ...over,
});

async function refusal(work: Promise<unknown>): Promise<HttpError & { fields?: Record<string, string> }> {
  try {
    await work;
  } catch (err) {
    if (err instanceof HttpError) return err as HttpError & { fields?: Record<string, string> };
    throw err;
  }
  throw new Error("expected a refusal");
}

/** Registers a capture of a new unit (so other files' captures never mix in) through the bench API. */
async function registerNewUnitCapture(extra: Record<string, unknown>) {
  const serial = `INS-${run}-${Math.floor(Math.random() * 1e6)}`;
  const reg = await registerViaApi(token, makeThreePhaseCsv({ variant: Number(run) + serial.length }), { unitSerial: serial, newUnitRatingId: ratingId, confirmNewUnit: true, ...extra });
  return { reg, serial };
}

beforeAll(async () => {
  labId = (await seededOrgs()).lab.id;
  ({ token, stationId } = await createStationToken(labId));
  [admin, qa, operator, client] = await Promise.all([demoActor("admin"), demoActor("qa"), demoActor("operator"), demoActor("manufacturer")]);
  const rating = (await getDb().select().from(ratings).where(and(eq(ratings.labId, labId), eq(ratings.modelCode, "KG-45T"))).limit(1))[0];
  if (!rating) throw new Error("the seeded KG-45T rating is missing");
  ratingId = rating.id;
});
afterAll(closeConnections);

describe("instrument register authorization", () => {
  it("createInstrument lets a lab manager add an instrument; quality engineers read the register", async () => {
    const made = await createInstrument(admin, entry(`IA-${run}`));
    expect(made.assetTag).toBe(`IA-${run}`);
    expect((await listRegister(qa)).map((i) => i.assetTag)).toContain(`IA-${run}`);
  });

  it("createInstrument refuses a quality engineer (403); listRegister refuses an operator and a client (403)", async () => {
    expect((await refusal(createInstrument(qa, entry(`IQ-${run}`)))).status).toBe(403);
    expect((await refusal(listRegister(operator))).status).toBe(403);
    expect((await refusal(listRegister(client))).status).toBe(403);
  });

  it("createInstrument refuses a due date before the calibration date and a negative accuracy, naming the fields", async () => {
    const early = await refusal(createInstrument(admin, entry(`IX1-${run}`, { calibratedOn: addDays(today, -10), calibrationDue: addDays(today, -20) })));
    expect(early.status).toBe(400);
    expect(early.fields?.calibrationDue).toMatch(/before the calibration date/);
    const negative = await refusal(createInstrument(admin, entry(`IX2-${run}`, { spec: { gainPercentOfReading: -0.5 } })));
    expect(negative.fields?.["spec.gainPercentOfReading"]).toMatch(/cannot be negative/);
  });

  it("createInstrument refuses an asset tag already in the register (409, field named)", async () => {
    const again = await refusal(createInstrument(admin, entry(`IA-${run}`)));
    expect(again.status).toBe(409);
    expect(again.fields?.assetTag).toMatch(/already/);
  });
});

describe("bench API instruments field", () => {
  it("POST /api/v1/captures refuses an unknown instrument with 400 naming the field, and stores nothing", async () => {
    const { reg, serial } = await registerNewUnitCapture({ instruments: [`IZ-${run}`] });
    expect(reg.status).toBe(400);
    expect(await getUnitBySerial({ kind: "lab", labId }, serial)).toBeUndefined();
    expect(reg.body.error).toMatch(/instruments\.0/);
    expect(reg.body.error).toMatch(new RegExp(`IZ-${run}`));
  });

  it("POST /api/v1/captures records the named instruments by asset tag, and the bench's default set when none are named", async () => {
    const named = await createInstrument(admin, entry(`IN-${run}`, { kind: "oscilloscope" }));
    const preset = await createInstrument(admin, entry(`IB-${run}`, { kind: "tachometer", spec: { speedPercentOfReading: 0.05 } }));
    const before = (await benchInstruments(admin, stationId)).map((r) => r.instrument.id);
    await setBenchInstruments(admin, stationId, [preset.id]);
    const withNamed = (await registerNewUnitCapture({ instruments: [named.assetTag.toLowerCase()] })).reg;
    expect(withNamed.status).toBe(201);
    const rowsNamed = await getDb().select().from(captureInstruments).where(eq(captureInstruments.captureId, withNamed.body.capture!.id));
    expect(rowsNamed.map((r) => r.instrumentId)).toEqual([named.id]);
    const fromBench = (await registerNewUnitCapture({})).reg;
    expect(fromBench.status).toBe(201);
    const rowsBench = await getDb().select().from(captureInstruments).where(eq(captureInstruments.captureId, fromBench.body.capture!.id));
    expect(rowsBench.map((r) => r.instrumentId)).toEqual([preset.id]);
    await setBenchInstruments(admin, stationId, before); // the demo bench keeps its seeded set
  });
});

describe("PUT /api/v1/captures/{id}/instruments", () => {
  const call = (method: "GET" | "PUT", id: string, body?: unknown) =>
    new Request(`http://test/api/v1/captures/${id}/instruments`, { method, headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

  it("PUT /api/v1/captures/{id}/instruments replaces the list by asset tag and refuses an unknown one naming the field", async () => {
    const scope = await createInstrument(admin, entry(`IP-${run}`, { kind: "oscilloscope" }));
    const { reg } = await registerNewUnitCapture({ instruments: [] });
    const id = reg.body.capture!.id;
    const params = { params: Promise.resolve({ id }) };
    const bad = await putInstruments(call("PUT", id, { instruments: [scope.assetTag, `IG-${run}`] }), params);
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/instruments\.1/);
    const ok = await putInstruments(call("PUT", id, { instruments: [{ instrument: scope.assetTag, channel: "vab" }] }), params);
    expect(ok.status).toBe(200);
    const read = (await (await getInstruments(call("GET", id), params)).json()) as { instruments: { assetTag: string; channel: string }[]; warnings: string[] };
    expect(read.instruments.map((i) => [i.assetTag, i.channel])).toEqual([[scope.assetTag, "vab"]]);
    expect(read.warnings).toEqual([]);
  });
});

describe("overdue instruments and release", () => {
  it("getCaptureInstruments warns on an instrument past its due date at upload; releaseBlockersFromInstruments refuses until a quality engineer confirms", async () => {
    const overdue = await createInstrument(admin, entry(`IL-${run}`, { calibratedOn: addDays(today, -400), calibrationDue: addDays(today, -1) }));
    const { reg } = await registerNewUnitCapture({ instruments: [overdue.assetTag] });
    expect(reg.status).toBe(201);
    const captureId = reg.body.capture!.id;
    const summary = await getCaptureInstruments(qa, captureId);
    expect(summary?.instruments[0]).toMatchObject({ assetTag: overdue.assetTag, overdueAtUpload: true });
    expect(summary?.warnings.join(" ")).toMatch(new RegExp(`${overdue.assetTag}.*past its calibration due date`));
    const unitId = (reg.body.capture as unknown as { unitId: string }).unitId;
    const blockers = await releaseBlockersFromInstruments(qa, unitId);
    expect(blockers).toHaveLength(1);
    expect(blockers[0]).toMatch(new RegExp(overdue.assetTag));

    expect((await refusal(confirmOverdueCapture(operator, { captureId, reason: "Checked against the reference tachometer", password: DEMO_PASSWORD }, "127.0.0.1"))).status).toBe(403);
    expect((await refusal(confirmOverdueCapture(qa, { captureId, reason: "short", password: DEMO_PASSWORD }, "127.0.0.1"))).fields?.reason).toMatch(/10 characters/);
    expect((await refusal(confirmOverdueCapture(qa, { captureId, reason: "Checked against the reference tachometer", password: "not-the-password" }, "127.0.0.1"))).status).toBe(403);
    expect(await releaseBlockersFromInstruments(qa, unitId)).toHaveLength(1);

    await confirmOverdueCapture(qa, { captureId, reason: "Checked against the reference tachometer on the same day", password: DEMO_PASSWORD }, "127.0.0.1");
    expect(await releaseBlockersFromInstruments(qa, unitId)).toEqual([]);
    expect((await getCaptureInstruments(qa, captureId))?.confirmation?.reason).toMatch(/reference tachometer/);
  });

  it("releaseBlockersFromInstruments answers 404 for another organisation's unit, like a missing one", async () => {
    expect((await refusal(releaseBlockersFromInstruments(qa, "00000000-0000-4000-8000-000000000000"))).status).toBe(404);
  });

  it("retireRegisterEntry keeps a retired instrument on the captures that used it and refuses it for new ones", async () => {
    const old = await createInstrument(admin, entry(`IR-${run}`));
    const { reg } = await registerNewUnitCapture({ instruments: [old.assetTag] });
    await retireRegisterEntry(admin, old.id);
    const summary = await getCaptureInstruments(admin, reg.body.capture!.id);
    expect(summary?.instruments.map((i) => [i.assetTag, i.retired])).toEqual([[old.assetTag, true]]);
    const again = (await registerNewUnitCapture({ instruments: [old.assetTag] })).reg;
    expect(again.status).toBe(400);
    expect(again.body.error).toMatch(/retired/);
  });
});

describe("queueCalibrationReminders", () => {
  it("queueCalibrationReminders queues one mail per lab manager for an instrument due within 14 days, once however often it runs", async () => {
    const soon = await createInstrument(admin, entry(`IS-${run}`, { calibrationDue: addDays(today, 14) }));
    const later = await createInstrument(admin, entry(`IT-${run}`, { calibrationDue: addDays(today, 15) }));
    await queueCalibrationReminders(today, "http://test");
    await queueCalibrationReminders(today, "http://test");
    const rows = await getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `calibration-due:${soon.id}:%`));
    const managers = await listLabManagers(labId);
    expect(rows).toHaveLength(managers.length);
    expect(rows.map((r) => r.dedupeKey)).toContain(reminderKey(soon.id, addDays(today, 14), admin.userId!));
    expect(rows[0]?.subject).toMatch(new RegExp(soon.assetTag));
    expect(await getDb().select().from(mailOutbox).where(like(mailOutbox.dedupeKey, `calibration-due:${later.id}:%`))).toHaveLength(0);
  });
});
