import Link from "next/link";
import { RatingForm } from "@/components/ratings/rating-form";
import { PageHeader } from "@/components/shell/page-header";
import { Notice } from "@/components/ui/notice";
import { requireRoleActor } from "@/lib/dal/actor";
import { listClientChoices, PRESET_CHOICES } from "@/lib/dal/ratings";
import { createRatingAction } from "../actions";

export const metadata = { title: "New rating" };

export default async function NewRatingPage() {
  const actor = await requireRoleActor("admin", "qa");
  const clients = await listClientChoices(actor);
  return (
    <>
      <PageHeader title="New rating" lead="A machine model of one of your clients. Its tolerance profile starts from the preset you choose (version 1)." />
      {clients.length === 0 ? (
        <Notice kind="caution" title="No active client yet">{actor.role === "admin" ? <Link href="/admin/clients" className="underline">Add a client first.</Link> : "Ask a lab manager to add the client first."}</Notice>
      ) : (
        <RatingForm action={createRatingAction} clients={clients.map((c) => ({ id: c.id, label: c.name }))} presets={PRESET_CHOICES} />
      )}
    </>
  );
}
