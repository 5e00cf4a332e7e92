import { z } from "zod";
import { analysisReportSchema } from "@/lib/analysis";
import { captureState } from "@/db/schema";
import { captureCorrectionSchema, captureRegistrationSchema, completeUploadSchema, presignPartsSchema, TEST_KINDS } from "./input-schemas";
import { CAPTURE_SORTS, CAPTURE_VERDICT_FILTERS } from "./list-query";
import { ratingPaths, ratingSchemas, sessionScheme } from "./openapi-ratings";
import { clientTokenScheme, reportPaths } from "./openapi-reports";

// The bench API's OpenAPI 3.1 document, built from the same zod schemas the handlers parse with.

const json = (schema: z.ZodType) => z.toJSONSchema(schema, { io: "input", unrepresentable: "any" });
const error = { description: "Refused, with a message a person can act on", content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } } };
const errors = (...codes: number[]) => Object.fromEntries(codes.map((c) => [String(c), error]));
const idParam = { name: "id", in: "path", required: true, schema: { type: "string", format: "uuid" } };
const body = (ref: string) => ({ required: true, content: { "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } } });
const ok = (description: string, ref: string) => ({ description, content: { "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } } });

const query = (name: string, description: string, schema: Record<string, unknown>) => ({ name, in: "query", required: false, description, schema });
const listParameters = [
  query("q", "serial number contains (case-insensitive)", { type: "string", maxLength: 64 }),
  query("state", "capture state", { enum: captureState.enumValues }),
  query("overall", "verdict of the current analysis; unjudged = no analysis yet", { enum: CAPTURE_VERDICT_FILTERS }),
  query("kind", "test kind", { enum: TEST_KINDS }),
  query("sort", "captured time or a figure of the current analysis (captures without it come last)", { enum: CAPTURE_SORTS, default: "captured" }),
  query("dir", "sort direction", { enum: ["asc", "desc"], default: "desc" }),
  query("page", "50 captures a page", { type: "integer", minimum: 1, default: 1 }),
];

const captureStatus = {
  type: "object",
  description: "A capture as stored. `analysis` is present once the state is analysed.",
  required: ["id", "state", "progress", "serial", "sha256", "sizeBytes"],
  properties: {
    id: { type: "string", format: "uuid" },
    unitId: { type: "string", format: "uuid" },
    serial: { type: "string" },
    state: { enum: ["uploading", "queued", "analysing", "analysed", "rejected", "failed"] },
    stateMessage: { type: ["string", "null"], description: "The engine's reason when rejected; the infrastructure error when failed or retrying" },
    progress: { type: "integer", minimum: 0, maximum: 100 },
    attempts: { type: "integer" },
    testKind: { type: "string" }, speedRpm: { type: ["number", "null"] }, originalName: { type: "string" },
    sizeBytes: { type: "integer" }, sha256: { type: "string" },
    createdAt: { type: "string", format: "date-time" }, uploadedAt: { type: ["string", "null"] }, analysedAt: { type: ["string", "null"] },
    analysis: {
      oneOf: [{ type: "null" }, {
        type: "object",
        properties: {
          analysisVersion: { type: "string" }, overall: { type: ["string", "null"] }, frequencyHz: { type: ["number", "null"] },
          worstThdPercent: { type: ["number", "null"] }, vufPercent: { type: ["number", "null"] }, keLineRmsPerKrpm: { type: ["number", "null"] },
          report: { $ref: "#/components/schemas/AnalysisReport" },
        },
      }],
    },
  },
};

export function buildOpenApiDocument(serverUrl: string) {
  return {
    openapi: "3.1.0",
    info: {
      title: "Emfolio bench API", version: "1",
      description: "Upload captures from a bench PC and read their analysis. Authenticate with a station key: `Authorization: Bearer emk_<prefix>.<secret>`. The ratings routes also accept a signed-in session (reads with either; changes need a lab manager's or quality engineer's session). See docs/bench-api.md for a complete curl session. Clients read their released reports under /api/v1/reports with a personal token (docs/client-api.md).",
    },
    servers: [{ url: serverUrl }],
    security: [{ stationKey: [] }],
    paths: {
      "/api/v1/captures": {
        get: {
          summary: "One page of the lab's captures, filtered and sorted",
          parameters: listParameters,
          responses: { "200": { description: "`{ captures: [...], page, hasMore }`; each capture with its state, verdict and headline figures" }, ...errors(400, 401) },
        },
        post: {
          summary: "Register a capture and receive upload URL(s)",
          description: "Same sha256 for the same unit returns the existing capture (200, duplicate: true) instead of a new one. Files above 32 MiB get a multipart plan.",
          requestBody: body("CaptureRegistration"),
          responses: { "201": ok("Registered; upload to the URL(s), then call complete", "Registered"), "200": ok("Already registered (duplicate)", "Registered"), ...errors(400, 401, 403, 409, 413, 422) },
        },
      },
      "/api/v1/captures/{id}/complete": {
        post: {
          summary: "Close the upload and queue the analysis",
          description: "Checks the stored size and the header row. For multipart uploads, send every part's ETag.",
          parameters: [idParam], requestBody: body("CompleteUpload"),
          responses: { "202": ok("Queued (or the capture as it is, if already completed)", "CaptureStatus"), ...errors(400, 401, 404, 409, 415, 422) },
        },
      },
      "/api/v1/captures/{id}/parts": {
        post: { summary: "URLs for parts of a multipart upload, each bound to the part's length and the sha256 sent for it", parameters: [idParam], requestBody: body("PresignParts"), responses: { "200": { description: "Part URLs, each with the headers to send (x-amz-checksum-sha256)" }, ...errors(400, 401, 404, 409) } },
      },
      "/api/v1/captures/{id}": {
        get: { summary: "State, progress and (once analysed) the report", parameters: [idParam], responses: { "200": ok("The capture", "CaptureStatus"), ...errors(401, 404) } },
        patch: {
          summary: "Correct the capture's settings (channel roles, probe ratios, offsets, speed, test kind, plan step) with a reason; it is analysed again and the earlier result kept",
          parameters: [idParam], requestBody: body("CaptureCorrection"),
          responses: { "202": ok("The capture, queued for a new analysis", "CaptureStatus"), ...errors(400, 401, 403, 404, 409, 422) },
        },
      },
      "/api/v1/units/{serial}": {
        get: {
          summary: "A unit with its captures, states and verdicts",
          parameters: [{ name: "serial", in: "path", required: true, schema: { type: "string" } }],
          responses: { "200": { description: "The unit" }, ...errors(401, 404) },
        },
      },
      ...ratingPaths,
      ...reportPaths,
    },
    components: {
      securitySchemes: { stationKey: { type: "http", scheme: "bearer", description: "A station key created by a lab manager on the Benches page" }, session: sessionScheme, clientToken: clientTokenScheme },
      schemas: {
        Error: { type: "object", required: ["error"], properties: { error: { type: "string" } } },
        CaptureRegistration: json(captureRegistrationSchema),
        CaptureCorrection: json(captureCorrectionSchema),
        CompleteUpload: json(completeUploadSchema),
        PresignParts: json(presignPartsSchema),
        CaptureStatus: captureStatus,
        Registered: {
          type: "object",
          properties: {
            capture: { $ref: "#/components/schemas/CaptureStatus" }, duplicate: { type: "boolean" },
            upload: { description: "null when nothing is left to upload", oneOf: [{ type: "null" }, { type: "object", properties: {
              kind: { enum: ["single", "multipart"] }, method: { const: "PUT" }, url: { type: "string" }, headers: { type: "object" },
              partSize: { type: "integer" }, partCount: { type: "integer", description: "multipart: ask the parts endpoint for each part's URL with the part's sha256" },
              expiresInS: { type: "integer" },
            } }] },
          },
        },
        AnalysisReport: json(analysisReportSchema),
        ...ratingSchemas,
      },
    },
  };
}
