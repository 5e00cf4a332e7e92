import { randomBytes } from "node:crypto";
import { sha256Hex } from "./hash";

// Personal API tokens of client users look like `ect_<prefix>.<secret>` (station keys use another tag):
// the prefix finds the row, the secret is compared against its stored sha256.

export function generateClientToken(): { prefix: string; token: string; secretHash: string } {
  const prefix = randomBytes(6).toString("hex");
  const secret = randomBytes(24).toString("base64url");
  return { prefix, token: `ect_${prefix}.${secret}`, secretHash: sha256Hex(secret) };
}

export function parseClientToken(token: string): { prefix: string; secret: string } | null {
  const match = /^ect_([0-9a-f]{12})\.([A-Za-z0-9_-]{32})$/.exec(token.trim());
  if (!match) return null;
  return { prefix: match[1] as string, secret: match[2] as string };
}
