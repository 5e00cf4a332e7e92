import "server-only";
import { cache } from "react";
import { listCapturesForUnit } from "@/db/queries/captures";
import { evaluateUnitPlan } from "@/db/queries/unit-plan";
import { getUnit } from "@/db/queries/units";
import type { Scope } from "@/db/queries/scope";

// Reads several panels of one page make alike (the unit page's header, plan, release and attachment
// panels): each is read once per request. React's cache keys on the arguments' identity, so the
// scope goes in as plain strings. Outside a render (route handlers, actions, the worker) it reads
// every time.

const scopeOf = (kind: Scope["kind"], id: string): Scope => (kind === "lab" ? { kind, labId: id } : { kind, organisationId: id });
const keyOf = (scope: Scope): [Scope["kind"], string] => [scope.kind, scope.kind === "lab" ? scope.labId : scope.organisationId];

const unitOnce = cache((kind: Scope["kind"], id: string, unitId: string) => getUnit(scopeOf(kind, id), unitId));
const capturesOnce = cache((kind: Scope["kind"], id: string, unitId: string) => listCapturesForUnit(scopeOf(kind, id), unitId));
const planOnce = cache((kind: Scope["kind"], id: string, unitId: string) => evaluateUnitPlan(scopeOf(kind, id), unitId));

/** The unit with its rating, within the scope (undefined when out of scope or missing). */
export function unitInScope(scope: Scope, unitId: string) {
  return unitOnce(...keyOf(scope), unitId);
}

/** The unit's standing against its rating's plan, within the scope (null when out of scope). */
export function unitPlanInScope(scope: Scope, unitId: string) {
  return planOnce(...keyOf(scope), unitId);
}

/** The unit's captures with their current results, newest first (at most 200), within the scope. */
export function unitCapturesInScope(scope: Scope, unitId: string) {
  return capturesOnce(...keyOf(scope), unitId);
}
