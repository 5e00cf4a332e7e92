import { z } from "zod";
import { getPlanView, replacePlan } from "@/lib/dal/rating-plans";
import { readJson } from "@/lib/dal/request";
import { requireApiActor, setupErrorResponse } from "@/lib/dal/setup-access";

type Params = { params: Promise<{ id: string }> };
const noStore = { "Cache-Control": "no-store" };

/** The rating's active test plan in order. */
export async function GET(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    return Response.json({ steps: await getPlanView(actor, (await params).id) }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}

/** Replaces the plan with `{ steps }`: a step with an id is kept and updated, one without is added, one left out is retired. */
export async function PUT(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    return Response.json({ steps: await replacePlan(actor, (await params).id, await readJson(request, z.unknown())) }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}
