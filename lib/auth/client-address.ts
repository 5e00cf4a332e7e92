/**
 * The client's address for the per-address limits: the first X-Forwarded-For entry. `next start` fills
 * that header from the socket only when the client did not send one, so without a proxy in front that
 * overwrites it a client can choose its address here (see docs: not yet bound to the socket).
 */
export function clientAddressFrom(headers: Headers | Record<string, unknown> | undefined): string {
  const raw = headers instanceof Headers ? headers.get("x-forwarded-for") : headers?.["x-forwarded-for"];
  const first = typeof raw === "string" ? raw.split(",")[0]?.trim() : undefined;
  return first || "unknown";
}
