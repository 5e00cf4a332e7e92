import { HttpError } from "@/lib/auth/guards";
import { captureCorrectionSchema } from "@/lib/captures/input-schemas";
import { requireStationActor } from "@/lib/dal/actor";
import { correctCapture } from "@/lib/dal/capture-corrections";
import { getCaptureStatusView } from "@/lib/dal/captures";
import { readJson, requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** State, progress and (once analysed) the report: what the capture page and the upload list poll. */
export const GET = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireStationActor(request);
  const view = await getCaptureStatusView(actor, requireUuid((await params).id, "capture"));
  if (!view) throw new HttpError(404, "No such capture");
  return Response.json(view, { headers: { "Cache-Control": "no-store" } });
});

/** Corrects the capture's settings with a reason; the capture is analysed again and the earlier result kept. */
export const PATCH = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireStationActor(request);
  const captureId = requireUuid((await params).id, "capture");
  return Response.json(await correctCapture(actor, captureId, await readJson(request, captureCorrectionSchema)), { status: 202 });
});
