import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { SafetyCaution } from "@/components/shell/safety-caution";
import { InstrumentsDueSoon } from "@/components/instruments/due-soon";
import { EmptyState } from "@/components/ui/empty-state";
import { requireUser } from "@/lib/auth/guards";
import { requirePageActor } from "@/lib/dal/actor";
import { instrumentsDueSoon } from "@/lib/dal/instruments";
import { getHomeCounts } from "@/lib/dal/units";

const NEXT_STEP = {
  admin: { title: "Run the lab", text: "Register benches and their keys, invite people, and keep an eye on the review queue.", href: "/stations", cta: "Benches and keys" },
  operator: { title: "Capture a unit", text: "Export the oscilloscope record as CSV, then upload it with the unit's serial, test kind and shaft speed.", href: "/upload", cta: "New capture" },
  qa: { title: "Review what is outside tolerance", text: "Units with a check outside its band wait in the review queue for your disposition.", href: "/review", cta: "Open the review queue" },
  manufacturer: { title: "Your units' test records", text: "Open a unit to see its captures and verdicts, and download its test report.", href: "/units", cta: "Browse your units" },
} as const;

export default async function HomePage() {
  const user = await requireUser();
  const counts = await getHomeCounts();
  const dueSoon = user.role === "admin" ? await instrumentsDueSoon(await requirePageActor()) : [];
  const step = NEXT_STEP[user.role];
  const tiles = [
    { label: "Units", value: counts.total, href: "/units" },
    { label: "Within tolerance", value: counts.pass, href: "/units?overall=pass" },
    { label: "Near an edge", value: counts.marginal, href: "/units?overall=marginal" },
    { label: "Outside tolerance", value: counts.fail, href: "/units?overall=fail" },
    { label: "Not yet tested", value: counts.untested, href: "/units?overall=untested" },
  ];
  return (
    <>
      <PageHeader title={`Good to see you, ${user.name.split(" ")[0]}`} lead={`${user.organisationName}`} />
      <section aria-labelledby="next-step" className="mb-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
        <h2 id="next-step" className="font-semibold">{step.title}</h2>
        <p className="mt-1 text-sm text-ink-600">{step.text}</p>
        <Link href={step.href} className="mt-3 inline-block font-semibold">{step.cta} →</Link>
      </section>
      <InstrumentsDueSoon rows={dueSoon} />
      {counts.total === 0 ? (
        <EmptyState title="No units yet">
          {user.role === "manufacturer" ? "Your units appear here once the lab has tested them." : "Upload a first capture to register a unit."}
        </EmptyState>
      ) : (
        <ul className="mb-6 grid grid-cols-2 gap-3 md:grid-cols-5">
          {tiles.map((t) => (
            <li key={t.label}>
              <Link href={t.href} className="block rounded-lg bg-white p-4 text-ink-900 no-underline shadow-sm ring-1 ring-ink-200 hover:ring-copper-400">
                <span className="block text-2xl font-bold tabular-nums">{t.value}</span>
                <span className="text-xs text-ink-600">{t.label}</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      <SafetyCaution />
    </>
  );
}
