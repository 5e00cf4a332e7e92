import { HttpError } from "@/lib/auth/guards";
import { getUnitRecord } from "@/lib/dal/unit-report";
import { renderUnitPdf } from "@/lib/server/reports/unit-pdf";
import { apiRoute } from "@/lib/dal/route-handler";

export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const record = await getUnitRecord((await params).id);
  if (!record) throw new HttpError(404, "No such unit.");
  const pdf = await renderUnitPdf(record);
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="emfolio-${record.serial.replace(/[^\w.-]/g, "_")}.pdf"`,
      "cache-control": "private, no-store",
    },
  });
});
