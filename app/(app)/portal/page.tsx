import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Field, TextInput } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { getPortalView } from "@/lib/dal/portal";
import { ZIP_MAX_REPORTS } from "@/lib/dal/portal-files";
import { portalQueryFrom } from "@/lib/reports/portal-query";
import { ReportRow } from "./_components/report-row";

export const metadata = { title: "Released reports" };

/** The same search on another page. */
function pageHref(query: Record<string, string | number | undefined>, page: number): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries({ ...query, page: page > 1 ? page : undefined })) if (v !== undefined && String(v) !== "") params.set(k, String(v));
  const s = params.toString();
  return s ? `/portal?${s}` : "/portal";
}

export default async function PortalPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const parsed = portalQueryFrom(await searchParams);
  const query = parsed.success ? parsed.data : {};
  const view = await getPortalView(query);
  return (
    <div className="space-y-6">
      <PageHeader title="Released reports" lead={`Test reports the lab released for ${view.organisationName}. Only a valid revision counts; superseded and withdrawn ones are kept for your records and marked as such.`} />
      {!parsed.success ? <Notice kind="problem">{parsed.error.issues.map((i) => i.message).join(" ")}</Notice> : null}
      <form method="get" className="grid gap-3 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200 sm:grid-cols-5" aria-label="Search reports">
        <Field label="Serial"><TextInput name="serial" defaultValue={query.serial ?? ""} maxLength={80} /></Field>
        <Field label="Model"><TextInput name="model" defaultValue={query.model ?? ""} maxLength={80} /></Field>
        <Field label="Released from"><TextInput name="from" type="date" defaultValue={query.from ?? ""} /></Field>
        <Field label="Released to"><TextInput name="to" type="date" defaultValue={query.to ?? ""} /></Field>
        <div className="flex items-end"><Button type="submit">Search</Button></div>
      </form>
      {view.reports.length === 0 ? <EmptyState title="No released reports match">Change the search, or wait for the lab to release a report: you get a mail when it does.</EmptyState> : (
        <form method="post" action="/api/portal/zip" className="space-y-3">
          <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
            <table className="min-w-full text-sm">
              <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
                <tr><th className="px-3 py-2"><span className="sr-only">Select</span></th><th className="px-3 py-2">Report</th><th className="px-3 py-2">Serial</th><th className="px-3 py-2">Model</th><th className="px-3 py-2">Released</th><th className="px-3 py-2">Status</th><th className="px-3 py-2">Files</th></tr>
              </thead>
              <tbody>{view.reports.map((r) => <ReportRow key={r.id} report={r} />)}</tbody>
            </table>
          </div>
          <div className="flex items-center gap-3">
            <Button type="submit" tone="quiet">Download the selection as a zip</Button>
            <span className="text-xs text-ink-600">At most {ZIP_MAX_REPORTS} reports per zip; each holds the PDF and the CSV of its results.</span>
          </div>
        </form>
      )}
      {view.page > 1 || view.hasMore ? (
        <nav aria-label="Pages" className="flex gap-4 text-sm">
          {view.page > 1 ? <Link href={pageHref(query, view.page - 1)}>← Newer reports</Link> : null}
          {view.hasMore ? <Link href={pageHref(query, view.page + 1)}>Older reports →</Link> : null}
        </nav>
      ) : null}
    </div>
  );
}
