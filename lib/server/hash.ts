import { createHash, randomBytes, timingSafeEqual } from "node:crypto";

// Station API keys look like `emk_<prefix>.<secret>`: the prefix finds the row, the secret is
// compared against its stored sha256. A key is 24 random bytes, so a fast hash is enough.

const KEY_TAG = "emk_";

export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

export function generateStationKey(): { prefix: string; secret: string; token: string; secretHash: string } {
  const prefix = randomBytes(6).toString("hex");
  const secret = randomBytes(24).toString("base64url");
  return { prefix, secret, token: `${KEY_TAG}${prefix}.${secret}`, secretHash: sha256Hex(secret) };
}

/** Splits a bearer token into prefix and secret, or null when it is not shaped like a station key. */
export function parseStationKey(token: string): { prefix: string; secret: string } | null {
  const match = /^emk_([0-9a-f]{12})\.([A-Za-z0-9_-]{32})$/.exec(token.trim());
  if (!match) return null;
  return { prefix: match[1] as string, secret: match[2] as string };
}

export function secretMatches(secret: string, storedHash: string): boolean {
  const given = Buffer.from(sha256Hex(secret), "hex");
  const stored = Buffer.from(storedHash, "hex");
  return given.length === stored.length && timingSafeEqual(given, stored);
}
