import { describe, expect, it } from "vitest";
import { axisRange, formatTick, MIN_RELATIVE_SPAN, tickDecimals } from "@/lib/trends/axis";

describe("axisRange", () => {
  it("axisRange: a THD band up to 5 % reads from 0, not from 2.01275 to 2.0135 (common practice)", () => {
    const r = axisRange([2.01275, 2.0131, 2.0135], { lower: null, upper: 5 });
    expect(r.min).toBe(0);
    expect(r.max).toBeGreaterThanOrEqual(5);
    expect(r.max).toBeLessThan(5.5);
  });

  it("axisRange: a two-sided band sets the scale around the data and the limits", () => {
    const r = axisRange([399, 401], { lower: 380, upper: 420 }, [405, 395]);
    expect(r.min).toBeLessThanOrEqual(380);
    expect(r.max).toBeGreaterThanOrEqual(420);
    expect(r.max - r.min).toBeLessThan(40 * 1.2);
  });

  it("axisRange: without a band identical values span at least 0.5 % of their size", () => {
    const r = axisRange([50, 50, 50], null);
    expect(r.max - r.min).toBeGreaterThanOrEqual(50 * MIN_RELATIVE_SPAN);
    expect((r.max + r.min) / 2).toBeCloseTo(50, 9);
  });

  it("axisRange: data outside the band widens the scale to show it", () => {
    expect(axisRange([7.5], { lower: null, upper: 5 }).max).toBeGreaterThan(7.5);
  });
});

describe("tickDecimals and formatTick", () => {
  it("tickDecimals: enough places for ticks to differ (never \"50, 50\")", () => {
    expect(tickDecimals(5)).toBe(0);
    expect(tickDecimals(2.5)).toBe(1);
    expect(tickDecimals(0.2)).toBe(1);
    expect(tickDecimals(0.25)).toBe(2);
    expect(tickDecimals(0.001)).toBe(3);
    expect([49.8, 50, 50.2].map((t) => formatTick(t, 0.2))).toEqual(["49.8", "50.0", "50.2"]);
    expect(new Set([2.0128, 2.013, 2.0132].map((t) => formatTick(t, 0.0002))).size).toBe(3);
  });
});
