import { errorResponse, HttpError } from "@/lib/auth/guards";
import { captureCorrectionSchema } from "@/lib/captures/input-schemas";
import { requireSessionActor } from "@/lib/dal/actor";
import { correctCapture } from "@/lib/dal/capture-corrections";
import { getCaptureStatusView } from "@/lib/dal/captures";
import { readJson, requireUuid } from "@/lib/dal/request";

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

/** Corrects the capture's settings (roles, probe ratios, offsets, speed, test kind, plan step) with a reason, and analyses it again. */
export async function PATCH(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireSessionActor();
    const captureId = requireUuid((await params).id, "capture");
    return Response.json(await correctCapture(actor, captureId, await readJson(request, captureCorrectionSchema)), { status: 202 });
  } catch (err) {
    return errorResponse(err);
  }
}
