import { listOrganisations } from "@/db/queries/users";

/** The seeded demo organisations of the test database, by slug. */
export async function seededOrgs() {
  const orgs = await listOrganisations();
  const bySlug = (slug: string) => {
    const o = orgs.find((x) => x.slug === slug);
    if (!o) throw new Error(`the test database lacks the seeded organisation ${slug}: run the test command, which seeds it`);
    return o;
  };
  return { lab: bySlug("harrowgate-lab"), secondLab: bySlug("calderwick-lab"), kestrum: bySlug("kestrum"), poldane: bySlug("poldane") };
}
