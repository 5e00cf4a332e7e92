import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/lib/auth/options";
import { GET as listRoute, POST as createRoute } from "@/app/api/v1/ratings/route";
import { GET as getRoute, PATCH as patchRoute } from "@/app/api/v1/ratings/[id]/route";
import { GET as profileRoute, POST as profilePostRoute } from "@/app/api/v1/ratings/[id]/profile/route";
import { GET as planRoute, PUT as planPutRoute } from "@/app/api/v1/ratings/[id]/plan/route";
import { POST as retireRoute } from "@/app/api/v1/ratings/[id]/retire/route";
import ClientsPage from "@/app/(app)/admin/clients/page";
import { saveClientAction, setClientActiveAction } from "@/app/(app)/admin/clients/actions";
import RatingsPage from "@/app/(app)/ratings/page";
import NewRatingPage from "@/app/(app)/ratings/new/page";
import RatingPage from "@/app/(app)/ratings/[id]/page";
import { createRatingAction, rejudgeRatingAction, saveProfileAction, savePlanStepAction, setRatingRetiredAction, updateRatingAction } from "@/app/(app)/ratings/actions";
import { actorForStoredUser } from "@/lib/dal/actor";
import { createClient } from "@/lib/dal/clients";
import { createRating, listRatingsView } from "@/lib/dal/ratings";
import { closeConnections, createOtherLab, createStationToken } from "./pipeline-support";
import { alternator, form, run, SEEDED, sessionUserOf } from "./ratings-support";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const people: Record<"admin" | "operator" | "qa" | "manufacturer", SessionUser> = {} as never;
let ratingId: string;
let clientId: string;
let token: string;
const as = (who: keyof typeof people | null) => { session.current = who ? people[who] : null; };
const params = (id: string) => ({ params: Promise.resolve({ id }) });
const url = "http://test/api/v1/ratings";
const json = (method: string, body: unknown, headers: Record<string, string> = {}) => ({ method, headers: { "Content-Type": "application/json", ...headers }, body: JSON.stringify(body) });

/** The page's or action's outcome: "ok", or where the guard sent the caller (Next's redirect digest). */
async function outcome(call: () => Promise<unknown>): Promise<string> {
  try {
    await call();
    return "ok";
  } catch (err) {
    const digest = (err as { digest?: string }).digest ?? "";
    if (digest.startsWith("NEXT_REDIRECT")) return digest.split(";")[2] ?? "redirect";
    if (digest.startsWith("NEXT_HTTP_ERROR_FALLBACK;404")) return "404";
    if (digest.startsWith("NEXT_HTTP_ERROR_FALLBACK;403")) return "/access-denied";
    // Outside Next (no next.config), forbidden() refuses with this error instead of its digest: a refusal all the same.
    if (err instanceof Error && err.message.includes("`forbidden()` is experimental")) return "/access-denied";
    throw err;
  }
}

beforeAll(async () => {
  for (const role of ["admin", "operator", "qa", "manufacturer"] as const) people[role] = await sessionUserOf(SEEDED[role]);
  as("admin");
  clientId = (await createClient({ name: `Access client ${run}` })).id;
  ratingId = (await createRating((await actorForStoredUser(people.admin.id)), { clientId, modelCode: `ACC-${run}`, title: "Access test", nameplate: alternator, presetId: "lab-own" })).id;
  token = (await createStationToken(people.admin.organisationId)).token;
});
afterAll(closeConnections);

describe("pages: who may open them", () => {
  it("ClientsPage opens for lab managers only", async () => {
    as("admin"); expect(await outcome(() => ClientsPage())).toBe("ok");
    for (const who of ["qa", "operator", "manufacturer"] as const) { as(who); expect(await outcome(() => ClientsPage()), who).toBe("/access-denied"); }
    as(null); expect(await outcome(() => ClientsPage())).toBe("/sign-in");
  });

  it("RatingsPage and RatingPage open for lab staff; NewRatingPage for lab managers and quality engineers", async () => {
    const list = () => RatingsPage({ searchParams: Promise.resolve({}) });
    const one = () => RatingPage({ params: Promise.resolve({ id: ratingId }), searchParams: Promise.resolve({}) });
    for (const who of ["admin", "qa", "operator"] as const) {
      as(who);
      expect(await outcome(list), who).toBe("ok");
      expect(await outcome(one), who).toBe("ok");
      expect(await outcome(() => NewRatingPage()), who).toBe(who === "operator" ? "/access-denied" : "ok");
    }
    as("manufacturer");
    for (const call of [list, one, () => NewRatingPage()]) expect(await outcome(call)).toBe("/access-denied");
  });
});

describe("server actions called directly by a forbidden role", () => {
  it("client actions refuse everyone but lab managers", async () => {
    for (const who of ["qa", "operator", "manufacturer"] as const) {
      as(who);
      expect(await outcome(() => saveClientAction({ ok: false, message: "" }, form({ name: `Sneaky ${run}` }))), who).toBe("/access-denied");
      expect(await outcome(() => setClientActiveAction(form({ clientId, active: "false" }))), who).toBe("/access-denied");
    }
  });

  it("rating, profile, plan and re-judge actions refuse operators and clients", async () => {
    const calls = [
      () => createRatingAction({ ok: false, message: "" }, form({ clientId, modelCode: `X-${run}`, title: "x" })),
      () => updateRatingAction({ ok: false, message: "" }, form({ ratingId, title: "Hijacked" })),
      () => setRatingRetiredAction(form({ ratingId, retired: "true" })),
      () => saveProfileAction({ ok: false, message: "" }, form({ ratingId, reason: "no" })),
      () => savePlanStepAction({ ok: false, message: "" }, form({ ratingId, name: "x", testKind: "no-load" })),
      () => rejudgeRatingAction(form({ ratingId })),
    ];
    for (const who of ["operator", "manufacturer"] as const) {
      as(who);
      for (const call of calls) expect(await outcome(call), who).toBe("/access-denied");
    }
    as("admin");
    const view = await listRatingsView((await actorForStoredUser(people.admin.id)), { retired: "all" });
    expect(view.ratings.find((r) => r.id === ratingId)).toMatchObject({ title: "Access test", retiredAt: null });
  });

  it("saveClientAction as a lab manager names the refused field", async () => {
    as("admin");
    const state = await saveClientAction({ ok: false, message: "" }, form({ name: "x", contactEmail: "not-an-address" }));
    expect(state.fieldErrors?.name).toMatch(/2 characters/);
    expect(state.fieldErrors?.contactEmail).toMatch(/valid contact e-mail/);
  });
});

describe("the ratings API: session or station key", () => {
  it("GET routes answer lab staff and station keys; clients get 403 and nobody signed in 401", async () => {
    for (const who of ["admin", "qa", "operator"] as const) {
      as(who);
      expect((await listRoute(new Request(url))).status, who).toBe(200);
      expect((await getRoute(new Request(url), params(ratingId))).status, who).toBe(200);
    }
    as(null);
    expect((await listRoute(new Request(url))).status).toBe(401);
    const keyed = new Request(url, { headers: { Authorization: `Bearer ${token}` } });
    const res = await listRoute(keyed);
    expect(res.status).toBe(200);
    expect(((await res.json()) as { ratings: { id: string }[] }).ratings.some((r) => r.id === ratingId)).toBe(true);
    expect((await profileRoute(new Request(url, { headers: { Authorization: `Bearer ${token}` } }), params(ratingId))).status).toBe(200);
    expect((await planRoute(new Request(url, { headers: { Authorization: `Bearer ${token}` } }), params(ratingId))).status).toBe(200);
    as("manufacturer");
    expect((await listRoute(new Request(url))).status).toBe(403);
    expect((await listRoute(new Request(`${url}?kind=steam-turbine`, {}))).status).toBe(403);
    as("admin");
    const bad = await listRoute(new Request(`${url}?kind=steam-turbine`));
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { fields: Record<string, string> }).fields.kind).toMatch(/kind must be one of/);
  });

  it("write routes: lab managers and quality engineers only; a station key and an operator get 403", async () => {
    const body = { clientId, modelCode: `API-${run}`, title: "Made by API", nameplate: alternator, presetId: "nema-mg-1" };
    as("operator");
    expect((await createRoute(new Request(url, json("POST", body)))).status).toBe(403);
    as(null);
    expect((await createRoute(new Request(url, json("POST", body, { Authorization: `Bearer ${token}` })))).status).toBe(403);
    expect((await planPutRoute(new Request(url, json("PUT", { steps: [] }, { Authorization: `Bearer ${token}` })), params(ratingId))).status).toBe(403);
    as("qa");
    const created = await createRoute(new Request(url, json("POST", body)));
    expect(created.status).toBe(201);
    const again = await createRoute(new Request(url, json("POST", body)));
    expect(again.status).toBe(409);
    expect(((await again.json()) as { fields: Record<string, string> }).fields.modelCode).toMatch(/already has a rating/);
    const id = ((await created.json()) as { rating: { id: string } }).rating.id;
    const patched = await patchRoute(new Request(url, json("PATCH", { nameplate: { ...alternator, poles: 3 } })), params(id));
    expect(patched.status).toBe(422);
    expect(((await patched.json()) as { fields: Record<string, string> }).fields["nameplate.poles"]).toMatch(/even number/);
    const plan = await planPutRoute(new Request(url, json("PUT", { steps: [{ name: "No-load", testKind: "no-load", speedRpm: 1500, speedTolerancePercent: 2, checks: ["voltage"] }] })), params(id));
    expect(plan.status).toBe(200);
    const history = (await (await profileRoute(new Request(url), params(id))).json()) as { versions: { version: number; profile: object }[] };
    const v = await profilePostRoute(new Request(url, json("POST", { profile: history.versions[0]!.profile, reason: "Same bands, checked by QA" })), params(id));
    expect(v.status).toBe(201);
    expect(((await v.json()) as { version: { version: number } }).version.version).toBe(2);
    expect((await retireRoute(new Request(url, json("POST", {})), params(id))).status).toBe(200);
  });
});

describe("another lab's rating answers 404", () => {
  it("pages, DAL and routes of a second lab do not find the rating", async () => {
    const other = await createOtherLab(`r${run}`);
    const otherKey = (await createStationToken(other.org.id)).token;
    const keyed = { headers: { Authorization: `Bearer ${otherKey}` } };
    expect((await getRoute(new Request(url, keyed), params(ratingId))).status).toBe(404);
    expect((await profileRoute(new Request(url, keyed), params(ratingId))).status).toBe(404);
    expect((await planRoute(new Request(url, keyed), params(ratingId))).status).toBe(404);
    const list = (await (await listRoute(new Request(`${url}?retired=all`, keyed))).json()) as { ratings: unknown[] };
    expect(list.ratings).toHaveLength(0);
    const otherAdmin: SessionUser = { ...other.sessionUser, role: "admin" };
    session.current = otherAdmin;
    expect((await patchRoute(new Request(url, json("PATCH", { title: "Taken over" })), params(ratingId))).status).toBe(404);
    expect(await outcome(() => RatingPage({ params: Promise.resolve({ id: ratingId }), searchParams: Promise.resolve({}) }))).toBe("404");
    const state = await saveClientAction({ ok: false, message: "" }, form({ clientId, name: "Taken over" }));
    expect(state.ok).toBe(false);
    expect(state.message).toMatch(/No such client/);
    const create = await createRoute(new Request(url, json("POST", { clientId, modelCode: `O-${run}`, title: "x", nameplate: alternator, presetId: "lab-own" })));
    expect(((await create.json()) as { fields: Record<string, string> }).fields.clientId).toMatch(/client of your lab/);
  });
});
