import { z } from "zod";
import { getPlanView } from "@/lib/dal/rating-plans";
import { ratingJson, requireLabRating, updateRating } from "@/lib/dal/ratings";
import { readJson } from "@/lib/dal/request";
import { requireApiActor, setupErrorResponse } from "@/lib/dal/setup-access";

type Params = { params: Promise<{ id: string }> };
const noStore = { "Cache-Control": "no-store" };

/** A rating of the lab with its nameplate (labelled rows too) and its active plan. */
export async function GET(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    const { id } = await params;
    const { row } = await requireLabRating(actor, id);
    return Response.json({ rating: ratingJson(row), plan: await getPlanView(actor, id) }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}

/** Changes model code, title or nameplate (the nameplate is replaced whole). */
export async function PATCH(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    const rating = await updateRating(actor, (await params).id, await readJson(request, z.unknown()));
    return Response.json({ rating }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}
