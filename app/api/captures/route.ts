import { errorResponse } from "@/lib/auth/guards";
import { captureRegistrationSchema } from "@/lib/captures/input-schemas";
import { requireSessionActor } from "@/lib/dal/actor";
import { registerCapture } from "@/lib/dal/capture-intake";
import { getRecentCaptures } from "@/lib/dal/captures";
import { readJson } from "@/lib/dal/request";

/** Registers a capture from the upload form; answers with presigned upload URL(s). */
export async function POST(request: Request) {
  try {
    const actor = await requireSessionActor();
    const input = await readJson(request, captureRegistrationSchema);
    const result = await registerCapture(actor, input);
    return Response.json(result, { status: result.duplicate ? 200 : 201 });
  } catch (err) {
    return errorResponse(err);
  }
}

export async function GET() {
  try {
    const actor = await requireSessionActor();
    return Response.json({ captures: await getRecentCaptures(actor) });
  } catch (err) {
    return errorResponse(err);
  }
}
