import "server-only";
import { clientNameTaken, getClientForLab, insertClientForLab, listClientsForLab, updateClientForLab } from "@/db/queries/clients";
import { HttpError, requireRole } from "@/lib/auth/guards";
import { clientInputSchema } from "@/lib/ratings/input-schemas";
import { scopeFor } from "./scope";
import { InputError, parseFields } from "./setup-access";

// Client organisations of the lab manager's lab (through lab_clients). Lab managers only.

async function labManagerScope() {
  const admin = await requireRole("admin");
  const scope = scopeFor(admin);
  if (scope.kind !== "lab") throw new HttpError(403, "Clients belong to a lab");
  return scope;
}

export async function getClientsView() {
  const scope = await labManagerScope();
  const clients = await listClientsForLab(scope, { includeInactive: true });
  return { active: clients.filter((c) => !c.deactivatedAt), inactive: clients.filter((c) => c.deactivatedAt) };
}

export async function createClient(raw: unknown) {
  const scope = await labManagerScope();
  const input = parseFields(clientInputSchema, raw);
  if (await clientNameTaken(scope, input.name)) throw new InputError({ name: `Your lab already has a client named ${input.name}` });
  return insertClientForLab(scope, input);
}

export async function updateClient(clientId: string, raw: unknown) {
  const scope = await labManagerScope();
  const input = parseFields(clientInputSchema, raw);
  if (!(await getClientForLab(scope, clientId))) throw new HttpError(404, "No such client of your lab");
  if (await clientNameTaken(scope, input.name, clientId)) throw new InputError({ name: `Your lab already has a client named ${input.name}` });
  const row = await updateClientForLab(scope, clientId, input);
  if (!row) throw new HttpError(404, "No such client of your lab");
  return row;
}

/** Deactivating keeps the client, its ratings and units; it only stops new ratings for it. */
export async function setClientActive(clientId: string, active: boolean) {
  const scope = await labManagerScope();
  const row = await updateClientForLab(scope, clientId, { deactivatedAt: active ? null : new Date() });
  if (!row) throw new HttpError(404, "No such client of your lab");
  return row;
}
