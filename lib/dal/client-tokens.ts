import "server-only";
import { z } from "zod";
import {
  findClientTokenByPrefix, insertClientToken, isActiveClientAdmin, listClientTokens, revokeClientToken, setClientAdmin, touchClientToken,
} from "@/db/queries/client-tokens";
import { listUsersForAdmin } from "@/db/queries/users";
import { HttpError, requireRole } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { secretMatches } from "@/lib/server/hash";
import { generateClientToken, parseClientToken } from "@/lib/server/client-token-format";

// Personal API tokens of a client's users, made and revoked by the client's administrator.

export const newClientTokenSchema = z.object({
  label: z.string().trim().min(2, "label: name the token, e.g. the system that uses it.").max(80, "label: at most 80 characters."),
  days: z.coerce.number({ error: "days: give a number of days." }).int("days: a whole number of days.").min(1, "days: at least 1.").max(365, "days: at most 365."),
});

async function requireClientAdmin(): Promise<SessionUser> {
  const user = await requireRole("manufacturer");
  if (!(await isActiveClientAdmin(user.id))) throw new HttpError(403, "Only your organisation's administrator manages API tokens.");
  return user;
}

export async function getClientTokensView() {
  const user = await requireRole("manufacturer");
  const admin = await isActiveClientAdmin(user.id);
  const now = Date.now();
  const tokens = admin ? await listClientTokens(user.organisationId) : [];
  return { isAdmin: admin, tokens: tokens.map((t) => ({ ...t, expired: t.expiresAt.getTime() <= now })) };
}

/** The token is returned once, here; only its sha256 is stored. */
export async function createClientToken(input: z.infer<typeof newClientTokenSchema>): Promise<{ token: string; expiresAt: Date }> {
  const user = await requireClientAdmin();
  const made = generateClientToken();
  const expiresAt = new Date(Date.now() + input.days * 86_400_000);
  await insertClientToken({ organisationId: user.organisationId, userId: user.id, label: input.label, prefix: made.prefix, secretHash: made.secretHash, expiresAt });
  return { token: made.token, expiresAt };
}

export async function revokeMyOrganisationToken(tokenId: string): Promise<boolean> {
  const user = await requireClientAdmin();
  if (!z.uuid().safeParse(tokenId).success) return false;
  return revokeClientToken(user.organisationId, tokenId);
}

/** A lab manager makes (or unmakes) one of its clients' users that client's token administrator. */
export async function setClientAdministrator(userId: string, active: boolean): Promise<boolean> {
  const admin = await requireRole("admin");
  const target = (await listUsersForAdmin(admin.organisationId)).find((u) => u.id === userId);
  if (!target || target.role !== "manufacturer") return false;
  await setClientAdmin(userId, admin.id, active);
  return true;
}

export type ClientCaller = { organisationId: string; userId: string; tokenId: string };

/** `Authorization: Bearer ect_<prefix>.<secret>`; every refusal is a 401 with a sentence. */
export async function requireClientToken(request: Request): Promise<ClientCaller> {
  const match = /^Bearer\s+(\S+)$/i.exec(request.headers.get("authorization") ?? "");
  if (!match) throw new HttpError(401, "Send your API token: Authorization: Bearer ect_<prefix>.<secret>.");
  const parsed = parseClientToken(match[1] as string);
  if (!parsed) throw new HttpError(401, "That is not an Emfolio API token (expected ect_<12 hex>.<32 characters>).");
  const found = await findClientTokenByPrefix(parsed.prefix);
  if (!found || !secretMatches(parsed.secret, found.token.secretHash)) throw new HttpError(401, "Unknown API token.");
  const t = found.token;
  if (t.revokedAt) throw new HttpError(401, `This API token was revoked on ${t.revokedAt.toISOString().slice(0, 10)}: ask your organisation's administrator for a new one.`);
  if (t.expiresAt.getTime() <= Date.now()) throw new HttpError(401, `This API token expired on ${t.expiresAt.toISOString().slice(0, 10)}: ask your organisation's administrator for a new one.`);
  if (found.userDisabledAt || found.userOrganisationId !== t.organisationId) throw new HttpError(401, "The account this API token belongs to is disabled.");
  if (!t.lastUsedAt || Date.now() - t.lastUsedAt.getTime() > 60_000) await touchClientToken(t.id);
  return { organisationId: t.organisationId, userId: t.userId, tokenId: t.id };
}
