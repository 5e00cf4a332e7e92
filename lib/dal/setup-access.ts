import "server-only";
import type { z } from "zod";
import type { Scope } from "@/db/queries/scope";
import { HttpError } from "@/lib/auth/guards";
import { describeFieldErrors, fieldErrorsOf } from "@/lib/ratings/field-errors";
import { requireSessionActor, requireStationActor, type Actor } from "./actor";

// Who may read and change a lab's set-up (clients, ratings, profiles, plans), and input refusals that
// name their fields.

/** A refused input: one message per field, keyed by the field's dotted path. */
export class InputError extends HttpError {
  constructor(readonly fields: Record<string, string>, status = 422) {
    super(status, `Check the fields: ${describeFieldErrors(fields)}`);
  }
}

export function parseFields<S extends z.ZodType>(schema: S, raw: unknown, status = 422): z.output<S> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw new InputError(fieldErrorsOf(parsed.error), status);
  return parsed.data;
}

/** Lab staff and the lab's station keys read ratings, profiles and plans. */
export function requireSetupReader(actor: Actor): Scope & { kind: "lab" } {
  if (actor.scope.kind !== "lab") throw new HttpError(403, "Ratings and plans are the lab's set-up: clients read their released reports");
  return actor.scope;
}

/** Lab managers and quality engineers change ratings, profiles and plans; a station key only reads them. */
export function requireSetupEditor(actor: Actor): Scope & { kind: "lab" } {
  const scope = requireSetupReader(actor);
  if (actor.role === "station") throw new HttpError(403, "A station key reads ratings; a lab manager or quality engineer signs in to change them");
  if (actor.role !== "admin" && actor.role !== "qa") throw new HttpError(403, "Only lab managers and quality engineers change ratings, profiles and plans");
  return scope;
}

/** For /api/v1 set-up routes: a station key when an Authorization header is sent, else the session. */
export async function requireApiActor(request: Request): Promise<Actor> {
  return request.headers.has("authorization") ? requireStationActor(request) : requireSessionActor();
}

/** Like errorResponse, with the refused fields in the body. */
export function setupErrorResponse(err: unknown): Response {
  if (err instanceof InputError) return Response.json({ error: err.message, fields: err.fields }, { status: err.status });
  if (err instanceof HttpError) return Response.json({ error: err.message }, { status: err.status });
  console.error(err);
  return Response.json({ error: "Something went wrong on the server." }, { status: 500 });
}

/** What a set-up form shows after a refused or accepted submit (field errors keyed like the inputs' names). */
export type SetupFormState = { ok: boolean; message: string; fieldErrors?: Record<string, string>; values?: Record<string, string> };

/** A refusal as form state; anything that is not a refusal (a redirect, a crash) is thrown on. */
export function refusedForm(err: unknown, form: FormData): SetupFormState {
  if (!(err instanceof HttpError)) throw err;
  const values: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === "string" && !k.startsWith("$")) values[k] = v.slice(0, 500);
  if (err instanceof InputError) return { ok: false, message: "Check the highlighted fields.", fieldErrors: err.fields, values };
  return { ok: false, message: err.message, values };
}
