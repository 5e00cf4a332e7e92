import { presignPartsSchema } from "@/lib/captures/input-schemas";
import { requireSessionActor } from "@/lib/dal/actor";
import { presignCaptureParts } from "@/lib/dal/capture-intake";
import { readJson, requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** URLs for parts of a multipart upload, each bound to the part's length and the sha256 the client computed. */
export const POST = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const id = requireUuid((await params).id, "capture");
  const input = await readJson(request, presignPartsSchema);
  return Response.json({ parts: await presignCaptureParts(actor, id, input.parts) });
});
