import { and, eq, sql, type AnyColumn, type SQL } from "drizzle-orm";
import { labClients, units } from "@/db/schema";

/**
 * Whose rows a caller may see. Lab staff see what their lab tests; a client sees the units it owns
 * that were tested by a lab it is linked to (lab_clients), never another lab's work for it.
 * Every query over units, captures or analyses takes one of these and applies `unitScopeWhere`.
 */
export type Scope = { kind: "lab"; labId: string } | { kind: "manufacturer"; organisationId: string };

export function unitScopeWhere(scope: Scope): SQL {
  if (scope.kind === "lab") return eq(units.labId, scope.labId);
  return and(
    eq(units.organisationId, scope.organisationId),
    sql`exists (select 1 from ${labClients} where ${labClients.labId} = ${units.labId} and ${labClients.clientId} = ${scope.organisationId})`,
  ) as SQL;
}

/** Rows of client organisations a lab works for: `column` holds the client's organisation id. */
export function linkedClientWhere(labId: string, column: AnyColumn): SQL {
  return sql`exists (select 1 from ${labClients} where ${labClients.labId} = ${labId} and ${labClients.clientId} = ${column})`;
}
