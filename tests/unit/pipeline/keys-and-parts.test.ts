import { describe, expect, it } from "vitest";
import { generateStationKey, parseStationKey, secretMatches } from "@/lib/server/hash";
import { analysisJobId } from "@/lib/server/queue";
import { captureObjectKey, partCountFor, partSizeFor } from "@/lib/server/storage";

describe("station keys", () => {
  it("generateStationKey() round-trips through parseStationKey() and matches only its own secret", () => {
    const key = generateStationKey();
    const parsed = parseStationKey(key.token);
    expect(parsed).toEqual({ prefix: key.prefix, secret: key.secret });
    expect(secretMatches(key.secret, key.secretHash)).toBe(true);
    expect(secretMatches(generateStationKey().secret, key.secretHash)).toBe(false);
    expect(key.secretHash).not.toContain(key.secret);
  });

  it("parseStationKey() refuses anything not shaped like a key", () => {
    for (const bad of ["", "emk_", "Bearer x", "emk_zzzzzzzzzzzz.abc", `emk_0123456789ab.${"a".repeat(31)}`, `emk_0123456789ab.${"a".repeat(32)}x`]) {
      expect(parseStationKey(bad)).toBeNull();
    }
  });
});

describe("object keys, parts and job ids", () => {
  it("captureObjectKey(lab, unit, capture) keys raw objects by organisation, unit and capture", () => {
    expect(captureObjectKey("L", "U", "C")).toBe("captures/L/U/C.csv");
  });

  it("partSizeFor(size) keeps within S3's 10 000 parts and 5 MiB minimum (S3 multipart limits)", () => {
    for (const size of [33 * 1024 ** 2, 1024 ** 3, 2 * 1024 ** 3, 200 * 1024 ** 3]) {
      expect(partSizeFor(size)).toBeGreaterThanOrEqual(5 * 1024 ** 2);
      expect(partCountFor(size)).toBeLessThanOrEqual(10_000);
      expect(partCountFor(size) * partSizeFor(size)).toBeGreaterThanOrEqual(size);
    }
    expect(partCountFor(1024 ** 3)).toBe(64);
  });

  it("analysisJobId(capture, version) is stable and free of ':' (BullMQ refuses it in custom ids)", () => {
    expect(analysisJobId("abc", "1.2.0")).toBe(analysisJobId("abc", "1.2.0"));
    expect(analysisJobId("abc", "1.2.0")).not.toBe(analysisJobId("abc", "1.3.0"));
    expect(analysisJobId("abc", "1:2")).not.toContain(":");
  });
});
