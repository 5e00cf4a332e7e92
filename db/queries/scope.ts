import { eq, type SQL } from "drizzle-orm";
import { units } from "@/db/schema";

/**
 * Whose rows a caller may see. Lab staff see what their lab tests; a client sees the units it owns.
 * Every query over units, captures or analyses takes one of these and applies `unitScopeWhere`.
 */
export type Scope = { kind: "lab"; labId: string } | { kind: "manufacturer"; organisationId: string };

export function unitScopeWhere(scope: Scope): SQL {
  return scope.kind === "lab" ? eq(units.labId, scope.labId) : eq(units.organisationId, scope.organisationId);
}
