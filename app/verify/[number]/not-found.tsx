import { VerifyFrame } from "./_components/verify-frame";

// The same answer for every number that was never released (or is malformed): nothing about why.
export default function UnknownReportNumber() {
  return (
    <VerifyFrame>
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="text-lg font-semibold">No released report has this number</h1>
        <p className="mt-2 text-sm text-ink-600">Check the number printed at the top of every page of the report, or scan its QR code again.</p>
      </div>
    </VerifyFrame>
  );
}
