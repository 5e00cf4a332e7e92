import { completeUploadSchema } from "@/lib/captures/input-schemas";
import { requireStationActor } from "@/lib/dal/actor";
import { completeCaptureUpload } from "@/lib/dal/capture-intake";
import { readJson, requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

export const POST = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireStationActor(request);
  const id = requireUuid((await params).id, "capture");
  const input = await readJson(request, completeUploadSchema);
  return Response.json(await completeCaptureUpload(actor, id, input), { status: 202 });
});
