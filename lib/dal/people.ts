import "server-only";
import { listOrganisations, listUsersForAdmin } from "@/db/queries/users";
import { requireRole } from "@/lib/auth/guards";

export async function getPeopleView() {
  const admin = await requireRole("admin");
  const [people, orgs] = await Promise.all([listUsersForAdmin(admin.organisationId), listOrganisations()]);
  return {
    selfId: admin.id,
    people,
    organisations: orgs.filter((o) => o.kind === "manufacturer" || o.id === admin.organisationId).map((o) => ({ id: o.id, name: o.name, kind: o.kind })),
  };
}
