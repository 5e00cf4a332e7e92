import type { Role } from "@/db/schema";

export type NavItem = { href: string; label: string };

const ITEMS: Record<string, NavItem> = {
  home: { href: "/", label: "Overview" },
  units: { href: "/units", label: "Units" },
  captures: { href: "/captures", label: "Captures" },
  upload: { href: "/upload", label: "New capture" },
  review: { href: "/review", label: "Review queue" },
  trends: { href: "/trends", label: "Trends" },
  stations: { href: "/stations", label: "Benches" },
  ratings: { href: "/ratings", label: "Ratings" },
  clients: { href: "/admin/clients", label: "Clients" },
  instruments: { href: "/admin/instruments", label: "Instruments" },
  people: { href: "/admin/people", label: "People" },
  mailbox: { href: "/admin/mailbox", label: "Outbox" },
  lab: { href: "/admin/lab", label: "Lab settings" },
  portal: { href: "/portal", label: "Released reports" },
  tokens: { href: "/portal/tokens", label: "API tokens" },
};

const BY_ROLE: Record<Role, (keyof typeof ITEMS)[]> = {
  admin: ["home", "units", "captures", "upload", "review", "trends", "ratings", "stations", "instruments", "clients", "people", "mailbox", "lab"],
  operator: ["home", "upload", "captures", "units", "ratings", "stations"],
  qa: ["home", "review", "units", "captures", "trends", "ratings", "instruments"],
  manufacturer: ["home", "units", "portal", "tokens"],
};

export function navFor(role: Role): NavItem[] {
  return BY_ROLE[role].map((k) => ITEMS[k]).filter((i): i is NavItem => Boolean(i));
}
