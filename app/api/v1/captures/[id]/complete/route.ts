import { errorResponse } from "@/lib/auth/guards";
import { completeUploadSchema } from "@/lib/captures/input-schemas";
import { requireStationActor } from "@/lib/dal/actor";
import { completeCaptureUpload } from "@/lib/dal/capture-intake";
import { readJson, requireUuid } from "@/lib/dal/request";

export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireStationActor(request);
    const id = requireUuid((await params).id, "capture");
    const input = await readJson(request, completeUploadSchema);
    return Response.json(await completeCaptureUpload(actor, id, input), { status: 202 });
  } catch (err) {
    return errorResponse(err);
  }
}
