import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { evaluateUnitPlan, backfillPlanStandings, refreshUnitPlanState, standingOf } from "@/db/queries/unit-plan";
import { stepRecords, units, type StoredStepStanding, type Unit } from "@/db/schema";
import { actorForStoredUser, type Actor } from "@/lib/dal/actor";
import { getReviewQueueView } from "@/lib/dal/review";
import { getUnitPlanView, RECORD_CANDIDATES } from "@/lib/dal/unit-plan";
import type { SessionUser } from "@/lib/auth/options";
import { seededOrgs } from "./helpers";
import { closeConnections } from "./pipeline-support";
import { makeAnalysedCapture, makeUnit, seededRating, type StoredVerdict } from "./dispositions-support";
import { SEEDED, sessionUserOf } from "./ratings-support";

// The plan standing stored with each unit's plan state (units.plan_standing): the review queue reads it
// instead of evaluating every unit's plan, so it must be what an evaluation gives and be refreshed
// when it no longer covers the rating's steps.

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));

const thdFail: StoredVerdict = { check: "thd", label: "THD", measured: 5.4, unit: "%", lower: null, upper: 5, status: "fail", basis: "line-line", source: "test" };
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000);
const standingIn = async (id: string) => (await getDb().select({ s: units.planStanding }).from(units).where(eq(units.id, id)))[0]?.s ?? null;

let qa: Actor;
let labId: string;
let pm: Awaited<ReturnType<typeof seededRating>>;
let failing: Unit;
let failingCapture: string;

beforeAll(async () => {
  const { lab } = await seededOrgs();
  labId = lab.id;
  session.current = await sessionUserOf(SEEDED.qa);
  qa = await actorForStoredUser(session.current.id);
  pm = await seededRating(lab.id, "PX-120");
  // Three-step plan, the first step captured and failing (the oldest of the queue's failures, so it is on page 1).
  failing = await makeUnit(pm.rating, { latestOverall: "fail", planState: "failed", latestCaptureAt: new Date("2001-01-01T00:00:00Z") });
  failingCapture = (await makeAnalysedCapture(failing, { planStepId: pm.steps[0]?.id ?? null, overall: "fail", verdicts: [thdFail], createdAt: minutesAgo(30) })).id;
});
afterAll(closeConnections);

describe("units.plan_standing", () => {
  it("refreshUnitPlanState stores each active step's status and record as evaluateUnitPlan gives them", async () => {
    const scope = { kind: "lab", labId } as const;
    const stored = await refreshUnitPlanState(scope, failing.id);
    const evaluation = await evaluateUnitPlan(scope, failing.id);
    expect(evaluation).not.toBeNull();
    expect(stored).toEqual(standingOf(evaluation!));
    expect(await standingIn(failing.id)).toEqual(stored);
    expect(stored?.map((s) => s.status)).toEqual(["failed", "missing", "missing"]);
    expect(stored?.[0]?.recordCaptureId).toBe(failingCapture);
  });

  it("getReviewQueueView names steps from the stored standing, without evaluating the plan again", async () => {
    // A standing that differs from what an evaluation would say (second step failed instead of
    // missing) but covers the same steps: the queue shows the stored one.
    const [s1, s2, s3] = pm.steps;
    const planted: StoredStepStanding[] = [
      { stepId: s1!.id, status: "failed", recordCaptureId: failingCapture, chosen: false },
      { stepId: s2!.id, status: "passed", recordCaptureId: failingCapture, chosen: false },
      { stepId: s3!.id, status: "missing", recordCaptureId: null, chosen: false },
    ];
    await getDb().update(units).set({ planStanding: planted }).where(eq(units.id, failing.id));
    const row = (await getReviewQueueView(qa)).units.find((u) => u.id === failing.id);
    expect(row?.missingSteps).toEqual([s3!.name]);
    expect(row?.findings.map((f) => [f.check, f.step])).toEqual([["thd", s1!.name]]);
    expect(await standingIn(failing.id)).toEqual(planted);
  });

  it("getReviewQueueView evaluates and stores a standing that is missing or names other steps", async () => {
    for (const stale of [null, [{ stepId: pm.steps[0]!.id, status: "passed", recordCaptureId: null, chosen: false }]] as const) {
      await getDb().update(units).set({ planStanding: stale === null ? null : [...stale] }).where(eq(units.id, failing.id));
      const row = (await getReviewQueueView(qa)).units.find((u) => u.id === failing.id);
      expect(row?.missingSteps).toEqual([pm.steps[1]!.name, pm.steps[2]!.name]);
      expect((await standingIn(failing.id))?.map((s) => s.status)).toEqual(["failed", "missing", "missing"]);
    }
  });

  it("backfillPlanStandings fills open units without a standing, leaves closed ones, and a second run fills none", async () => {
    const open = await makeUnit(pm.rating, { latestOverall: "fail", latestCaptureAt: minutesAgo(20) });
    const closed = await makeUnit(pm.rating, { latestOverall: "pass", disposition: "accepted", latestCaptureAt: minutesAgo(20) });
    expect(await backfillPlanStandings(2)).toBeGreaterThanOrEqual(1);
    expect((await standingIn(open.id))?.map((s) => s.status)).toEqual(["missing", "missing", "missing"]);
    expect(await standingIn(closed.id)).toBeNull();
    expect(await backfillPlanStandings()).toBe(0);
  });

  it("getUnitPlanView offers at most RECORD_CANDIDATES captures per step, newest first, and always the record", async () => {
    const many = await makeUnit(pm.rating, { latestOverall: "fail", latestCaptureAt: minutesAgo(5) });
    const step = pm.steps[0]!.id;
    const made: string[] = [];
    for (let i = 0; i < RECORD_CANDIDATES + 5; i++) {
      made.push((await makeAnalysedCapture(many, { planStepId: step, overall: "fail", verdicts: [thdFail], createdAt: minutesAgo(1000 - i) })).id);
    }
    const oldest = made[0]!;
    await getDb().insert(stepRecords).values({ unitId: many.id, planStepId: step, captureId: oldest, reason: "the bench log says so", chosenById: session.current!.id });
    const view = await getUnitPlanView(many.id);
    const candidates = view?.steps.find((s) => s.id === step)?.candidates.map((c) => c.id) ?? [];
    expect(candidates.slice(0, RECORD_CANDIDATES)).toEqual(made.slice(-RECORD_CANDIDATES).reverse());
    expect(candidates).toHaveLength(RECORD_CANDIDATES + 1);
    expect(candidates.at(-1)).toBe(oldest);
    expect(view?.steps.find((s) => s.id === step)?.record?.id).toBe(oldest);
  });
});
