import { HttpError, requireApiUser } from "@/lib/auth/guards";
import { getUnitView } from "@/lib/dal/units";
import { apiRoute } from "@/lib/dal/route-handler";

// The same DAL read the unit page uses; another organisation's unit answers 404 like a missing one.
export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) => {
  await requireApiUser();
  const view = await getUnitView((await params).id);
  if (!view) throw new HttpError(404, "No such unit.");
  const { unit, rating, owner } = view;
  return Response.json({
    id: unit.id, serial: unit.serial, owner, disposition: unit.disposition, latestOverall: unit.latestOverall,
    rating: { modelCode: rating.modelCode, title: rating.title, nameplate: rating.nameplate },
  });
});
