import { requireSessionActor } from "@/lib/dal/actor";
import { getCaptureDownloadUrl } from "@/lib/dal/captures";
import { requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** Authorised download of the raw file: a redirect to a signed link valid for a few minutes. */
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const url = await getCaptureDownloadUrl(actor, requireUuid((await params).id, "capture"));
  return new Response(null, { status: 303, headers: { Location: url, "Cache-Control": "no-store" } });
});
