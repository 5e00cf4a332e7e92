import Link from "next/link";
import type { InstrumentRow } from "@/lib/dal/instruments";

/** The lab manager's list of instruments due for calibration within 30 days (overdue ones first). */
export function InstrumentsDueSoon({ rows }: { rows: InstrumentRow[] }) {
  if (rows.length === 0) return null;
  return (
    <section aria-labelledby="due-soon" className="mb-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <h2 id="due-soon" className="font-semibold">Calibration due within 30 days</h2>
      <ul className="mt-2 space-y-1 text-sm">
        {rows.map((i) => (
          <li key={i.id}>
            <Link href={`/admin/instruments/${i.id}`} className="font-mono">{i.assetTag}</Link> · {i.make} {i.model} · due {i.calibrationDue}
            {i.status === "overdue" ? <strong className="ml-1 text-outside-700">▲ overdue</strong> : null}
          </li>
        ))}
      </ul>
    </section>
  );
}
