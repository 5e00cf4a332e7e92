import { z } from "zod";

// The portal's search, read from the URL (page and zip share it); a bad parameter is named.

const day = (what: string) => z.string().regex(/^\d{4}-\d{2}-\d{2}$/, `${what}: use a date like 2026-03-31.`)
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), `${what}: that is not a calendar date.`);

export const portalQuerySchema = z.object({
  serial: z.string().trim().max(80, "serial: at most 80 characters.").optional(),
  model: z.string().trim().max(80, "model: at most 80 characters.").optional(),
  from: day("from").optional(),
  to: day("to").optional(),
  page: z.coerce.number({ error: "page: use a whole number from 1." }).int("page: use a whole number from 1.").min(1, "page: use a whole number from 1.").max(1000, "page: at most 1000.").optional(),
});

export type PortalQuery = z.infer<typeof portalQuerySchema>;

/** From a URL's search parameters: empty values are absent. */
export function portalQueryFrom(params: URLSearchParams | Record<string, string | string[] | undefined>) {
  const get = (k: string) => {
    const v = params instanceof URLSearchParams ? params.get(k) : params[k];
    const s = Array.isArray(v) ? v[0] : v;
    return s === null || s === undefined || s.trim() === "" ? undefined : s;
  };
  return portalQuerySchema.safeParse({ serial: get("serial"), model: get("model"), from: get("from"), to: get("to"), page: get("page") });
}

/** The filter in dates: `to` includes its whole day. */
export function portalFilterDates(q: PortalQuery): { from?: Date; to?: Date } {
  return {
    from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined,
    to: q.to ? new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000) : undefined,
  };
}

export const zipSelectionSchema = z.object({
  ids: z.array(z.uuid("ids: each entry must be a report id.")).min(1, "ids: select at least one report.").max(500, "ids: too many reports in one request."),
});
