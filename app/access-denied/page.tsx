import Link from "next/link";

export const metadata = { title: "Access denied" };

export default function AccessDeniedPage() {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-semibold text-outside-700">403</p>
      <h1 className="mt-2 text-2xl font-bold">Not open to your role</h1>
      <p className="mt-2 text-ink-600">Your account cannot open this page. Ask your lab manager if you need it.</p>
      <Link href="/" className="mt-6 inline-block font-semibold">Back to the overview</Link>
    </main>
  );
}
