import { describe, expect, it } from "vitest";
import { decideDisposition, whyNotWithin, type DispositionUnitFacts } from "@/lib/units/disposition-rules";

const within: DispositionUnitFacts = { disposition: "open", planState: "complete-within", latestOverall: "pass" };
const change = (to: Parameters<typeof decideDisposition>[1]["to"], reason = "Reviewed the plan records", concessionRef = "") => ({ to, reason, concessionRef });

describe("whyNotWithin", () => {
  it("whyNotWithin answers null only for a complete plan whose latest verdict is neither outside nor inconclusive", () => {
    expect(whyNotWithin(within)).toBeNull();
    expect(whyNotWithin({ planState: "complete-within", latestOverall: "marginal" })).toBeNull();
    expect(whyNotWithin({ planState: "complete-within", latestOverall: "fail" })).toMatch(/outside tolerance/);
    expect(whyNotWithin({ planState: "complete-within", latestOverall: "inconclusive" })).toMatch(/inconclusive/);
    expect(whyNotWithin({ planState: "incomplete", latestOverall: "pass" })).toMatch(/not complete/);
    expect(whyNotWithin({ planState: "failed", latestOverall: "pass" })).toMatch(/plan step failed/);
    // Nothing passes on missing evidence: no judged capture is not within.
    expect(whyNotWithin({ planState: "complete-within", latestOverall: null })).toMatch(/no judged capture/);
  });
});

describe("decideDisposition", () => {
  it("decideDisposition accepts a complete-and-within unit plainly, unsigned", () => {
    expect(decideDisposition(within, change("accepted"))).toEqual({ allowed: true, signature: null });
  });

  it("decideDisposition refuses plain acceptance of an outside or incomplete unit, naming why and pointing to a concession", () => {
    const outside = decideDisposition({ ...within, latestOverall: "fail" }, change("accepted"));
    expect(outside).toMatchObject({ allowed: false, field: "to" });
    expect(outside.allowed ? "" : outside.message).toMatch(/latest verdict is outside tolerance.*concession/);
    const incomplete = decideDisposition({ ...within, planState: "incomplete" }, change("accepted"));
    expect(incomplete.allowed ? "" : incomplete.message).toMatch(/test plan is not complete/);
  });

  it("decideDisposition requires a reason for every change, reopening included", () => {
    for (const to of ["accepted", "accepted-with-concession", "rework", "scrapped"] as const) {
      expect(decideDisposition(within, change(to, "  ok  ", "C-1"))).toMatchObject({ allowed: false, field: "reason" });
    }
    expect(decideDisposition({ ...within, disposition: "scrapped" }, change("open", ""))).toMatchObject({ allowed: false, field: "reason", message: expect.stringMatching(/Reopening/) });
  });

  it("decideDisposition asks a concession for the client's reference and a signature", () => {
    const outside = { ...within, latestOverall: "fail" as const };
    expect(decideDisposition(outside, change("accepted-with-concession", "Client accepts 5th harmonic", "  "))).toMatchObject({ allowed: false, field: "concessionRef" });
    expect(decideDisposition(outside, change("accepted-with-concession", "Client accepts 5th harmonic", "KC-0042"))).toEqual({ allowed: true, signature: "concession" });
  });

  it("decideDisposition signs a scrap and a reopening of a closed unit, not a rework or reopening after rework", () => {
    expect(decideDisposition(within, change("scrapped"))).toEqual({ allowed: true, signature: "scrap" });
    expect(decideDisposition(within, change("rework"))).toEqual({ allowed: true, signature: null });
    for (const closed of ["accepted", "accepted-with-concession", "scrapped"] as const) {
      expect(decideDisposition({ ...within, disposition: closed }, change("open"))).toEqual({ allowed: true, signature: "reopen" });
    }
    expect(decideDisposition({ ...within, disposition: "rework" }, change("open"))).toEqual({ allowed: true, signature: null });
  });

  it("decideDisposition refuses the same disposition again and any change of a closed unit but reopening", () => {
    expect(decideDisposition(within, change("open"))).toMatchObject({ allowed: false, field: "to", message: expect.stringMatching(/already/) });
    expect(decideDisposition({ ...within, disposition: "scrapped" }, change("accepted"))).toMatchObject({ allowed: false, field: "to", message: expect.stringMatching(/reopen it first/) });
  });
});
