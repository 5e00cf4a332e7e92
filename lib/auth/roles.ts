import type { Role } from "@/db/schema";

export const ROLES = ["admin", "operator", "qa", "manufacturer"] as const satisfies readonly Role[];
export const LAB_ROLES = ["admin", "operator", "qa"] as const satisfies readonly Role[];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Lab manager",
  operator: "Bench operator",
  qa: "Quality engineer",
  manufacturer: "Client",
};

export function isLabRole(role: Role): boolean {
  return (LAB_ROLES as readonly Role[]).includes(role);
}

/** Pages open without signing in: the sign-in flow and the public verification of released reports. */
const PUBLIC_PAGES = /^\/(sign-in|forgot-password|set-password|access-denied|verify)(\/|$)/;

export function isPublicPage(pathname: string): boolean {
  return PUBLIC_PAGES.test(pathname);
}

/** Path prefixes and the roles that may open them; checked in proxy.ts and again by every guard. */
export const PATH_RULES: ReadonlyArray<{ prefix: string; roles: readonly Role[] }> = [
  // The instrument register: lab managers keep it, quality engineers read it (checked before "/admin").
  { prefix: "/admin/instruments", roles: ["admin", "qa"] },
  { prefix: "/admin", roles: ["admin"] },
  { prefix: "/upload", roles: ["admin", "operator"] },
  { prefix: "/review", roles: ["admin", "qa"] },
  { prefix: "/trends", roles: ["admin", "qa"] },
  { prefix: "/stations", roles: ["admin", "operator", "qa"] },
  { prefix: "/ratings", roles: ["admin", "operator", "qa"] },
  { prefix: "/units", roles: ROLES },
  { prefix: "/captures", roles: ROLES },
  { prefix: "/reports", roles: ROLES },
  { prefix: "/portal", roles: ["manufacturer"] },
];

export function rolesForPath(pathname: string): readonly Role[] | null {
  const rule = PATH_RULES.find((r) => pathname === r.prefix || pathname.startsWith(`${r.prefix}/`));
  return rule ? rule.roles : null;
}
