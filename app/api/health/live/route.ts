export const dynamic = "force-dynamic";

// Liveness: the process answers. Touches no service, so it stays cheap under any load.
export function GET() {
  return Response.json({ ok: true }, { headers: { "Cache-Control": "no-store" } });
}
