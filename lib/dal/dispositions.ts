import "server-only";
import { recordDisposition } from "@/db/queries/unit-events";
import type { Unit } from "@/db/schema";
import { requireRole } from "@/lib/auth/guards";
import { scopeFor } from "./scope";

/** A quality engineer's or lab manager's disposition of a unit of their own lab. */
export async function recordUnitDisposition(unitId: string, to: Unit["disposition"], comment: string) {
  const user = await requireRole("qa", "admin");
  return recordDisposition(scopeFor(user), unitId, user.id, to, comment);
}
