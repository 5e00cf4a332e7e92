import { HttpError } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { getCaptureStatusView } from "@/lib/dal/captures";
import { requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** State, progress and (once analysed) the report: what the capture page and the upload list poll. */
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const view = await getCaptureStatusView(actor, requireUuid((await params).id, "capture"));
  if (!view) throw new HttpError(404, "No such capture");
  return Response.json(view, { headers: { "Cache-Control": "no-store" } });
});
