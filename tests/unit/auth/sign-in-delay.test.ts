import { describe, expect, it } from "vitest";
import { signInDelayMs } from "@/lib/auth/sign-in-delay";

describe("signInDelayMs(failures, free, capMs)", () => {
  it("signInDelayMs is zero below the free attempts, then 1 s doubling per failure up to the cap", () => {
    expect(signInDelayMs(0, 8)).toBe(0);
    expect(signInDelayMs(7, 8)).toBe(0);
    expect(signInDelayMs(8, 8)).toBe(1000);
    expect(signInDelayMs(9, 8)).toBe(2000);
    expect(signInDelayMs(11, 8)).toBe(8000);
    expect(signInDelayMs(12, 8)).toBe(16_000);
    expect(signInDelayMs(40, 8)).toBe(16_000);
    expect(signInDelayMs(9, 8, 1500)).toBe(1500);
  });
});
