import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures } from "@/db/schema";
import { getRatingForRegistration } from "@/db/queries/units";
import { profileFromPreset, type ToleranceProfile } from "@/lib/analysis";
import { actorForStoredUser, type Actor } from "@/lib/dal/actor";
import { createClient } from "@/lib/dal/clients";
import { changePlanStep, getPlanView, replacePlan } from "@/lib/dal/rating-plans";
import { getProfileHistory, rejudgeRating, saveProfileVersion } from "@/lib/dal/rating-profiles";
import { createRating, setRatingRetired, updateRating } from "@/lib/dal/ratings";
import { InputError } from "@/lib/dal/setup-access";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, createStationToken, startWorker, uploadViaApi, waitForState, type WorkerProcess } from "./pipeline-support";
import type { SessionUser } from "@/lib/auth/options";
import { alternator, run, SEEDED, sessionUserOf } from "./ratings-support";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));

let admin: Actor;
let clientId: string;
let labId: string;

/** The refusal's field map, or a failure when the call was accepted. */
async function refusal(call: Promise<unknown>): Promise<Record<string, string>> {
  try {
    await call;
  } catch (err) {
    if (err instanceof InputError) return err.fields;
    throw err;
  }
  throw new Error("the call was accepted");
}

const newRating = (code: string, extra: Record<string, unknown> = {}) =>
  createRating(admin, { clientId, modelCode: code, title: `Test alternator ${code}`, nameplate: alternator, presetId: "iec-60034-1", ...extra });

beforeAll(async () => {
  const user = await sessionUserOf(SEEDED.admin);
  session.current = user;
  labId = user.organisationId;
  admin = (await actorForStoredUser(user.id));
  clientId = (await createClient({ name: `Versioning client ${run}`, contactEmail: "qa@client.example", referenceCode: `VC-${run}` })).id;
});
afterAll(closeConnections);

describe("createRating and updateRating: refusals name the field", () => {
  it("createRating makes profile version 1 from the preset (IEC 60034-1: voltage ±5 %, frequency ±2 %)", async () => {
    const rating = await newRating(`V1-${run}`);
    const [v1] = await getProfileHistory(admin, rating.id);
    expect(v1?.version).toBe(1);
    expect(v1?.profile).toEqual(profileFromPreset("iec-60034-1", alternator));
    // IEC 60034-1 zone A as the preset states it (from memory, marked "source not verified").
    expect(v1?.profile?.checks.voltage).toMatchObject({ lowerPercent: -5, upperPercent: 5 });
    expect(v1?.profile?.checks.frequency).toMatchObject({ lowerPercent: -2, upperPercent: 2 });
  });

  it("createRating refuses a duplicate model code for the same client with modelCode named", async () => {
    await newRating(`DUP-${run}`);
    const fields = await refusal(newRating(`dup-${run}`));
    expect(fields.modelCode).toMatch(/already has a rating with model code/);
  });

  it("createRating refuses a nameplate whose frequency disagrees with poles and speed, naming nameplate.frequencyHz", async () => {
    const fields = await refusal(newRating(`F-${run}`, { nameplate: { ...alternator, frequencyHz: 60 } }));
    expect(fields["nameplate.frequencyHz"]).toMatch(/f = p·n\/120/);
  });

  it("updateRating refuses a model code another rating of the client uses", async () => {
    const a = await newRating(`UA-${run}`);
    await newRating(`UB-${run}`);
    expect((await refusal(updateRating(admin, a.id, { modelCode: `UB-${run}` }))).modelCode).toBeDefined();
    expect((await updateRating(admin, a.id, { title: "Renamed" })).title).toBe("Renamed");
  });
});

describe("saveProfileVersion: versions and refusals", () => {
  let ratingId: string;
  let base: ToleranceProfile;
  beforeAll(async () => {
    ratingId = (await newRating(`P-${run}`)).id;
    base = (await getProfileHistory(admin, ratingId))[0]!.profile!;
  });
  const withCheck = (id: string, rule: unknown) => ({ ...base, checks: { ...base.checks, [id]: rule } });
  const src = { document: "Lab's own limit", clause: "", verified: false };

  it("saveProfileVersion refuses a lower limit above the upper, naming checks.voltage.lowerPercent", async () => {
    const fields = await refusal(saveProfileVersion(admin, ratingId, { profile: withCheck("voltage", { required: true, source: src, lowerPercent: -1, upperPercent: -2 }), reason: "tighter" }));
    expect(Object.keys(fields).some((k) => k.startsWith("profile.checks.voltage."))).toBe(true);
    const equal = await refusal(saveProfileVersion(admin, ratingId, { profile: withCheck("voltage", { required: true, source: src, lowerPercent: 0, upperPercent: 0 }), reason: "tighter" }));
    expect(equal["profile.checks.voltage.lowerPercent"]).toBe("The lower limit must be below the upper limit");
  });

  it("saveProfileVersion refuses a negative tolerance and a missing band, naming the field", async () => {
    const negative = await refusal(saveProfileVersion(admin, ratingId, { profile: withCheck("thd", { required: true, source: src, maxPercent: -1 }), reason: "typo" }));
    expect(negative["profile.checks.thd.maxPercent"]).toBe("Limit cannot be negative");
    const missing = await refusal(saveProfileVersion(admin, ratingId, { profile: withCheck("frequency", { required: true, source: src }), reason: "no band" }));
    expect(missing["profile.checks.frequency.lowerPercent"]).toMatch(/must be a number/);
    const noReason = await refusal(saveProfileVersion(admin, ratingId, { profile: base, reason: "" }));
    expect(noReason.reason).toMatch(/Say why/);
  });

  it("saveProfileVersion makes a new version each time and leaves earlier ones as they were", async () => {
    const before = await getProfileHistory(admin, ratingId);
    const saved = await saveProfileVersion(admin, ratingId, { profile: withCheck("voltage", { required: true, source: src, lowerPercent: -3, upperPercent: 3 }), reason: "Client asks for ±3 %" });
    expect(saved.version).toBe(before[0]!.version + 1);
    const after = await getProfileHistory(admin, ratingId);
    expect(after[0]?.reason).toBe("Client asks for ±3 %");
    expect(after[0]?.author).toBe("Maren Ilsley");
    expect(after[0]?.changes.join(" ")).toMatch(/Voltage: −5 % to \+5 % of rated voltage → −3 % to \+3 % of rated voltage/);
    expect(after.slice(1).map((v) => v.profile)).toEqual(before.map((v) => v.profile));
  });
});

describe("replacePlan and changePlanStep: plan steps", () => {
  let ratingId: string;
  beforeAll(async () => { ratingId = (await newRating(`PL-${run}`)).id; });

  it("changePlanStep adds, edits, reorders and retires steps", async () => {
    await changePlanStep(admin, ratingId, { kind: "add", step: { name: "No-load", testKind: "no-load", speedRpm: 1500, speedTolerancePercent: 2, requiredRoles: ["vab", "vbc", "vca"], checks: ["voltage", "frequency"] } });
    await changePlanStep(admin, ratingId, { kind: "add", step: { name: "Load", testKind: "load", speedMinRpm: 1450, speedMaxRpm: 1550, checks: ["voltage"] } });
    let plan = await getPlanView(admin, ratingId);
    // speed ± 2 % of 1500 rpm = 1470 … 1530 rpm (arithmetic).
    expect(plan[0]).toMatchObject({ name: "No-load", speedMinRpm: 1470, speedMaxRpm: 1530 });
    await changePlanStep(admin, ratingId, { kind: "move", stepId: plan[1]!.id, by: -1 });
    plan = await getPlanView(admin, ratingId);
    expect(plan.map((s) => s.name)).toEqual(["Load", "No-load"]);
    await changePlanStep(admin, ratingId, { kind: "edit", stepId: plan[0]!.id, step: { name: "Full load", testKind: "load", speedMinRpm: 1400, speedMaxRpm: 1600, checks: ["voltage"] } });
    await changePlanStep(admin, ratingId, { kind: "retire", stepId: plan[1]!.id });
    expect((await getPlanView(admin, ratingId)).map((s) => s.name)).toEqual(["Full load"]);
  });

  it("replacePlan refuses an empty speed window and a check the profile does not judge, naming the step's field", async () => {
    const empty = await refusal(replacePlan(admin, ratingId, { steps: [{ name: "Bad", testKind: "no-load", speedMinRpm: 1500, speedMaxRpm: 1500, checks: ["voltage"] }] }));
    expect(empty["steps.0.speedMaxRpm"]).toMatch(/speed window is empty/);
    const zero = await refusal(changePlanStep(admin, ratingId, { kind: "add", step: { name: "Bad", testKind: "no-load", speedRpm: 1500, speedTolerancePercent: 0, checks: ["voltage"] } }));
    expect(zero.speedTolerancePercent).toMatch(/speed window is empty/);
    // A wound-field alternator's profile marks the back-EMF constant not required.
    const unjudged = await refusal(replacePlan(admin, ratingId, { steps: [{ name: "Ke", testKind: "back-emf", speedMinRpm: 900, speedMaxRpm: 1100, checks: ["back-emf-constant"] }] }));
    expect(unjudged["steps.0.checks"]).toMatch(/does not judge Back-EMF constant/);
  });
});

describe("setRatingRetired", () => {
  it("a retired rating takes no new units and comes back when reinstated", async () => {
    const rating = await newRating(`R-${run}`);
    await setRatingRetired(admin, rating.id, true);
    expect(await getRatingForRegistration({ kind: "lab", labId }, rating.id)).toBeUndefined();
    await setRatingRetired(admin, rating.id, false);
    expect((await getRatingForRegistration({ kind: "lab", labId }, rating.id))?.id).toBe(rating.id);
  });
});

describe("versioning with a real analysis", () => {
  let worker: WorkerProcess;
  beforeAll(async () => { worker = await startWorker(); }, 60_000);
  afterAll(async () => { await worker?.stop(); });

  it("an analysis keeps the profile version it was judged with after a later edit; rejudgeRating judges with the new one", async () => {
    const rating = await newRating(`AN-${run}`);
    await replacePlan(admin, rating.id, { steps: [{ name: "No-load", testKind: "no-load", speedRpm: 1500, speedTolerancePercent: 2, checks: ["voltage", "frequency", "thd"] }] });
    const { token } = await createStationToken(labId);
    const serial = `AN-${run}-1`;
    const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: Number(run) % 9973 }), { unitSerial: serial, newUnitRatingId: rating.id, confirmNewUnit: true, speedRpm: 1500 });
    await waitForState(labId, id, ["analysed"]);
    const [first] = await getDb().select().from(analyses).where(eq(analyses.captureId, id));
    const history = await getProfileHistory(admin, rating.id);
    expect(first?.profileVersionId).toBe(history[0]?.id);
    const profile = history[0]!.profile!;
    await saveProfileVersion(admin, rating.id, { profile: { ...profile, checks: { ...profile.checks, thd: { ...profile.checks.thd, required: true, source: { document: "Lab's own limit", clause: "", verified: false }, maxPercent: 0.5 } } }, reason: "THD 0.5 % for this client" });
    const result = await rejudgeRating(admin, rating.id);
    expect(result.rejudged).toBe(1);
    const rows = await getDb().select().from(analyses).where(eq(analyses.captureId, id));
    const old = rows.find((r) => r.id === first!.id);
    const current = rows.find((r) => r.current);
    expect(old?.profileVersionId).toBe(history[0]?.id);
    expect(old?.current).toBe(false);
    expect(current?.kind).toBe("rejudge");
    expect(current?.profileVersionId).toBe((await getProfileHistory(admin, rating.id))[0]?.id);
    // The fixture has a 1 % fifth harmonic (tests/fixtures/pipeline/make-capture.ts), above the new 0.5 % THD limit.
    expect(current?.overall).toBe("fail");
    expect((await getDb().select().from(captures).where(eq(captures.id, id)))[0]?.state).toBe("analysed");
  });
});
