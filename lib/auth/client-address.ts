/**
 * The client's address for the per-address limits: X-Forwarded-For as the app's server
 * (scripts/serve.ts) rewrote it from the socket, or from a trusted proxy's report (TRUSTED_PROXIES).
 * A value a client sends itself does not survive that server.
 */
export function clientAddressFrom(headers: Headers | Record<string, unknown> | undefined): string {
  const raw = headers instanceof Headers ? headers.get("x-forwarded-for") : headers?.["x-forwarded-for"];
  const first = typeof raw === "string" ? raw.split(",")[0]?.trim() : undefined;
  return first || "unknown";
}
