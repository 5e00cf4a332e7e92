import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { signatures, unitEvents, units } from "@/db/schema";
import { authenticate } from "@/lib/auth/authenticate";
import { HttpError } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { actorForStoredUser, requireStationActor, type Actor } from "@/lib/dal/actor";
import { changeDisposition, changeDispositions, type DispositionInput } from "@/lib/dal/dispositions";
import { assignForReview, getUnitHistoryView } from "@/lib/dal/review";
import { addUnitNote } from "@/lib/dal/unit-notes";
import { InputError } from "@/lib/dal/setup-access";
import { signWithPassword } from "@/lib/dal/signatures";
import { seededOrgs } from "./helpers";
import { closeConnections, createStationToken } from "./pipeline-support";
import { failuresOf, makeSigner, makeUnit, PASSWORD, seededRating } from "./dispositions-support";
import { run, SEEDED, sessionUserOf } from "./ratings-support";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));

let rating: { id: string; labId: string; organisationId: string };
let signer: { id: string; email: string; name: string };
let signerActor: Actor;
const actors = {} as Record<"admin" | "operator" | "qa" | "manufacturer" | "station", Actor>;
let address = 0;
/** A client address of its own per call, so the per-address limit of one test never touches another. */
const nextAddress = () => `198.51.100.${(address += 1)}-${run}`;

const input = (unitId: string, fields: Partial<DispositionInput>): DispositionInput => ({ unitId, to: "accepted", reason: "", concessionRef: "", password: "", ...fields });

/** The refusal's field messages (InputError), or the HttpError's status and message. */
async function refusal(call: () => Promise<unknown>): Promise<Record<string, string>> {
  try {
    await call();
  } catch (err) {
    if (err instanceof InputError) return err.fields;
    if (err instanceof HttpError) return { status: String(err.status), message: err.message };
    throw err;
  }
  throw new Error("the call was not refused");
}

const dispositionOf = async (unitId: string) => (await getDb().select({ d: units.disposition }).from(units).where(eq(units.id, unitId)))[0]?.d;

beforeAll(async () => {
  const { lab } = await seededOrgs();
  rating = (await seededRating(lab.id, "KG-45T")).rating;
  signer = await makeSigner(lab.id, "disp");
  signerActor = await actorForStoredUser(signer.id);
  for (const role of ["admin", "operator", "qa", "manufacturer"] as const) actors[role] = await actorForStoredUser((await sessionUserOf(SEEDED[role])).id);
  const { token } = await createStationToken(lab.id);
  actors.station = await requireStationActor(new Request("http://test/api/v1/units", { headers: { authorization: `Bearer ${token}` } }));
});
afterAll(closeConnections);

describe("changeDisposition: the rules", () => {
  it("changeDisposition refuses plain acceptance of an outside unit, naming why, and leaves it open", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const fields = await refusal(() => changeDisposition(signerActor, input(unit.id, { reason: "Looks fine to me" }), nextAddress()));
    expect(fields.to).toMatch(/Plain acceptance is refused: its latest verdict is outside tolerance.*concession/);
    expect(await dispositionOf(unit.id)).toBe("open");
  });

  it("changeDisposition refuses plain acceptance of an incomplete or inconclusive unit, naming why", async () => {
    const incomplete = await makeUnit(rating, { planState: "incomplete", latestOverall: "pass" });
    expect((await refusal(() => changeDisposition(signerActor, input(incomplete.id, { reason: "Looks fine to me" }), nextAddress()))).to).toMatch(/test plan is not complete/);
    const inconclusive = await makeUnit(rating, { planState: "complete-within", latestOverall: "inconclusive" });
    expect((await refusal(() => changeDisposition(signerActor, input(inconclusive.id, { reason: "Looks fine to me" }), nextAddress()))).to).toMatch(/latest verdict is inconclusive/);
  });

  it("changeDisposition accepts a complete-and-within unit plainly, unsigned, with its reason in the history", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "pass" });
    expect(await changeDisposition(signerActor, input(unit.id, { reason: "All plan steps within" }), nextAddress())).toEqual({ to: "accepted", signed: false });
    const [event] = await getDb().select().from(unitEvents).where(eq(unitEvents.unitId, unit.id));
    expect(event).toMatchObject({ kind: "disposition", fromDisposition: "open", toDisposition: "accepted", comment: "All plan steps within", signatureId: null });
  });

  it("changeDisposition requires a reason for every change", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "pass" });
    for (const to of ["accepted", "rework", "scrapped", "accepted-with-concession"] as const) {
      const fields = await refusal(() => changeDisposition(signerActor, input(unit.id, { to, reason: "  ", concessionRef: "KC-1", password: PASSWORD }), nextAddress()));
      expect(fields.reason).toMatch(/needs a reason/);
    }
    expect(await dispositionOf(unit.id)).toBe("open");
  });

  it("changeDisposition refuses a concession without the client's reference or without a password, and signs none", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const noRef = await refusal(() => changeDisposition(signerActor, input(unit.id, { to: "accepted-with-concession", reason: "Client accepts the 5th harmonic", password: PASSWORD }), nextAddress()));
    expect(noRef.concessionRef).toMatch(/client's concession reference/);
    const noPassword = await refusal(() => changeDisposition(signerActor, input(unit.id, { to: "accepted-with-concession", reason: "Client accepts the 5th harmonic", concessionRef: "KC-2026-014" }), nextAddress()));
    expect(noPassword.password).toMatch(/Re-enter your password/);
    expect(await getDb().select().from(signatures).where(eq(signatures.subjectId, unit.id))).toHaveLength(0);
    expect(await dispositionOf(unit.id)).toBe("open");
  });

  it("changeDisposition accepts an outside unit with concession, reference and password, storing the signature on the event", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const result = await changeDisposition(signerActor, input(unit.id, { to: "accepted-with-concession", reason: "Client accepts the 5th harmonic", concessionRef: "KC-2026-014", password: PASSWORD }), nextAddress());
    expect(result).toEqual({ to: "accepted-with-concession", signed: true });
    const [event] = await getDb().select().from(unitEvents).where(eq(unitEvents.unitId, unit.id));
    expect(event).toMatchObject({ toDisposition: "accepted-with-concession", concessionRef: "KC-2026-014" });
    const [signature] = await getDb().select().from(signatures).where(eq(signatures.id, event?.signatureId ?? "00000000-0000-0000-0000-000000000000"));
    expect(signature).toMatchObject({ signerId: signer.id, signerName: signer.name, signerRole: "Quality engineer", purpose: "concession", subjectKind: "unit", subjectId: unit.id, meaning: "accepted the unit under the client's concession" });

    session.current = await sessionUserOf(signer.email);
    const history = await getUnitHistoryView(unit.id);
    expect(history.events[0]).toMatchObject({ actor: signer.name, concessionRef: "KC-2026-014", signature: { name: signer.name, role: "Quality engineer", meaning: "accepted the unit under the client's concession" } });
    expect(history.events[0]?.signature?.at).toBeInstanceOf(Date);
  });

  it("changeDisposition lets a closed unit only be reopened, with a reason and a reopen signature; scrapped -> open likewise", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    await changeDisposition(signerActor, input(unit.id, { to: "scrapped", reason: "Stator winding burnt", password: PASSWORD }), nextAddress());
    expect(await dispositionOf(unit.id)).toBe("scrapped");
    expect((await refusal(() => changeDisposition(signerActor, input(unit.id, { to: "rework", reason: "Try a rewind" }), nextAddress()))).to).toMatch(/reopen it first/);
    expect((await refusal(() => changeDisposition(signerActor, input(unit.id, { to: "open", reason: "", password: PASSWORD }), nextAddress()))).reason).toMatch(/Reopening a closed unit needs a reason/);
    expect((await refusal(() => changeDisposition(signerActor, input(unit.id, { to: "open", reason: "Scrapped in error" }), nextAddress()))).password).toMatch(/Re-enter your password/);
    expect(await changeDisposition(signerActor, input(unit.id, { to: "open", reason: "Scrapped in error", password: PASSWORD }), nextAddress())).toEqual({ to: "open", signed: true });
    const purposes = (await getDb().select().from(signatures).where(eq(signatures.subjectId, unit.id))).map((s) => s.purpose).sort();
    expect(purposes).toEqual(["reopen", "scrap"]);
  });

  it("addUnitNote and assignForReview still work on a closed unit: a disposition blocks nothing else", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    await changeDisposition(signerActor, input(unit.id, { to: "scrapped", reason: "Housing cracked", password: PASSWORD }), nextAddress());
    expect((await addUnitNote(signerActor, { unitId: unit.id, visibility: "internal", body: "Kept for the failure study" })).unitId).toBe(unit.id);
    expect(await assignForReview(signerActor, { unitIds: [unit.id], assigneeId: signer.id })).toBe(1);
  });
});

describe("changeDisposition: who may sign", () => {
  it("changeDisposition refuses an operator, a client user and a station key (403) and writes nothing", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    for (const who of ["operator", "manufacturer", "station"] as const) {
      const answer = await refusal(() => changeDisposition(actors[who], input(unit.id, { to: "scrapped", reason: "Not my call", password: PASSWORD }), nextAddress()));
      expect(answer.status, who).toBe("403");
    }
    expect(await dispositionOf(unit.id)).toBe("open");
    expect(await getDb().select().from(unitEvents).where(eq(unitEvents.unitId, unit.id))).toHaveLength(0);
  });

  it("signWithPassword refuses an operator and a client user for a concession even with their right password", async () => {
    const unit = await makeUnit(rating, {});
    for (const who of ["operator", "manufacturer"] as const) {
      const answer = await refusal(() => signWithPassword(actors[who], { password: PASSWORD, purpose: "concession", subjectKind: "unit", subjectId: unit.id, address: nextAddress() }));
      expect(answer.status, who).toBe("403");
    }
  });

  it("changeDisposition answers 404 for another lab's or a missing unit", async () => {
    const { secondLab } = await seededOrgs();
    // The second seeded lab tests the same client's KG-45T (db/seed-data.ts secondLab).
    const other = (await seededRating(secondLab.id, "KG-45T")).rating;
    const foreign = await makeUnit(other, { planState: "complete-within", latestOverall: "pass" });
    expect((await refusal(() => changeDisposition(signerActor, input(foreign.id, { reason: "Not ours" }), nextAddress()))).status).toBe("404");
    expect(await dispositionOf(foreign.id)).toBe("open");
    expect((await refusal(() => changeDisposition(signerActor, input("00000000-0000-4000-8000-000000000000", { reason: "Nobody" }), nextAddress()))).status).toBe("404");
  });
});

describe("changeDisposition: a wrong password", () => {
  it("changeDisposition refuses a wrong password, records nothing and counts it like a failed sign-in", async () => {
    const own = await makeSigner(rating.labId, "wrong");
    const actor = await actorForStoredUser(own.id);
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const from = nextAddress();
    const answer = await refusal(() => changeDisposition(actor, input(unit.id, { to: "scrapped", reason: "Stator winding burnt", password: "not-the-password" }), from));
    expect(answer).toMatchObject({ status: "403", message: expect.stringMatching(/not yours: nothing was signed/) });
    expect(await dispositionOf(unit.id)).toBe("open");
    expect(await getDb().select().from(signatures).where(eq(signatures.subjectId, unit.id))).toHaveLength(0);
    const failures = await failuresOf(own.email);
    expect(failures).toHaveLength(1);
    expect(failures[0]?.address).toBe(from);
  });

  it("changeDisposition's failures slow the account's next sign-in exactly as failed sign-ins do", async () => {
    const own = await makeSigner(rating.labId, "slow");
    const actor = await actorForStoredUser(own.id);
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    // SIGN_IN_MAX_ATTEMPTS is 8 in the test settings (scripts/lib-setup.sh): 8 free failures, then 1 s.
    for (let i = 0; i < 8; i += 1) {
      await refusal(() => changeDisposition(actor, input(unit.id, { to: "scrapped", reason: "Stator winding burnt", password: `guess-${i}` }), nextAddress()));
    }
    expect(await failuresOf(own.email)).toHaveLength(8);
    const started = Date.now();
    const result = await authenticate(own.email, PASSWORD, nextAddress());
    expect(result.ok).toBe(true);
    expect(Date.now() - started).toBeGreaterThanOrEqual(950);
    // The right password clears the count, as at the sign-in page.
    expect(await failuresOf(own.email)).toHaveLength(0);
  });
});

describe("changeDispositions (bulk)", () => {
  it("changeDispositions applies one reason to each unit the rules allow and reports the others unchanged", async () => {
    const within = await makeUnit(rating, { planState: "complete-within", latestOverall: "pass" });
    const outside = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const results = await changeDispositions(signerActor, { unitIds: [within.id, outside.id], to: "accepted", reason: "Batch 14 reviewed" }, nextAddress());
    expect(results.map((r) => r.ok)).toEqual([true, false]);
    expect(results[1]?.message).toMatch(/outside tolerance/);
    expect(await dispositionOf(within.id)).toBe("accepted");
    expect(await dispositionOf(outside.id)).toBe("open");
    const [event] = await getDb().select().from(unitEvents).where(eq(unitEvents.unitId, within.id));
    expect(event?.comment).toBe("Batch 14 reviewed");
  });

  it("changeDispositions refuses an empty reason for every unit", async () => {
    const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
    const results = await changeDispositions(signerActor, { unitIds: [unit.id], to: "rework", reason: "" }, nextAddress());
    expect(results[0]).toMatchObject({ ok: false, message: expect.stringMatching(/needs a reason/) });
  });
});
