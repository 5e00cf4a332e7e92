import { errorResponse, HttpError } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { getCaptureStatusView } from "@/lib/dal/captures";
import { requireUuid } from "@/lib/dal/request";

/** State, progress and (once analysed) the report: what the capture page and the upload list poll. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireSessionActor();
    const view = await getCaptureStatusView(actor, requireUuid((await params).id, "capture"));
    if (!view) throw new HttpError(404, "No such capture");
    return Response.json(view, { headers: { "Cache-Control": "no-store" } });
  } catch (err) {
    return errorResponse(err);
  }
}
