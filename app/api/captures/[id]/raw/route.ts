import { errorResponse } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { getCaptureDownloadUrl } from "@/lib/dal/captures";
import { requireUuid } from "@/lib/dal/request";

/** Authorised download of the raw file: a redirect to a signed link valid for a few minutes. */
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireSessionActor();
    const url = await getCaptureDownloadUrl(actor, requireUuid((await params).id, "capture"));
    return new Response(null, { status: 303, headers: { Location: url, "Cache-Control": "no-store" } });
  } catch (err) {
    return errorResponse(err);
  }
}
