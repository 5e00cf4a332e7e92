import { apiReportFile } from "@/lib/dal/client-api";
import { apiRoute } from "@/lib/dal/route-handler";

export const GET = apiRoute(async (request: Request, { params }: { params: Promise<{ number: string }> }) =>
  apiReportFile(request, (await params).number, "pdf"));
