import { z } from "zod";
import { captureState } from "@/db/schema";
import { TEST_KINDS } from "./input-schemas";

// The captures list's query string: the page, GET /api/captures and GET /api/v1/captures alike.

export const CAPTURE_SORTS = ["captured", "frequency", "thd", "vuf", "ke"] as const;
export type CaptureSort = (typeof CAPTURE_SORTS)[number];
export const CAPTURE_VERDICT_FILTERS = ["pass", "marginal", "inconclusive", "fail", "not-applicable", "unjudged"] as const;

const blank = (v: unknown) => (Array.isArray(v) ? v[0] : v === "" ? undefined : v);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());

/** A row's place in a list by capture time: its time to the microsecond (UTC) and its id. */
const CURSOR = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z~[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export type ListPlace = { at: string; id: string };

/** The place a cursor names (it passed the schema's pattern). */
export function placeOf(cursor: string | undefined): ListPlace | undefined {
  if (!cursor) return undefined;
  const [at, id] = cursor.split("~");
  return { at: at!, id: id! };
}

export const captureListQuerySchema = z.object({
  // No control characters: PostgreSQL refuses a NUL in text, which answered 500.
  q: optional(z.string().trim().max(64).regex(/^[^\u0000-\u001f\u007f]*$/, "must not contain control characters")),
  state: optional(z.enum(captureState.enumValues)),
  overall: optional(z.enum(CAPTURE_VERDICT_FILTERS)),
  kind: optional(z.enum(TEST_KINDS)),
  sort: z.preprocess(blank, z.enum(CAPTURE_SORTS).default("captured")),
  dir: z.preprocess(blank, z.enum(["asc", "desc"]).default("desc")),
  page: z.preprocess(blank, z.coerce.number().int().min(1).max(10_000).default(1)),
  /** Newest-first or oldest-first lists page by the last (or first) row's place instead of an offset. */
  after: optional(z.string().regex(CURSOR, "must be a place in the list, as a previous page gave it")),
  before: optional(z.string().regex(CURSOR, "must be a place in the list, as a previous page gave it")),
});

export type CaptureListQuery = z.infer<typeof captureListQuerySchema>;
