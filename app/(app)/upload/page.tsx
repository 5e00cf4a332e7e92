import { UploadForm } from "@/components/captures/upload-form";
import { PageHeader } from "@/components/shell/page-header";
import { SafetyCaution } from "@/components/shell/safety-caution";
import { requireRole } from "@/lib/auth/guards";
import { getUploadFormOptions } from "@/lib/dal/upload-form";

export const metadata = { title: "New capture" };

export default async function UploadPage() {
  await requireRole("admin", "operator");
  const options = await getUploadFormOptions();
  return (
    <>
      <PageHeader
        title="New capture"
        lead="Upload oscilloscope or DAQ CSV exports. Files go straight to storage; the analysis runs in the background and this page follows it."
      />
      <div className="mb-6"><SafetyCaution /></div>
      <UploadForm options={options} />
    </>
  );
}
