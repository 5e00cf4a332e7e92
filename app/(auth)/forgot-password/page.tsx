import Link from "next/link";
import { ForgotForm } from "./forgot-form";

export const metadata = { title: "Reset password" };

export default function ForgotPasswordPage() {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="mb-2 text-lg font-semibold">Reset your password</h1>
        <p className="mb-4 text-sm text-ink-600">We mail a one-time link to the address of your account.</p>
        <ForgotForm />
      </div>
      <Link href="/sign-in" className="text-sm">← Back to sign-in</Link>
    </main>
  );
}
