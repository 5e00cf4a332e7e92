import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCaptureDetail } from "@/db/queries/captures";
import { findStationKeyByPrefix, revokeStationKey } from "@/db/queries/station-keys";
import { GET as getCaptureRoute } from "@/app/api/v1/captures/[id]/route";
import { GET as listRoute, POST as registerRoute } from "@/app/api/v1/captures/route";
import { GET as getUnitRoute } from "@/app/api/v1/units/[serial]/route";
import { actorForStoredUser } from "@/lib/dal/actor";
import { getCaptureStatusView } from "@/lib/dal/captures";
import { captureObjectKey, headObject } from "@/lib/server/storage";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, createOtherLab, demoActor, createStationToken, demoLabStation, registerViaApi, unitId, uploadViaApi } from "./pipeline-support";

let labId: string;
let token: string;
const run = Date.now() % 1_000_000;
const get = (token: string) => new Request("http://test/api/v1/x", { headers: { Authorization: `Bearer ${token}` } });

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
});
afterAll(closeConnections);

describe("registerCapture via the bench API: idempotency and bad input", () => {
  it("re-sending the same file for the same unit returns the existing capture, not a duplicate", async () => {
    const csv = makeThreePhaseCsv({ variant: run });
    const first = await uploadViaApi(token, csv, { unitSerial: "KG45-260306" });
    const again = await registerViaApi(token, csv, { unitSerial: "KG45-260306" });
    expect(again.status).toBe(200);
    expect(again.body.duplicate).toBe(true);
    expect(again.body.capture?.id).toBe(first.id);
    expect(again.body.upload).toBeNull();
    const otherUnit = await registerViaApi(token, csv, { unitSerial: "KG45-260307" });
    expect(otherUnit.status).toBe(201);
    expect(otherUnit.body.capture?.id).not.toBe(first.id);
  });

  it("refuses oversize, non-CSV names, unknown units and unknown ratings with a clear 4xx", async () => {
    const csv = makeThreePhaseCsv({ variant: run + 1 });
    const huge = await registerViaApi(token, csv, { unitSerial: "KG45-260306", sizeBytes: 5 * 1024 ** 4 });
    expect(huge.status).toBe(413);
    expect(huge.body.error).toMatch(/the limit is [\d.]+ MiB/);
    const named = await registerViaApi(token, csv, { unitSerial: "KG45-260306", fileName: "scope.png" });
    expect(named.status).toBe(400);
    expect(named.body.error).toMatch(/Only CSV exports/);
    const unknown = await registerViaApi(token, csv, { unitSerial: `NOPE-${run}` });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error).toMatch(/No unit with serial/);
    const asForm = await registerRoute(new Request("http://test/api/v1/captures", {
      method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "text/plain" }, body: "{}",
    }));
    expect(asForm.status).toBe(415);
    const badRating = await registerViaApi(token, csv, { unitSerial: `NEW-${run}`, newUnitRatingId: "00000000-0000-4000-8000-000000000000" });
    expect(badRating.status).toBe(422);
    expect(badRating.body.error).toMatch(/Unknown rating/);
  });

  it("binary content is refused at completion: 415, the object and the row deleted, so the same bytes can be registered again", async () => {
    const bytes = `PK\u0003\u0004\u0000\u0000binary zip ${run}, not a capture`.repeat(50);
    const { id, completeStatus, complete } = await uploadViaApi(token, bytes, { unitSerial: "KG45-260308", fileName: "renamed.csv" });
    expect(completeStatus).toBe(415);
    expect(complete.error).toMatch(/binary data.*register the file again/);
    expect(await getCaptureDetail({ kind: "lab", labId }, id)).toBeUndefined();
    expect(await headObject(captureObjectKey(labId, await unitId(labId, "KG45-260308"), id))).toBeNull();
    const again = await registerViaApi(token, bytes, { unitSerial: "KG45-260308", fileName: "renamed.csv" });
    expect(again.status).toBe(201);
    expect(again.body.upload).not.toBeNull();
  });
});

describe("authorization across organisations", () => {
  it("an operator of another lab cannot read a capture (null → 404), nor can that lab's station key", async () => {
    const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 2 }), { unitSerial: "KG45-260309" });
    const other = await createOtherLab(`t${run}`);
    expect(await getCaptureStatusView(await actorForStoredUser(other.sessionUser.id), id)).toBeNull();
    const own = await getCaptureStatusView(await demoActor("operator"), id);
    expect(own?.id).toBe(id);
    const otherKey = (await createStationToken(other.org.id)).token;
    const res = await getCaptureRoute(get(otherKey), { params: Promise.resolve({ id }) });
    expect(res.status).toBe(404);
    const unit = await getUnitRoute(get(otherKey), { params: Promise.resolve({ serial: "KG45-260309" }) });
    expect(unit.status).toBe(404);
    const register = await registerViaApi(otherKey, "a,b\n1,2\n", { unitSerial: "KG45-260309" });
    expect(register.status).toBe(422);
    // The list: this lab's key finds the capture by serial; the other lab's key sees none of it.
    const listed = (await (await listRoute(new Request("http://test/api/v1/captures?q=KG45-260309", { headers: { Authorization: `Bearer ${token}` } }))).json()) as { captures: { id: string }[] };
    expect(listed.captures.map((c) => c.id)).toContain(id);
    const foreign = await listRoute(new Request("http://test/api/v1/captures?q=KG45", { headers: { Authorization: `Bearer ${otherKey}` } }));
    expect(((await foreign.json()) as { captures: unknown[] }).captures).toEqual([]);
  });

  it("GET /api/v1/captures names a bad query parameter (400) and needs a key (401)", async () => {
    const bad = await listRoute(new Request("http://test/api/v1/captures?sort=price", { headers: { Authorization: `Bearer ${token}` } }));
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/^sort/);
    expect((await listRoute(new Request("http://test/api/v1/captures"))).status).toBe(401);
  });

  it("a revoked or malformed station key is refused with 401", async () => {
    const { token: doomed } = await createStationToken(labId);
    const prefix = /^emk_([0-9a-f]{12})\./.exec(doomed)?.[1] ?? "";
    const key = await findStationKeyByPrefix(prefix);
    expect(await revokeStationKey({ kind: "lab", labId }, key?.key.id ?? "")).toBe(true);
    const revoked = await registerViaApi(doomed, "x", { unitSerial: "KG45-260306" });
    expect(revoked.status).toBe(401);
    expect(revoked.body.error).toMatch(/revoked/);
    const forged = await registerViaApi(doomed.replace(/.$/, (c) => (c === "A" ? "B" : "A")), "x", { unitSerial: "KG45-260306" });
    expect(forged.status).toBe(401);
    const res = await getUnitRoute(new Request("http://test/"), { params: Promise.resolve({ serial: "KG45-260306" }) });
    expect(res.status).toBe(401);
  });
});
