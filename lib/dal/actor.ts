import "server-only";
import type { Scope } from "@/db/queries/scope";
import type { Role } from "@/db/schema";
import { findStationKeyByPrefix, touchStationKey } from "@/db/queries/station-keys";
import { findActiveUserById } from "@/db/queries/users";
import { HttpError, requireApiUser, requireRole, requireUser } from "@/lib/auth/guards";
import type { SessionUser } from "@/lib/auth/options";
import { parseStationKey, secretMatches } from "@/lib/server/hash";
import { scopeFor } from "./scope";

declare const authorised: unique symbol;

type ActorFields = {
  readonly scope: Scope;
  readonly role: Role | "station";
  readonly userId: string | null;
  readonly stationKeyId: string | null;
  readonly stationId: string | null;
  /** Lab managers, operators and station keys may register and upload captures. */
  readonly canUpload: boolean;
};

/**
 * Who is asking: a signed-in person or a bench PC with a station key. Both end in a Scope. Branded:
 * only the guards below make one, so an object literal of the same shape does not pass as authorised.
 */
export type Actor = ActorFields & { readonly [authorised]: true };

const mint = (fields: ActorFields): Actor => Object.freeze(fields) as Actor;

function actorForUser(user: SessionUser): Actor {
  return mint({
    scope: scopeFor(user), role: user.role, userId: user.id, stationKeyId: null, stationId: null,
    canUpload: user.role === "admin" || user.role === "operator",
  });
}

/** For the session handlers the browser calls: 401/403 as HttpError. */
export async function requireSessionActor(): Promise<Actor> {
  return actorForUser(await requireApiUser());
}

/** For pages and server actions: no session -> sign-in page. */
export async function requirePageActor(): Promise<Actor> {
  return actorForUser(await requireUser());
}

/** For pages and server actions that need one of these roles: wrong role -> access-denied page. */
export async function requireRoleActor(...roles: Role[]): Promise<Actor> {
  return actorForUser(await requireRole(...roles));
}

/** For trusted processes (the demo seeding script, tests): the stored, enabled account with this id. */
export async function actorForStoredUser(userId: string): Promise<Actor> {
  const user = await findActiveUserById(userId);
  if (!user) throw new HttpError(401, "No enabled account with that id");
  return actorForUser(user);
}

/** For the bench API: `Authorization: Bearer emk_<prefix>.<secret>`. */
export async function requireStationActor(request: Request): Promise<Actor> {
  const match = /^Bearer\s+(\S+)$/i.exec(request.headers.get("authorization") ?? "");
  if (!match) throw new HttpError(401, "Send a station key: Authorization: Bearer emk_<prefix>.<secret>");
  const parsed = parseStationKey(match[1] as string);
  if (!parsed) throw new HttpError(401, "That is not a station key (expected emk_<12 hex>.<32 characters>)");
  const found = await findStationKeyByPrefix(parsed.prefix);
  if (!found || !secretMatches(parsed.secret, found.key.secretHash)) throw new HttpError(401, "Unknown station key");
  if (found.key.revokedAt) {
    throw new HttpError(401, `This station key was revoked on ${found.key.revokedAt.toISOString().slice(0, 10)}: ask a lab manager for a new one`);
  }
  const stale = !found.key.lastUsedAt || Date.now() - found.key.lastUsedAt.getTime() > 60_000;
  if (stale) await touchStationKey(found.key.id);
  return mint({ scope: { kind: "lab", labId: found.labId }, role: "station", userId: null, stationKeyId: found.key.id, stationId: found.key.stationId, canUpload: true });
}

export function requireUploader(actor: Actor): Scope & { kind: "lab" } {
  if (!actor.canUpload || actor.scope.kind !== "lab") throw new HttpError(403, "Only lab managers, bench operators and station keys may upload captures");
  return actor.scope;
}
