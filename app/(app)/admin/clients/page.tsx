import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRole } from "@/lib/auth/guards";
import { getClientsView } from "@/lib/dal/clients";
import { ClientForm } from "./_components/client-form";
import { setClientActiveAction } from "./actions";

export const metadata = { title: "Clients" };

type Row = Awaited<ReturnType<typeof getClientsView>>["active"][number];

function ClientRow({ client }: { client: Row }) {
  const active = !client.deactivatedAt;
  return (
    <li className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200" aria-label={client.name}>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="font-semibold">{client.name}{client.referenceCode ? <span className="ml-2 font-mono text-sm text-ink-600">{client.referenceCode}</span> : null}</p>
          <p className="text-sm text-ink-600">{client.contactEmail || "No contact e-mail"} · {client.address || "No address"}</p>
          <p className="text-sm text-ink-600">{client.ratings} rating{client.ratings === 1 ? "" : "s"} · {client.units} unit{client.units === 1 ? "" : "s"}{active ? "" : ` · deactivated ${client.deactivatedAt?.toISOString().slice(0, 10)}`}</p>
        </div>
        <form action={setClientActiveAction}>
          <input type="hidden" name="clientId" value={client.id} />
          <input type="hidden" name="active" value={active ? "false" : "true"} />
          <button type="submit" className={`text-sm font-semibold ${active ? "text-outside-700" : "text-copper-700"}`}>{active ? "Deactivate" : "Reactivate"}</button>
        </form>
      </div>
      <details className="mt-3">
        <summary className="cursor-pointer text-sm font-semibold text-copper-700">Edit</summary>
        <div className="mt-3"><ClientForm client={client} /></div>
      </details>
    </li>
  );
}

export default async function ClientsPage() {
  await requireRole("admin");
  const view = await getClientsView();
  return (
    <>
      <PageHeader title="Clients" lead="Organisations your lab tests machines for. A deactivated client keeps its ratings, units and reports but gets no new ratings." />
      {view.active.length === 0 ? <EmptyState title="No active clients" /> : <ul className="space-y-4">{view.active.map((c) => <ClientRow key={c.id} client={c} />)}</ul>}
      {view.inactive.length > 0 ? (
        <section className="mt-8">
          <h2 className="mb-3 text-lg font-semibold">Deactivated</h2>
          <ul className="space-y-4">{view.inactive.map((c) => <ClientRow key={c.id} client={c} />)}</ul>
        </section>
      ) : null}
      <section className="mt-8">
        <h2 className="mb-3 text-lg font-semibold">New client</h2>
        <ClientForm />
      </section>
    </>
  );
}
