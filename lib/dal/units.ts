import "server-only";
import { z } from "zod";
import { countUnitsByOverall, listRatingsForRegistration, listUnits } from "@/db/queries/units";
import { requireUser } from "@/lib/auth/guards";
import { unitInScope } from "./request-reads";
import { scopeFor } from "./scope";

export const unitListQuerySchema = z.object({
  q: z.string().trim().max(64).regex(/^[^\u0000-\u001f\u007f]*$/, "must not contain control characters").optional(),
  overall: z.enum(["pass", "marginal", "inconclusive", "fail", "not-applicable", "untested"]).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
});

export type UnitListQuery = z.infer<typeof unitListQuerySchema>;
const PAGE_SIZE = 50;

export async function getUnitListView(query: UnitListQuery) {
  const user = await requireUser();
  const rows = await listUnits(scopeFor(user), {
    search: query.q || undefined, overall: query.overall, limit: PAGE_SIZE + 1, offset: (query.page - 1) * PAGE_SIZE,
  });
  return { rows: rows.slice(0, PAGE_SIZE), hasMore: rows.length > PAGE_SIZE, page: query.page, showOwner: user.role !== "manufacturer", canRegister: user.role === "admin" || user.role === "operator" };
}

export async function getUnitView(unitId: string) {
  const user = await requireUser();
  if (!z.uuid().safeParse(unitId).success) return null;
  const found = await unitInScope(scopeFor(user), unitId);
  return found ?? null;
}

export async function getHomeCounts() {
  const user = await requireUser();
  return countUnitsByOverall(scopeFor(user));
}

/** Ratings a unit may be moved to (lab managers and quality engineers editing a unit). */
export async function getUnitRatingChoices() {
  const user = await requireUser();
  if (user.role !== "admin" && user.role !== "qa") return [];
  const rows = await listRatingsForRegistration(scopeFor(user));
  return rows.map((r) => ({ id: r.id, label: `${r.modelCode} · ${r.title} (${r.owner})` }));
}
