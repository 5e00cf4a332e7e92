/**
 * Where to send someone after signing in: a path of this app only. `raw` (a `next` or `callbackUrl`
 * parameter) is parsed against the app's own origin; anything that leaves it, or that browsers could
 * read as another host (backslashes, control characters such as tab, `//`, encoded slashes), gives "/".
 */
export function safeRedirectPath(raw: unknown, origin: string): string {
  if (typeof raw !== "string" || raw.length === 0 || raw.length > 2048) return "/";
  // Browsers drop tab/newline and read "\" as "/": "/\host" and "/\t/host" are other hosts to them.
  if (/[\u0000-\u001f\u007f\\]/.test(raw)) return "/";
  // A path, or an absolute URL (checked against the origin below); nothing relative like "evil.example".
  if (!raw.startsWith("/") && !/^[a-z][a-z0-9+.-]*:/i.test(raw)) return "/";
  let own: URL;
  let target: URL;
  try {
    own = new URL(origin);
    target = new URL(raw, own);
  } catch {
    return "/";
  }
  if (target.origin !== own.origin) return "/";
  // Only a path was accepted as typed; an absolute URL to this origin is reduced to its path.
  const path = `${target.pathname}${target.search}${target.hash}`;
  let decoded: string;
  try {
    decoded = decodeURIComponent(target.pathname);
  } catch {
    return "/";
  }
  if (!path.startsWith("/") || path.startsWith("//") || /^[/\\]{2}/.test(decoded) || decoded.includes("\\")) return "/";
  return path;
}
