import { describe, expect, it } from "vitest";
import { formatFigure, formatFigureParts, formatFigureWithUnit, quantityFor, roundToDecimals, uncertaintyDecimals } from "@/lib/verdicts/format-figure";

describe("formatFigure(value, {uncertainty})", () => {
  it("rounds U to two significant digits and the value to the same place (GUM 7.2.6)", () => {
    // GUM, JCGM 100:2008, 7.2.6: U to at most two significant digits, the estimate to the same position.
    expect(formatFigureParts(0.0006097, { quantity: "percent", uncertainty: 0.0002 })).toEqual({ value: "0.00061", uncertainty: "0.00020", decimals: 5 });
    expect(formatFigureWithUnit(49.300014, "Hz", { quantity: "frequency", uncertainty: 0.01 })).toBe("49.300 ± 0.010 Hz");
    // GUM 7.2.2 example: mS = 100.02147 g with u = 0.35 mg, written 100.021 47(35) g.
    expect(formatFigureParts(100.02147, { quantity: "ratio", uncertainty: 0.00035 })).toEqual({ value: "100.02147", uncertainty: "0.00035", decimals: 5 });
  });

  it("keeps two digits when rounding U carries into the next decade (0.0996 → 0.10)", () => {
    // Common practice: 0.0996 to two significant digits is 0.10, two decimal places, not 0.100.
    expect(uncertaintyDecimals(0.0996)).toBe(2);
    expect(formatFigureWithUnit(400.1234, "V", { quantity: "voltage", uncertainty: 0.0996 })).toBe("400.12 ± 0.10 V");
    expect(formatFigureWithUnit(4163.2, "V", { quantity: "voltage", uncertainty: 123 })).toBe("4160 ± 120 V");
  });

  it("ignores a missing, zero, negative or non-finite uncertainty and uses the resolution", () => {
    for (const uncertainty of [null, undefined, 0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(formatFigure(49.300014, { quantity: "frequency", uncertainty })).toBe("49.300");
    }
  });
});

describe("formatFigure(value, {quantity}) without an uncertainty", () => {
  it("rounds to each quantity's resolution in the table", () => {
    // Resolutions from the table in lib/verdicts/format-figure.ts (common practice).
    expect(formatFigure(0.0006097, { quantity: "percent" })).toBe("0.00");
    expect(formatFigure(2.3456, { quantity: "percent" })).toBe("2.35");
    expect(formatFigure(49.300014, { quantity: "frequency" })).toBe("49.300");
    expect(formatFigure(120.04, { quantity: "angle" })).toBe("120.0");
    expect(formatFigure(400.123, { quantity: "voltage" })).toBe("400.1");
    expect(formatFigure(4160.4, { quantity: "voltage" })).toBe("4160");
    expect(formatFigure(0.2345, { quantity: "current" })).toBe("0.235");
    expect(formatFigure(267.04, { quantity: "ke" })).toBe("267.0");
    expect(formatFigure(34.6, { quantity: "tif" })).toBe("35");
    expect(formatFigure(3.99961, { quantity: "poles" })).toBe("4.00");
    expect(formatFigure(1499.6, { quantity: "speed" })).toBe("1500");
  });

  it("drops a digit when 4 significant digits round into the next decade (9999.7 V)", () => {
    expect(formatFigure(9999.7, { quantity: "voltage" })).toBe("10000");
    expect(formatFigure(0.99996, { quantity: "ke" })).toBe("1.000");
  });

  it("never prints -0", () => {
    expect(formatFigure(-0.00001, { quantity: "tif" })).toBe("0");
    expect(formatFigure(-0.00001, { quantity: "angle" })).toBe("0.0");
    expect(formatFigure(-0.00001, { quantity: "voltage" })).toBe("0.000");
    expect(formatFigure(-0, { quantity: "percent" })).toBe("0.00");
    expect(formatFigure(-0.00001, { quantity: "percent", uncertainty: 0.002 })).toBe("0.0000");
    expect(formatFigure(-0.4, { quantity: "speed" })).toBe("0");
    expect(formatFigure(-2.5, { quantity: "speed" })).toBe("-3");
  });

  it("gives a dash for a figure that could not be computed", () => {
    expect(formatFigure(null, { quantity: "percent" })).toBe("—");
    expect(formatFigure(Number.NaN, { quantity: "percent" })).toBe("—");
    expect(formatFigureWithUnit(undefined, "Hz", { quantity: "frequency" })).toBe("—");
  });
});

describe("roundToDecimals(value, decimals)", () => {
  it("rounds decimal halves away from zero despite binary representation", () => {
    // 1.005 is stored as 1.00499999999999989…; written in decimal it is a half (common practice).
    expect(roundToDecimals(1.005, 2)).toBe("1.01");
    expect(roundToDecimals(-1.005, 2)).toBe("-1.01");
    expect(roundToDecimals(1234.5, -1)).toBe("1230");
    expect(roundToDecimals(1235, -1)).toBe("1240");
    expect(roundToDecimals(-1.3877787807814457e-17, 2)).toBe("0.00");
    expect(roundToDecimals(1.2345e-7, 9)).toBe("0.000000123");
    expect(roundToDecimals(123456789, -3)).toBe("123457000");
  });
});

describe("quantityFor(unit, check)", () => {
  it("reads the quantity from a verdict's unit, and TIF, pole count and Ke from the check", () => {
    expect(quantityFor("%")).toBe("percent");
    expect(quantityFor("Hz", "frequency")).toBe("frequency");
    expect(quantityFor("", "tif")).toBe("tif");
    expect(quantityFor("", "pole-count")).toBe("poles");
    expect(quantityFor("V/krpm", "back-emf-constant")).toBe("ke");
    expect(quantityFor("°")).toBe("angle");
  });
});
