import { PageHeader } from "@/components/shell/page-header";
import { requireRoleActor } from "@/lib/dal/actor";
import { getLabSettingsView } from "@/lib/dal/lab-settings";
import { LabSettingsForm } from "./_components/lab-settings-form";

export const metadata = { title: "Lab settings" };

export default async function LabSettingsPage() {
  const view = await getLabSettingsView(await requireRoleActor("admin"));
  return (
    <>
      <PageHeader title="Lab settings" lead="How released test reports are numbered, and the line printed under the lab's name on every report." />
      <div className="max-w-xl rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
        <p className="mb-4 text-sm">The next released report will be <strong className="font-mono" data-testid="next-report-number">{view.nextNumber}</strong>.</p>
        <LabSettingsForm initial={{ reportPrefix: view.reportPrefix, nextReportNumber: String(view.nextReportNumber), reportFooter: view.reportFooter }} />
      </div>
    </>
  );
}
