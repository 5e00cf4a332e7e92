import { z } from "zod";
import { MACHINE_KINDS } from "@/lib/analysis";
import { planPutSchema, profileVersionSchema, ratingCreateSchema, ratingPatchSchema } from "@/lib/ratings/input-schemas";

// The ratings part of the bench API's OpenAPI document: readable with a station key or a session,
// changed by lab managers and quality engineers signed in (a station key gets 403 on writes).

const json = (schema: z.ZodType) => z.toJSONSchema(schema, { io: "input", unrepresentable: "any" });
const refused = { description: "Refused; `fields` names each refused field by its dotted path", content: { "application/json": { schema: { $ref: "#/components/schemas/FieldError" } } } };
const errors = (...codes: number[]) => Object.fromEntries(codes.map((c) => [String(c), refused]));
const idParam = { name: "id", in: "path", required: true, schema: { type: "string", format: "uuid" } };
const body = (ref: string) => ({ required: true, content: { "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } } });
const either = [{ stationKey: [] }, { session: [] }];
const sessionOnly = [{ session: [] }];
const query = (name: string, description: string, schema: Record<string, unknown>) => ({ name, in: "query", required: false, description, schema });

export const ratingPaths = {
  "/api/v1/ratings": {
    get: {
      summary: "The lab's ratings (machine models)", security: either,
      parameters: [
        query("client", "client organisation id", { type: "string", format: "uuid" }),
        query("kind", "machine kind", { enum: MACHINE_KINDS }),
        query("retired", "in use, retired or both", { enum: ["active", "retired", "all"], default: "active" }),
      ],
      responses: { "200": { description: "`{ ratings: [...] }`, each with its nameplate and `nameplateRows` (labels with units)" }, ...errors(400, 401, 403) },
    },
    post: {
      summary: "Create a rating; its tolerance profile version 1 is built from the preset", security: sessionOnly, requestBody: body("RatingCreate"),
      responses: { "201": { description: "`{ rating }`" }, ...errors(400, 401, 403, 409, 415, 422) },
    },
  },
  "/api/v1/ratings/{id}": {
    get: { summary: "A rating with its active plan", security: either, parameters: [idParam], responses: { "200": { description: "`{ rating, plan }`" }, ...errors(401, 403, 404) } },
    patch: { summary: "Change model code, title or nameplate (replaced whole)", security: sessionOnly, parameters: [idParam], requestBody: body("RatingPatch"), responses: { "200": { description: "`{ rating }`" }, ...errors(400, 401, 403, 404, 409, 422) } },
  },
  "/api/v1/ratings/{id}/retire": {
    post: {
      summary: "Retire a rating (never deleted); `{ retired: false }` brings it back", security: sessionOnly, parameters: [idParam],
      requestBody: { required: false, content: { "application/json": { schema: { type: "object", properties: { retired: { type: "boolean", default: true } } } } } },
      responses: { "200": { description: "`{ rating }`" }, ...errors(400, 401, 403, 404) },
    },
  },
  "/api/v1/ratings/{id}/profile": {
    get: { summary: "Every tolerance profile version, newest (in force) first, with who, when, why and what changed", security: either, parameters: [idParam], responses: { "200": { description: "`{ versions: [...] }`" }, ...errors(401, 403, 404) } },
    post: {
      summary: "Save a new immutable profile version with a reason", description: "Every check needs a band with its source or `required: false` with a reason; a missing band is refused. Analyses keep the version they were judged with.",
      security: sessionOnly, parameters: [idParam], requestBody: body("ProfileVersion"), responses: { "201": { description: "`{ version }` with `affectedCaptures`" }, ...errors(400, 401, 403, 404, 422) },
    },
  },
  "/api/v1/ratings/{id}/plan": {
    get: { summary: "The active test plan in order", security: either, parameters: [idParam], responses: { "200": { description: "`{ steps: [...] }`" }, ...errors(401, 403, 404) } },
    put: {
      summary: "Replace the plan", description: "A step with an `id` is kept and updated, one without is added, an active step left out is retired. Speed window as `speedMinRpm`/`speedMaxRpm` or `speedRpm` ± `speedTolerancePercent`. Only checks the profile in force judges.",
      security: sessionOnly, parameters: [idParam], requestBody: body("PlanPut"), responses: { "200": { description: "`{ steps: [...] }`" }, ...errors(400, 401, 403, 404, 409, 422) },
    },
  },
};

export const ratingSchemas = {
  FieldError: { type: "object", required: ["error"], properties: { error: { type: "string" }, fields: { type: "object", additionalProperties: { type: "string" } } } },
  RatingCreate: json(ratingCreateSchema),
  RatingPatch: json(ratingPatchSchema),
  ProfileVersion: json(profileVersionSchema),
  PlanPut: json(planPutSchema),
};

export const sessionScheme = {
  type: "apiKey", in: "cookie", name: "next-auth.session-token",
  description: "A signed-in person's session cookie (sign in at /sign-in). Required to change ratings, profiles and plans; JSON bodies only.",
};
