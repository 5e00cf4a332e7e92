/** "::ffff:127.0.0.1" and "127.0.0.1" are one client. */
function normalise(address: string): string {
  const trimmed = address.trim();
  return trimmed.startsWith("::ffff:") ? trimmed.slice(7) : trimmed;
}

/**
 * The address of the client behind a request: the socket's, unless the socket is one of the
 * `trusted` proxies; then the right-most X-Forwarded-For hop that is not itself a trusted proxy (the
 * address the outermost trusted proxy saw). Hops a client adds on the left are never believed.
 */
export function clientAddressOf(socketAddress: string | undefined, forwardedFor: string | string[] | undefined, trusted: ReadonlySet<string>): string {
  const socket = normalise(socketAddress ?? "") || "unknown";
  if (!trusted.has(socket)) return socket;
  const header = Array.isArray(forwardedFor) ? forwardedFor.join(",") : forwardedFor ?? "";
  const hops = header.split(",").map(normalise).filter(Boolean);
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = hops[i] as string;
    if (!trusted.has(hop)) return hop;
  }
  return socket;
}

export function parseTrustedProxies(list: string | undefined): ReadonlySet<string> {
  return new Set((list ?? "").split(",").map(normalise).filter(Boolean));
}
