import { PageHeader } from "@/components/shell/page-header";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { getPeopleView } from "@/lib/dal/people";
import { toggleUser } from "./actions";
import { InviteForm } from "./_components/invite-form";

export const metadata = { title: "People" };

export default async function PeoplePage() {
  const view = await getPeopleView();
  return (
    <>
      <PageHeader title="People" lead="Accounts of the lab and of its clients. An invitation mails a one-time link to choose a password." />
      <section className="mb-8 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200" aria-labelledby="invite">
        <h2 id="invite" className="mb-4 font-semibold">Invite someone</h2>
        <InviteForm organisations={view.organisations} />
      </section>
      <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
        <table className="min-w-full text-sm">
          <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
            <tr><th className="px-4 py-2">Name</th><th className="px-4 py-2">Email</th><th className="px-4 py-2">Role</th><th className="px-4 py-2">Organisation</th><th className="px-4 py-2">Access</th></tr>
          </thead>
          <tbody>
            {view.people.map((p) => (
              <tr key={p.id} className="border-t border-ink-100">
                <td className="px-4 py-2">{p.name}</td>
                <td className="px-4 py-2">{p.email}</td>
                <td className="px-4 py-2">{ROLE_LABELS[p.role]}</td>
                <td className="px-4 py-2">{p.organisation}</td>
                <td className="px-4 py-2">
                  {p.id === view.selfId ? "You" : (
                    <form action={toggleUser}>
                      <input type="hidden" name="userId" value={p.id} />
                      <input type="hidden" name="disable" value={p.disabledAt ? "false" : "true"} />
                      <button className="text-sm font-semibold text-copper-700 underline">{p.disabledAt ? "Restore access" : "Withdraw access"}</button>
                    </form>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
