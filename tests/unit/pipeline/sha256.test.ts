import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { Sha256, sha256OfBlob } from "@/components/captures/sha256";

const reference = (data: Uint8Array) => createHash("sha256").update(data).digest("hex");

describe("Sha256 (browser-side upload hash)", () => {
  it("Sha256.digestHex() matches the FIPS 180-4 example for \"abc\" and the empty message", () => {
    // FIPS 180-4 / NIST example values.
    expect(new Sha256().update(new TextEncoder().encode("abc")).digestHex()).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(new Sha256().digestHex()).toBe("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
  });

  it("Sha256.update() in uneven pieces matches node:crypto at every length around the block size", () => {
    for (let n = 0; n < 300; n += 7) {
      const data = Uint8Array.from({ length: n }, (_, i) => (i * 31 + n) & 255);
      const h = new Sha256();
      for (let i = 0; i < n; i += 13) h.update(data.subarray(i, i + 13));
      expect(h.digestHex()).toBe(reference(data));
    }
  });

  it("sha256OfBlob(blob) matches node:crypto across slice boundaries", async () => {
    const data = Uint8Array.from({ length: 9 * 1024 ** 2 + 17 }, (_, i) => (i * 7) & 255);
    expect(await sha256OfBlob(new Blob([data]))).toBe(reference(data));
  });
});
