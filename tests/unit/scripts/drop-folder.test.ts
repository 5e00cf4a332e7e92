import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
// @ts-expect-error plain .mjs without types
import { captureMeta, RefusedError } from "@/scripts/drop-folder/capture-meta.mjs";
// @ts-expect-error plain .mjs without types
import { retryAfterMs } from "@/scripts/drop-folder/http.mjs";
// @ts-expect-error plain .mjs without types
import { DEFAULT_PATTERN, readStationKey, UsageError } from "@/scripts/drop-folder/options.mjs";
import { headerSignature, sniffCaptureHeader } from "@/lib/analysis";

describe("drop-folder pieces", () => {
  it("captureMeta reads serial, kind and speed from the default name pattern, else refuses naming the pattern", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "emfolio-meta-"));
    const pattern = new RegExp(DEFAULT_PATTERN);
    expect(captureMeta(path.join(dir, "KG45-260301_back-emf_3000rpm_run2.csv"), pattern, undefined)).toMatchObject({ unitSerial: "KG45-260301", testKind: "back-emf", speedRpm: 3000 });
    expect(() => captureMeta(path.join(dir, "export.csv"), pattern, undefined)).toThrow(RefusedError);
    writeFileSync(path.join(dir, "export.csv.json"), JSON.stringify({ unitSerial: "PM-7", testKind: "load", speedRpm: 1200.5 }));
    expect(captureMeta(path.join(dir, "export.csv"), pattern, undefined)).toMatchObject({ unitSerial: "PM-7", testKind: "load", speedRpm: 1200.5 });
    writeFileSync(path.join(dir, "bad.csv.json"), JSON.stringify({ unitSerial: "PM-7", testKind: "load", key: "x" }));
    expect(() => captureMeta(path.join(dir, "bad.csv"), pattern, undefined)).toThrow(/unknown fields: key/);
  });

  it("retryAfterMs reads seconds and HTTP dates, capped at ten minutes (RFC 9110 Retry-After)", () => {
    expect(retryAfterMs("3")).toBe(3000);
    expect(retryAfterMs("99999")).toBe(600_000);
    expect(retryAfterMs(new Date(1_000_000 + 7000).toUTCString(), 1_000_000)).toBe(7000);
    expect(retryAfterMs(null)).toBeNull();
  });

  it("readStationKey refuses a group- or world-readable key file and takes the environment otherwise", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "emfolio-key-"));
    const loose = path.join(dir, "loose");
    writeFileSync(loose, "emk_a.b", { mode: 0o640 });
    expect(() => readStationKey({ keyFile: loose }, {})).toThrow(UsageError);
    const tight = path.join(dir, "tight");
    writeFileSync(tight, "emk_a.b\n", { mode: 0o600 });
    expect(readStationKey({ keyFile: tight }, {})).toBe("emk_a.b");
    expect(readStationKey({}, { EMFOLIO_STATION_KEY: "emk_c.d" })).toBe("emk_c.d");
    expect(() => readStationKey({}, {})).toThrow(/No station key/);
  });
});

describe("headerSignature", () => {
  it("headerSignature ignores preamble values and changes with a column name or the time column", () => {
    const body = "\n0,1,2\n0.001,1,2\n0.002,1,2\n0.003,1,2\n";
    const a = headerSignature(sniffCaptureHeader(`Date: 2026-03-01\nTime (s),CH1 (V),CH2 (V)${body}`));
    const b = headerSignature(sniffCaptureHeader(`Date: 2026-04-17\nTime (s),CH1 (V),CH2 (V)${body}`));
    const c = headerSignature(sniffCaptureHeader(`Time (s),CH1 (V),CH3 (V)${body}`));
    expect(a.signature).toMatch(/^h1-[0-9a-f]{16}$/);
    expect(b.signature).toBe(a.signature);
    expect(c.signature).not.toBe(a.signature);
    expect(a.preview).toBe("Time (s) | CH1 (V) | CH2 (V)");
  });
});
