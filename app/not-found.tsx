import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-semibold text-copper-700">404</p>
      <h1 className="mt-2 text-2xl font-bold">Nothing here</h1>
      <p className="mt-2 text-ink-600">This page does not exist, or it belongs to an organisation your account cannot see.</p>
      <Link href="/" className="mt-6 inline-block font-semibold">Back to the overview</Link>
    </main>
  );
}
