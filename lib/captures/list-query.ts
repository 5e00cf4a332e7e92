import { z } from "zod";
import { captureState } from "@/db/schema";
import { TEST_KINDS } from "./input-schemas";

// The captures list's query string: the page, GET /api/captures and GET /api/v1/captures alike.

export const CAPTURE_SORTS = ["captured", "frequency", "thd", "vuf", "ke"] as const;
export type CaptureSort = (typeof CAPTURE_SORTS)[number];
export const CAPTURE_VERDICT_FILTERS = ["pass", "marginal", "inconclusive", "fail", "not-applicable", "unjudged"] as const;

const blank = (v: unknown) => (Array.isArray(v) ? v[0] : v === "" ? undefined : v);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());

export const captureListQuerySchema = z.object({
  // No control characters: PostgreSQL refuses a NUL in text, which answered 500.
  q: optional(z.string().trim().max(64).regex(/^[^\u0000-\u001f\u007f]*$/, "must not contain control characters")),
  state: optional(z.enum(captureState.enumValues)),
  overall: optional(z.enum(CAPTURE_VERDICT_FILTERS)),
  kind: optional(z.enum(TEST_KINDS)),
  sort: z.preprocess(blank, z.enum(CAPTURE_SORTS).default("captured")),
  dir: z.preprocess(blank, z.enum(["asc", "desc"]).default("desc")),
  page: z.preprocess(blank, z.coerce.number().int().min(1).max(10_000).default(1)),
});

export type CaptureListQuery = z.infer<typeof captureListQuerySchema>;
