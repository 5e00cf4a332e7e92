import { downloadPortalFile } from "@/lib/dal/portal";
import { requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

export const GET = apiRoute(async (_request: Request, { params }: { params: Promise<{ id: string }> }) =>
  downloadPortalFile(requireUuid((await params).id, "report"), "csv"));
