import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { SessionUser } from "@/lib/auth/options";
import UnitPage from "@/app/(app)/units/[id]/page";
import CapturePage from "@/app/(app)/captures/[id]/page";
import { addNote } from "@/app/(app)/units/[id]/actions";
import { GET as unitRoute } from "@/app/api/units/[id]/route";
import { GET as unitCsvRoute } from "@/app/api/units/[id]/report.csv/route";
import { GET as captureRoute } from "@/app/api/captures/[id]/route";
import { actorForStoredUser } from "@/lib/dal/actor";
import { getCaptureStatusView, getUnitCaptureRows } from "@/lib/dal/captures";
import { changeDisposition } from "@/lib/dal/dispositions";
import { getUnitHistoryView } from "@/lib/dal/review";
import { addUnitNote, getUnitNotesView } from "@/lib/dal/unit-notes";
import { getUnitPlanView } from "@/lib/dal/unit-plan";
import { getUnitRecord } from "@/lib/dal/unit-report";
import { getUnitView } from "@/lib/dal/units";
import { seededOrgs } from "./helpers";
import { closeConnections } from "./pipeline-support";
import { makeAnalysedCapture, makeSigner, makeUnit, PASSWORD, seededRating } from "./dispositions-support";
import { form, run, SEEDED, sessionUserOf } from "./ratings-support";

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const INTERNAL = `Internal note ${run}: rotor scuffed on arrival`;
const CLIENT = `Client note ${run}: retest booked for Monday`;
const COMMENT = `Staff comment ${run}: 5th harmonic over, client agreed by phone`;

let staff: SessionUser;
let client: SessionUser;
let unitId: string;
let captureId: string;

/** Everything a value holds as text: page element trees (the props handed to every component), views and JSON bodies. */
function textOf(value: unknown): string {
  const seen = new WeakSet<object>();
  return JSON.stringify(value, (_key, v: unknown) => {
    if (typeof v === "object" && v !== null) {
      if (seen.has(v)) return undefined;
      seen.add(v);
    }
    return typeof v === "function" ? undefined : v;
  }) ?? "";
}

const params = (id: string) => ({ params: Promise.resolve({ id }) });

/** A route's body, after checking it answered 200. */
async function bodyOf(response: Promise<Response>): Promise<string> {
  const r = await response;
  const text = await r.text();
  expect(r.status, text).toBe(200);
  return text;
}

beforeAll(async () => {
  const { lab } = await seededOrgs();
  const { rating } = await seededRating(lab.id, "KG-45T");
  const signerRow = await makeSigner(lab.id, "notes");
  staff = await sessionUserOf(signerRow.email);
  client = await sessionUserOf(SEEDED.manufacturer);
  const unit = await makeUnit(rating, { planState: "complete-within", latestOverall: "fail" });
  unitId = unit.id;
  captureId = (await makeAnalysedCapture(unit, { planStepId: null, overall: "fail", verdicts: [], createdAt: new Date(), uploadedById: signerRow.id })).id;
  session.current = staff;
  expect(await addNote({ ok: false, message: "" }, form({ unitId, visibility: "internal", body: INTERNAL }))).toMatchObject({ ok: true });
  expect(await addNote({ ok: false, message: "" }, form({ unitId, visibility: "client", body: CLIENT }))).toMatchObject({ ok: true });
  await changeDisposition(await actorForStoredUser(signerRow.id), { unitId, to: "accepted-with-concession", reason: COMMENT, concessionRef: `KC-${run}`, password: PASSWORD }, "192.0.2.10");
});
afterAll(closeConnections);

describe("addNote", () => {
  it("addNote refuses a note without its audience or body, and a client user", async () => {
    session.current = staff;
    expect(await addNote({ ok: false, message: "" }, form({ unitId, body: "no audience" }))).toMatchObject({ ok: false, message: expect.stringMatching(/internal \(lab only\) or for the client/) });
    expect(await addNote({ ok: false, message: "" }, form({ unitId, visibility: "client", body: "  " }))).toMatchObject({ ok: false, message: "Write the note" });
    session.current = client;
    // The action refuses a client user before it reads the form; the DAL refuses one again on its own.
    await expect(addNote({ ok: false, message: "" }, form({ unitId, visibility: "client", body: "from the client" }))).rejects.toThrow();
    await expect(addUnitNote(await actorForStoredUser(client.id), { unitId, visibility: "client", body: "from the client" })).rejects.toMatchObject({ status: 403, message: "Only lab staff write notes on a unit." });
  });

  it("getUnitNotesView shows lab staff every note with its audience and author", async () => {
    session.current = staff;
    const view = await getUnitNotesView(unitId);
    expect(view.notes?.map((n) => [n.visibility, n.body, n.author])).toEqual([["client", CLIENT, staff.name], ["internal", INTERNAL, staff.name]]);
  });
});

describe("what a client user can reach for the unit", () => {
  it("every page and response a client reaches carries the client note but no internal note, staff comment or staff name", async () => {
    session.current = client;
    const reached: Record<string, unknown> = {
      unitPage: await UnitPage(params(unitId)),
      capturePage: await CapturePage(params(captureId)),
      unitView: await getUnitView(unitId),
      history: await getUnitHistoryView(unitId),
      notes: await getUnitNotesView(unitId),
      plan: await getUnitPlanView(unitId),
      captureRows: await getUnitCaptureRows(unitId),
      captureView: await getCaptureStatusView(await actorForStoredUser(client.id), captureId),
      record: await getUnitRecord(unitId),
      unitApi: await bodyOf(unitRoute(new Request(`http://test/api/units/${unitId}`), params(unitId))),
      unitCsv: await bodyOf(unitCsvRoute(new Request(`http://test/api/units/${unitId}/report.csv`), params(unitId))),
      captureApi: await bodyOf(captureRoute(new Request(`http://test/api/captures/${captureId}`), params(captureId))),
    };
    // Each read answered the client (a refusal would hide nothing and prove nothing).
    for (const [where, value] of Object.entries(reached)) expect(value, where).toBeTruthy();
    for (const [where, value] of Object.entries(reached)) {
      const text = textOf(value);
      expect(text, where).not.toContain(INTERNAL);
      expect(text, where).not.toContain(COMMENT);
      expect(text, where).not.toContain(staff.name);
    }
    // The check can fail: what the client may see is there.
    expect(textOf(reached.unitPage)).toContain(CLIENT);
    expect(textOf(reached.history)).toContain(`KC-${run}`);
  });

  it("getUnitHistoryView gives the client the decision with the signer's role and meaning, not the name", async () => {
    session.current = client;
    const history = await getUnitHistoryView(unitId);
    expect(history.canDisposition).toBe(false);
    expect(history.events).toEqual([expect.objectContaining({
      kind: "disposition", to: "accepted-with-concession", actor: null, comment: null,
      signature: expect.objectContaining({ name: null, role: "Quality engineer", meaning: "accepted the unit under the client's concession" }),
    })]);
  });

  it("the same reads as lab staff do carry the internal note, the comment and the names (the test is not blind)", async () => {
    session.current = staff;
    const text = textOf([await UnitPage(params(unitId)), await getUnitHistoryView(unitId)]);
    expect(text).toContain(INTERNAL);
    expect(text).toContain(COMMENT);
    expect(text).toContain(staff.name);
  });
});
