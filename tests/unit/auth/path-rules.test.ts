import { describe, expect, it } from "vitest";
import { PATH_RULES, ROLES, isPublicPage, rolesForPath } from "@/lib/auth/roles";
import { hasValidEscapes, originAllowed } from "@/lib/auth/request-checks";

// The agreed access table, written out by hand (not derived from PATH_RULES): adding or removing a
// role anywhere in the rules fails one cell. A = lab manager, O = operator, Q = quality engineer, C = client.
const TABLE: Record<string, string> = {
  "/admin/people": "A",
  "/admin/mailbox": "A",
  "/admin/lab": "A",
  "/upload": "AO",
  "/review": "AQ",
  "/trends": "AQ",
  "/stations": "AOQ",
  "/ratings": "AOQ",
  "/ratings/0b6c0c3e-3a39-4a43-9f5b-6a1a3b1e2f10": "AOQ",
  "/admin/clients": "A",
  "/admin/instruments": "AQ",
  "/admin/instruments/0b6c0c3e-3a39-4a43-9f5b-6a1a3b1e2f10": "AQ",
  "/units": "AOQC",
  "/units/0b6c0c3e-3a39-4a43-9f5b-6a1a3b1e2f10": "AOQC",
  "/captures": "AOQC",
  "/captures/0b6c0c3e-3a39-4a43-9f5b-6a1a3b1e2f10": "AOQC",
  "/reports": "AOQC",
  "/portal": "C",
  "/portal/tokens": "C",
};
const LETTER = { admin: "A", operator: "O", qa: "Q", manufacturer: "C" } as const;

describe("rolesForPath(pathname) for every role", () => {
  const cells = Object.entries(TABLE).flatMap(([path, letters]) => ROLES.map((role) => ({ path, role, allowed: letters.includes(LETTER[role]) })));
  it.each(cells)("rolesForPath($path) lets $role in: $allowed", ({ path, role, allowed }) => {
    expect(rolesForPath(path)?.includes(role) ?? true).toBe(allowed);
  });

  it("rolesForPath covers every rule's prefix with a row of the table", () => {
    for (const rule of PATH_RULES) {
      expect(Object.keys(TABLE).some((p) => p === rule.prefix || p.startsWith(`${rule.prefix}/`)), rule.prefix).toBe(true);
    }
  });

  it("rolesForPath leaves the overview and unknown pages to the page guards (null)", () => {
    expect(rolesForPath("/")).toBeNull();
    expect(rolesForPath("/uploads")).toBeNull();
    expect(rolesForPath("/reviewer")).toBeNull();
  });
});

describe("isPublicPage(pathname)", () => {
  it.each([
    ["/sign-in", true], ["/forgot-password", true], ["/set-password/abc", true], ["/access-denied", true],
    ["/verify", true], ["/verify/HARROWGA-000001", true],
    ["/verifyx", false], ["/units", false], ["/reports", false], ["/admin/lab", false], ["/", false], ["/api/reports/x/pdf", false],
  ])("isPublicPage(%j) is %j", (path, open) => expect(isPublicPage(path)).toBe(open));

  it("isPublicPage opens no path that a rule restricts", () => {
    for (const rule of PATH_RULES) expect(isPublicPage(rule.prefix), rule.prefix).toBe(false);
  });
});

describe("hasValidEscapes(path)", () => {
  it.each([["/api/v1/units/%E0%A4%A", false], ["/units/%", false], ["/units/%zz", false], ["/units/%C3%A9", true], ["/units/KG45-260301", true]])(
    "hasValidEscapes(%j) is %j", (path, ok) => expect(hasValidEscapes(path)).toBe(ok));
});

describe("originAllowed(method, headers, appOrigin)", () => {
  const app = "http://127.0.0.1:3000";
  const h = (init: Record<string, string>) => new Headers(init);
  it("originAllowed refuses a POST from another origin or marked cross-site", () => {
    expect(originAllowed("POST", h({ origin: "https://evil.example" }), app)).toBe(false);
    expect(originAllowed("DELETE", h({ origin: "http://127.0.0.1:3001" }), app)).toBe(false);
    expect(originAllowed("POST", h({ origin: "null" }), app)).toBe(false);
    expect(originAllowed("POST", h({ "sec-fetch-site": "cross-site" }), app)).toBe(false);
  });
  it("originAllowed lets through the app's own origin, scripts without Origin, and reads", () => {
    expect(originAllowed("POST", h({ origin: app }), app)).toBe(true);
    expect(originAllowed("POST", h({}), app)).toBe(true);
    expect(originAllowed("GET", h({ origin: "https://evil.example" }), app)).toBe(true);
  });
});
