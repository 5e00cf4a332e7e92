import { describe, expect, it } from "vitest";
import { addDays, calibrationStatus, wasOverdueOn } from "@/lib/instruments/status";
import { instrumentInputSchema } from "@/lib/instruments/input-schemas";

// Calendar arithmetic checked by hand against a calendar (common practice): 2026-12-02 + 30 days = 2027-01-01.
const today = "2026-12-02";
const at = (due: string | null, retiredAt: Date | null = null) => calibrationStatus({ calibrationDue: due, retiredAt }, today);

describe("calibrationStatus", () => {
  it("calibrationStatus keeps the due date itself in date (due soon) and calls the day after overdue", () => {
    expect(at("2026-12-02")).toBe("due-soon");
    expect(at("2026-12-01")).toBe("overdue");
  });

  it("calibrationStatus counts due within 30 days, the 30th day included (hand: 2027-01-01)", () => {
    expect(addDays(today, 30)).toBe("2027-01-01");
    expect(at("2027-01-01")).toBe("due-soon");
    expect(at("2027-01-02")).toBe("in-date");
  });

  it("calibrationStatus says retired before anything else, and names a missing due date", () => {
    expect(at("2020-01-01", new Date())).toBe("retired");
    expect(at(null)).toBe("no-due-date");
  });
});

describe("wasOverdueOn", () => {
  it("wasOverdueOn is true only for an upload day after the due date", () => {
    expect([wasOverdueOn("2026-12-01", "2026-12-01"), wasOverdueOn("2026-12-01", "2026-12-02"), wasOverdueOn(null, "2026-12-02")]).toEqual([false, true, false]);
  });
});

describe("instrumentInputSchema", () => {
  const base = { kind: "oscilloscope", make: "M", model: "X", serial: "S1", assetTag: "T-1" };
  it("instrumentInputSchema refuses a due date before the calibration date on the due date's field", () => {
    const r = instrumentInputSchema.safeParse({ ...base, calibratedOn: "2026-06-01", calibrationDue: "2026-05-31" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["calibrationDue"]);
  });

  it("instrumentInputSchema accepts a due date equal to the calibration date and empty dates as none", () => {
    expect(instrumentInputSchema.parse({ ...base, calibratedOn: "2026-06-01", calibrationDue: "2026-06-01" }).calibrationDue).toBe("2026-06-01");
    expect(instrumentInputSchema.parse({ ...base, calibratedOn: "", calibrationDue: "" }).calibrationDue).toBeNull();
  });

  it("instrumentInputSchema refuses a negative accuracy on its spec field", () => {
    const r = instrumentInputSchema.safeParse({ ...base, spec: { timebasePpm: -5 } });
    expect(r.error?.issues[0]?.path).toEqual(["spec", "timebasePpm"]);
  });
});
