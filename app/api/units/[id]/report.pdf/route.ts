import { requireSessionActor } from "@/lib/dal/actor";
import { renderUnitDraft } from "@/lib/dal/report-files";
import { apiRoute } from "@/lib/dal/route-handler";

// The lab's draft of the unit's report (DRAFT on every page); clients get 404 and read released reports only.
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const { bytes, fileName } = await renderUnitDraft(actor, (await params).id);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${fileName}"`,
      "cache-control": "private, no-store",
    },
  });
});
