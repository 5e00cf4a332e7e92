import { errorResponse } from "@/lib/auth/guards";
import { presignPartsSchema } from "@/lib/captures/input-schemas";
import { requireSessionActor } from "@/lib/dal/actor";
import { presignCaptureParts } from "@/lib/dal/capture-intake";
import { readJson, requireUuid } from "@/lib/dal/request";

/** Fresh URLs for parts of a multipart upload whose first URLs expired. */
export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireSessionActor();
    const id = requireUuid((await params).id, "capture");
    const input = await readJson(request, presignPartsSchema);
    return Response.json({ parts: await presignCaptureParts(actor, id, input.partNumbers) });
  } catch (err) {
    return errorResponse(err);
  }
}
