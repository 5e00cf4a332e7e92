import { PageHeader } from "@/components/shell/page-header";
import { getUploadFormOptions } from "@/lib/dal/upload-form";
import { NewUnitForm } from "./new-unit-form";

export const metadata = { title: "New unit" };

export default async function NewUnitPage() {
  const options = await getUploadFormOptions();
  return (
    <>
      <PageHeader title="Register a unit" lead="A unit is one serial of a rating; its captures are judged against that rating's tolerance profile and test plan." />
      <NewUnitForm ratings={options.ratings} />
    </>
  );
}
