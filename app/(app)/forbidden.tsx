import Link from "next/link";

/** A page this role may not open: shown inside the app shell, with a 403 status. */
export default function Forbidden() {
  return (
    <div className="mx-auto max-w-lg py-16 text-center">
      <p className="text-sm font-semibold text-outside-700">403</p>
      <h1 className="mt-2 text-2xl font-bold">Not open to your role</h1>
      <p className="mt-2 text-ink-600">Your account cannot open this page. Ask your lab manager if you need it.</p>
      <Link href="/" className="mt-6 inline-block font-semibold">Back to the overview</Link>
    </div>
  );
}
