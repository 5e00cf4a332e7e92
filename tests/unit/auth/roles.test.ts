import { describe, expect, it } from "vitest";
import { navFor } from "@/components/shell/nav-items";
import { isLabRole, rolesForPath } from "@/lib/auth/roles";

describe("rolesForPath(pathname)", () => {
  it("keeps lab pages away from client accounts", () => {
    for (const path of ["/upload", "/review", "/trends", "/stations", "/ratings", "/ratings/new", "/admin/people", "/admin/mailbox", "/admin/clients"]) {
      expect(rolesForPath(path), path).not.toContain("manufacturer");
    }
  });
  it("opens units and captures to every role", () => {
    expect(rolesForPath("/units/abc")).toEqual(["admin", "operator", "qa", "manufacturer"]);
    expect(rolesForPath("/captures/abc")).toContain("manufacturer");
  });
  it("opens ratings to lab staff and clients to lab managers only", () => {
    expect(rolesForPath("/ratings/abc")).toEqual(["admin", "operator", "qa"]);
    expect(rolesForPath("/admin/clients")).toEqual(["admin"]);
  });
  it("matches whole path segments only", () => {
    expect(rolesForPath("/administrator")).toBeNull();
    expect(rolesForPath("/admin")).toEqual(["admin"]);
  });
});

describe("navFor(role)", () => {
  it("offers every linked page only to roles the path rules allow", () => {
    for (const role of ["admin", "operator", "qa", "manufacturer"] as const) {
      for (const item of navFor(role)) {
        const allowed = rolesForPath(item.href);
        if (allowed) expect(allowed, `${role} → ${item.href}`).toContain(role);
      }
    }
  });
  it("links Ratings for lab managers, quality engineers and operators, Clients for lab managers", () => {
    for (const role of ["admin", "qa", "operator"] as const) expect(navFor(role).map((i) => i.label), role).toContain("Ratings");
    expect(navFor("admin").map((i) => i.href)).toContain("/admin/clients");
    for (const role of ["qa", "operator", "manufacturer"] as const) expect(navFor(role).map((i) => i.href), role).not.toContain("/admin/clients");
  });
  it("gives a client the overview, its units and its released reports", () => {
    expect(navFor("manufacturer").map((i) => i.href)).toEqual(["/", "/units", "/portal", "/portal/tokens"]);
    expect(rolesForPath("/portal")).toEqual(["manufacturer"]);
    expect(isLabRole("manufacturer")).toBe(false);
  });
});
