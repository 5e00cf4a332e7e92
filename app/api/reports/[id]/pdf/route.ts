import { requireSessionActor } from "@/lib/dal/actor";
import { readReleasedReport } from "@/lib/dal/report-files";
import { apiRoute } from "@/lib/dal/route-handler";

// A released revision's PDF: the bytes stored at release, checked against the recorded sha256.
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const { bytes, fileName } = await readReleasedReport(actor, (await params).id);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${fileName}"`,
      "content-length": String(bytes.byteLength),
      "cache-control": "private, no-store",
    },
  });
});
