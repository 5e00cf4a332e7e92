import type { Metadata } from "next";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import { Notice } from "@/components/ui/notice";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { verifyReportNumber } from "@/lib/dal/verification";
import { FileCheck } from "./_components/file-check";
import { VerifyFrame } from "./_components/verify-frame";

export const metadata: Metadata = { title: "Verify a test report", robots: { index: false } };
export const dynamic = "force-dynamic";

const STATUS_CLASS = { valid: "bg-within-100 text-ink-900", superseded: "bg-edge-100 text-ink-900", withdrawn: "bg-outside-100 text-ink-900" } as const;

// Public: anyone holding a report can check its number and file here without an account.
export default async function VerifyPage({ params }: { params: Promise<{ number: string }> }) {
  const { number } = await params;
  const view = await verifyReportNumber(number, clientAddressFrom(await headers()));
  if (view === "unknown") notFound();
  if (view === "limited") {
    return (
      <VerifyFrame>
        <Notice kind="problem" title="Too many look-ups">Too many report numbers were checked from your address in the last minute. Wait a minute and try again.</Notice>
      </VerifyFrame>
    );
  }
  const latest = view.revisions[view.revisions.length - 1];
  return (
    <VerifyFrame>
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="text-lg font-semibold">Report {view.number}</h1>
        <dl className="mt-4 grid grid-cols-2 gap-3 text-sm">
          <div><dt className="text-ink-600">Unit serial</dt><dd className="font-mono">{view.serial}</dd></div>
          <div><dt className="text-ink-600">Client</dt><dd>{view.client}</dd></div>
          <div><dt className="text-ink-600">Latest revision</dt><dd>{latest?.revision}</dd></div>
          <div><dt className="text-ink-600">Status of the latest revision</dt><dd data-testid="latest-status" className="font-semibold">{latest?.statusWords}</dd></div>
        </dl>
        <table className="mt-5 w-full text-left text-sm">
          <caption className="sr-only">Every revision of this report</caption>
          <thead className="text-ink-600"><tr><th className="py-1 pr-3">Revision</th><th className="py-1 pr-3">Issued</th><th className="py-1 pr-3">Status</th><th className="py-1">SHA-256 of the released file</th></tr></thead>
          <tbody>
            {view.revisions.map((r) => (
              <tr key={r.revision} className="border-t border-ink-100 align-top" data-testid={`revision-${r.revision}`}>
                <td className="py-2 pr-3">{r.revision}</td>
                <td className="py-2 pr-3">{r.issuedOn}</td>
                <td className="py-2 pr-3"><span className={`rounded px-2 py-0.5 font-semibold ${STATUS_CLASS[r.status]}`}>{r.statusWords}</span></td>
                <td className="break-all py-2 font-mono text-xs">{r.sha256}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <FileCheck number={view.number} revisions={view.revisions.map((r) => ({ revision: r.revision, statusWords: r.statusWords, sha256: r.sha256 }))} />
    </VerifyFrame>
  );
}
