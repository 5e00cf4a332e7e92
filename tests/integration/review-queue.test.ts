import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/lib/auth/options";
import ReviewPage from "@/app/(app)/review/page";
import { actOnQueue } from "@/app/(app)/review/actions";
import { actorForStoredUser, type Actor } from "@/lib/dal/actor";
import { assignForReview, getReviewQueueView, REVIEW_PAGE_SIZE } from "@/lib/dal/review";
import { seededOrgs } from "./helpers";
import { closeConnections } from "./pipeline-support";
import { makeAnalysedCapture, makeSigner, makeUnit, seededRating, type StoredVerdict } from "./dispositions-support";
import { form, SEEDED, sessionUserOf } from "./ratings-support";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
vi.mock("next/headers", () => ({ headers: async () => new Headers({ "x-forwarded-for": "192.0.2.77" }) }));

const thdFail: StoredVerdict = { check: "thd", label: "THD", measured: 5.4, unit: "%", lower: null, upper: 5, status: "fail", basis: "line-line", source: "test" };
const freqPass: StoredVerdict = { check: "frequency", label: "Frequency", measured: 50, unit: "Hz", lower: 49.5, upper: 50.5, status: "pass", basis: "reference", source: "test" };
const tifUnknown: StoredVerdict = { check: "tif", label: "TIF", measured: null, unit: "", lower: null, upper: 50, status: "inconclusive", reason: "the figure could not be computed from this capture", basis: "line-line", source: "test" };
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000);

let qa: Actor;
let qaUser: SessionUser;
let ids: { outsideOld: string; outsideNew: string; inconclusive: string; marginal: string; accepted: string; untested: string };
let pmUnit: string;

beforeAll(async () => {
  const { lab } = await seededOrgs();
  qaUser = await sessionUserOf(SEEDED.qa);
  qa = await actorForStoredUser(qaUser.id);
  const kg = await seededRating(lab.id, "KG-45T");
  const pm = await seededRating(lab.id, "PX-120");
  const marginal = await makeUnit(kg.rating, { latestOverall: "marginal", planState: "complete-within", latestCaptureAt: minutesAgo(500) });
  const inconclusive = await makeUnit(kg.rating, { latestOverall: "inconclusive", planState: "inconclusive", latestCaptureAt: minutesAgo(400) });
  const outsideNew = await makeUnit(kg.rating, { latestOverall: "fail", planState: "failed", latestCaptureAt: minutesAgo(100) });
  const outsideOld = await makeUnit(kg.rating, { latestOverall: "fail", planState: "failed", latestCaptureAt: minutesAgo(300) });
  const accepted = await makeUnit(kg.rating, { latestOverall: "fail", disposition: "accepted-with-concession", latestCaptureAt: minutesAgo(900) });
  const untested = await makeUnit(kg.rating, {});
  await makeAnalysedCapture(outsideOld, { planStepId: kg.steps[0]?.id ?? null, overall: "fail", verdicts: [freqPass, thdFail, tifUnknown], createdAt: minutesAgo(300) });
  ids = { outsideOld: outsideOld.id, outsideNew: outsideNew.id, inconclusive: inconclusive.id, marginal: marginal.id, accepted: accepted.id, untested: untested.id };
  // A unit of the three-step PM plan with one step captured (and failing): the other two are missing.
  const pmRow = await makeUnit(pm.rating, { latestOverall: "fail", planState: "failed", latestCaptureAt: minutesAgo(200) });
  await makeAnalysedCapture(pmRow, { planStepId: pm.steps[0]?.id ?? null, overall: "fail", verdicts: [thdFail], createdAt: minutesAgo(200) });
  pmUnit = pmRow.id;
});
afterAll(closeConnections);

describe("getReviewQueueView", () => {
  it("getReviewQueueView lists open judged units outside first, then inconclusive, then marginal, oldest first within each", async () => {
    const view = await getReviewQueueView(qa);
    const mine = view.units.map((u) => u.id).filter((id) => Object.values(ids).includes(id) || id === pmUnit);
    expect(mine).toEqual([ids.outsideOld, pmUnit, ids.outsideNew, ids.inconclusive, ids.marginal]);
    // Closed and never-judged units wait for nothing.
    expect(mine).not.toContain(ids.accepted);
    expect(mine).not.toContain(ids.untested);
  });

  it("getReviewQueueView names each failing or inconclusive check with measured value, limit and exceedance", async () => {
    const row = (await getReviewQueueView(qa)).units.find((u) => u.id === ids.outsideOld);
    expect(row?.findings.map((f) => f.check)).toEqual(["thd", "tif"]);
    const thd = row?.findings[0];
    expect(thd).toMatchObject({ label: "THD", status: "fail", measured: "5.4 %", limit: "at most 5 %", step: "Open circuit at rated speed" });
    // 5.4 − 5 = 0.4 % over the limit, 8 % of it (hand arithmetic).
    expect(thd?.exceedance?.amount).toBeCloseTo(0.4, 10);
    expect(thd?.exceedance?.percentOfLimit).toBeCloseTo(8, 8);
    expect(row?.findings[1]).toMatchObject({ status: "inconclusive", measured: "not measured", reason: expect.stringMatching(/could not be computed/) });
  });

  it("getReviewQueueView names the plan steps still missing", async () => {
    const row = (await getReviewQueueView(qa)).units.find((u) => u.id === pmUnit);
    expect(row?.missingSteps).toEqual(["Back-EMF at 2000 rpm", "Back-EMF at 3000 rpm"]);
    expect(row?.findings.map((f) => f.step)).toEqual(["Back-EMF at 1000 rpm"]);
  });

  it("getReviewQueueView refuses an operator and a client user (403)", async () => {
    for (const who of ["operator", "manufacturer"] as const) {
      const actor = await actorForStoredUser((await sessionUserOf(SEEDED[who])).id);
      await expect(getReviewQueueView(actor)).rejects.toMatchObject({ status: 403 });
    }
  });
});

describe("assignForReview and the queue's actions", () => {
  it("actOnQueue lets a quality engineer take ticked units, shown as assigned to them", async () => {
    session.current = qaUser;
    const answer = await actOnQueue({ ok: false, message: "" }, form({ intent: "take", unitIds: [ids.outsideNew, ids.marginal] }));
    expect(answer).toMatchObject({ ok: true, message: "You took 2 units." });
    const rows = (await getReviewQueueView(qa)).units.filter((u) => u.id === ids.outsideNew || u.id === ids.marginal);
    expect(rows.map((r) => [r.assignee, r.mine])).toEqual([[qaUser.name, true], [qaUser.name, true]]);
  });

  it("assignForReview gives units to another quality engineer of the lab, and refuses a non-reviewer", async () => {
    const { lab } = await seededOrgs();
    const other = await makeSigner(lab.id, "queue");
    expect(await assignForReview(qa, { unitIds: [ids.inconclusive], assigneeId: other.id })).toBe(1);
    const row = (await getReviewQueueView(qa)).units.find((u) => u.id === ids.inconclusive);
    expect(row).toMatchObject({ assignee: other.name, mine: false });
    const operator = await sessionUserOf(SEEDED.operator);
    await expect(assignForReview(qa, { unitIds: [ids.inconclusive], assigneeId: operator.id })).rejects.toMatchObject({ status: 422 });
  });

  it("actOnQueue gives one disposition with one reason only where the rules allow it", async () => {
    session.current = qaUser;
    const refused = await actOnQueue({ ok: false, message: "" }, form({ intent: "disposition", unitIds: [ids.outsideNew], to: "accepted", reason: "Batch reviewed" }));
    expect(refused.ok).toBe(false);
    expect(refused.results?.[0]?.message).toMatch(/Plain acceptance is refused/);
    const signedInBulk = await actOnQueue({ ok: false, message: "" }, form({ intent: "disposition", unitIds: [ids.outsideNew], to: "scrapped", reason: "Batch reviewed" }));
    expect(signedInBulk).toMatchObject({ ok: false, message: expect.stringMatching(/signed one unit at a time/) });
    const noReason = await actOnQueue({ ok: false, message: "" }, form({ intent: "disposition", unitIds: [ids.outsideNew], to: "rework", reason: "" }));
    expect(noReason.results?.[0]?.message).toMatch(/needs a reason/);
    const done = await actOnQueue({ ok: false, message: "" }, form({ intent: "disposition", unitIds: [ids.outsideNew, ids.outsideOld], to: "rework", reason: "Harmonics high: rotor skew check" }));
    expect(done).toMatchObject({ ok: true, message: "2 of 2 units now returned for rework." });
    const left = (await getReviewQueueView(qa)).units.map((u) => u.id);
    expect(left).not.toContain(ids.outsideNew);
    expect(left).not.toContain(ids.outsideOld);
  });

  it("ReviewPage renders for a quality engineer", async () => {
    session.current = qaUser;
    expect(await ReviewPage({ searchParams: Promise.resolve({ page: "2" }) })).toBeTruthy();
  });

  it("getReviewQueueView shows one page of at most REVIEW_PAGE_SIZE units and counts every waiting unit", async () => {
    const first = await getReviewQueueView(qa, 1);
    expect(first.units.length).toBe(Math.min(first.waiting, REVIEW_PAGE_SIZE));
    expect(first.hasMore).toBe(first.waiting > REVIEW_PAGE_SIZE);
    const beyond = await getReviewQueueView(qa, Math.ceil(first.waiting / REVIEW_PAGE_SIZE) + 1);
    expect(beyond.units).toEqual([]);
    expect(beyond.hasMore).toBe(false);
    expect(beyond.waiting).toBe(first.waiting);
  });
});
