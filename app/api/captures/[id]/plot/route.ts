import { HttpError } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { getCapturePlotView } from "@/lib/dal/captures";
import { requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** The waveform envelope and harmonic spectrum of the current analysis. */
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const plot = await getCapturePlotView(actor, requireUuid((await params).id, "capture"));
  if (!plot) throw new HttpError(404, "No analysis to plot for this capture yet");
  return Response.json(plot, { headers: { "Cache-Control": "no-store" } });
});
