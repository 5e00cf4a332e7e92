import { describe, expect, it } from "vitest";
import { axisLabel, stepDecimals, tickLabels, unitsInOrder } from "@/components/plots/axes";

describe("axisLabel(unit)", () => {
  it("names the quantity and its unit", () => {
    expect(axisLabel("V")).toBe("Voltage (V)");
    expect(axisLabel("A")).toBe("Current (A)");
    expect(axisLabel("s")).toBe("Time (s)");
    expect(axisLabel("%", "Harmonic RMS relative to the fundamental")).toBe("Harmonic RMS relative to the fundamental (%)");
  });
});

describe("tickLabels(splits)", () => {
  it("prints zero as 0 when the split lands on -1e-17, with the decimals of the spacing (common practice)", () => {
    expect(tickLabels([-0.5, -0.25, -1.3877787807814457e-17, 0.25, 0.5])).toEqual(["-0.50", "-0.25", "0.00", "0.25", "0.50"]);
    expect(tickLabels([-400, -200, -5.684e-14, 200, 400])).toEqual(["-400", "-200", "0", "200", "400"]);
    expect(tickLabels([0.001, 0.002, 0.003])).toEqual(["0.001", "0.002", "0.003"]);
  });
  it("stepDecimals(step) gives the places that print a spacing exactly", () => {
    expect(stepDecimals(0.25)).toBe(2);
    expect(stepDecimals(5)).toBe(0);
    expect(stepDecimals(0.1 + 0.2)).toBe(1);
    expect(stepDecimals(0)).toBe(0);
  });
});

describe("unitsInOrder(units)", () => {
  it("gives one axis per unit present, voltage first", () => {
    expect(unitsInOrder(["A", "V", "V", "A"])).toEqual(["V", "A"]);
    expect(unitsInOrder(["V"])).toEqual(["V"]);
  });
});
