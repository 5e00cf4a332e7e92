import { describe, expect, it } from "vitest";
import { getPathMatch } from "next/dist/shared/lib/router/utils/path-match";
import { siteHeaderRules } from "@/lib/server/site-headers.mjs";

// The next.config header rules as Next matches them (its own path matcher): every path gets the
// security headers; the frame policy skips the downloads that send their own sandbox policy.

const headersFor = (path: string) => Object.fromEntries(siteHeaderRules()
  .filter((rule) => getPathMatch(rule.source, { strict: true, removeUnnamedParams: true })(path) !== false)
  .flatMap((rule) => rule.headers.map((h) => [h.key, h.value])));

describe("siteHeaderRules", () => {
  it("gives pages and APIs the frame policy and the security headers", () => {
    for (const path of ["/units/abc", "/api/health", "/api/instruments/abc", "/api/instruments/abc/certificates", "/portal/reports"]) {
      expect(headersFor(path)["Content-Security-Policy"], path).toBe("frame-ancestors 'none'");
      expect(headersFor(path)["X-Frame-Options"], path).toBe("DENY");
    }
  });

  it("leaves the policy of attachment and certificate downloads to their routes", () => {
    for (const path of ["/api/attachments/0b7e3f4a", "/api/instruments/0b7e3f4a/certificates/1c2d4e5f"]) {
      expect(headersFor(path)["Content-Security-Policy"], path).toBeUndefined();
      expect(headersFor(path)["X-Content-Type-Options"], path).toBe("nosniff");
    }
  });
});
