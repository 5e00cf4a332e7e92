import { siteHeaderRules } from "./lib/server/site-headers.mjs";

/** @type {import('next').NextConfig} */
const nextConfig = {
  poweredByHeader: false,
  // The test suite builds into its own folder so it never disturbs a running demo.
  distDir: process.env.EMFOLIO_DIST_DIR || ".next",
  serverExternalPackages: ["pdfkit", "bullmq", "ioredis", "pg", "smtp-server", "mailparser"],
  typedRoutes: false,
  // Type-checking runs once in `npm test` (tsc --noEmit); the build does not repeat it.
  typescript: { ignoreBuildErrors: true },
  // The site's security headers (lib/server/site-headers.mjs; the health probes send the same).
  async headers() {
    return siteHeaderRules();
  },
  experimental: {
    // forbidden(): a page refused to a role answers 403 with the app's menu.
    authInterrupts: true,
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
