import "server-only";
import type { Scope } from "@/db/queries/scope";
import type { SessionUser } from "@/lib/auth/options";
import { HttpError } from "@/lib/auth/guards";

/** Lab roles act for their lab; a client's users read their own organisation's units only. */
export function scopeFor(user: SessionUser): Scope {
  if (user.role === "manufacturer") return { kind: "manufacturer", organisationId: user.organisationId };
  if (user.organisationKind !== "lab") throw new HttpError(403, "A lab role needs a lab organisation.");
  return { kind: "lab", labId: user.organisationId };
}
