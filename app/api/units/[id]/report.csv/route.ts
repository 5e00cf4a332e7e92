import { HttpError } from "@/lib/auth/guards";
import { releasedUnitCsv } from "@/lib/dal/portal";
import { requireUuid } from "@/lib/dal/request";
import { getUnitRecord } from "@/lib/dal/unit-report";
import { renderUnitCsv } from "@/lib/server/reports/unit-csv";
import { apiRoute } from "@/lib/dal/route-handler";

export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const id = (await params).id;
  // A released unit's CSV follows its valid report (the same rows as the PDF the client has).
  const released = await releasedUnitCsv(requireUuid(id, "unit"));
  if (released) return released;
  const record = await getUnitRecord(id);
  if (!record) throw new HttpError(404, "No such unit.");
  return new Response(renderUnitCsv(record), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="emfolio-${record.serial.replace(/[^\w.-]/g, "_")}.csv"`,
      "cache-control": "private, no-store",
    },
  });
});
