import "server-only";
import { z } from "zod";
import { listRevisionsByNumber } from "@/db/queries/reports";
import { allowVerifyLookup } from "@/lib/server/reports/verify-limit";

// The public verification of a report number: what the page may show and nothing else (no ids, no
// lab-internal facts). Open without signing in, limited per client address.

export const reportNumberSchema = z.string().trim().min(1, "Give a report number").max(64, "A report number is at most 64 characters").regex(/^[A-Za-z0-9._-]+$/, "A report number has letters, digits, dots, dashes and underscores only");

export type VerifiedRevision = { revision: number; status: "valid" | "superseded" | "withdrawn"; statusWords: string; issuedOn: string; sha256: string };
export type VerifyView = { number: string; serial: string; client: string; revisions: VerifiedRevision[] };

export async function verifyReportNumber(raw: string, address: string): Promise<VerifyView | "unknown" | "limited"> {
  if (!allowVerifyLookup(address)) return "limited";
  const parsed = reportNumberSchema.safeParse(raw);
  // A malformed number runs the same query as a well-formed unknown one, so both answer alike.
  const rows = await listRevisionsByNumber(parsed.success ? parsed.data : "");
  const first = rows[0];
  if (!parsed.success || !first) return "unknown";
  const revisionOf = new Map(rows.map((r) => [r.id, r.revision]));
  return {
    number: first.number,
    serial: first.serial,
    client: first.client,
    revisions: rows.map((r) => ({
      revision: r.revision,
      status: r.status,
      statusWords: r.status === "valid" ? "valid"
        : r.status === "withdrawn" ? "withdrawn"
        : `superseded by revision ${r.supersededById ? revisionOf.get(r.supersededById) ?? "?" : "?"}`,
      issuedOn: r.releasedAt.toISOString().slice(0, 10),
      sha256: r.sha256,
    })),
  };
}
