import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { Notice } from "@/components/ui/notice";
import { SafetyCaution } from "@/components/shell/safety-caution";
import { getSessionUser } from "@/lib/auth/guards";
import { safeRedirectPath } from "@/lib/auth/redirect-target";
import { getEnv } from "@/lib/server/env";
import { SignInForm } from "./_components/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { next, callbackUrl, password } = await searchParams;
  // Parsed against the app's own origin: anything else (another host, "/\host", "javascript:") goes home.
  const target = safeRedirectPath(next ?? callbackUrl, getEnv().NEXTAUTH_URL);
  if (await getSessionUser()) redirect(target);
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <div>
        <p className="text-3xl font-bold tracking-tight text-ink-900">
          Em<span className="text-copper-600">folio</span>
        </p>
        <p className="mt-1 text-sm text-ink-600">Waveform records for alternator and PM-machine test benches.</p>
      </div>
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="mb-4 text-lg font-semibold">Sign in</h1>
        {password === "set" ? <div className="mb-4"><Notice kind="done">Password saved. Sign in with it now.</Notice></div> : null}
        <SignInForm target={target} />
        <p className="mt-4 text-sm"><Link href="/forgot-password">Forgot your password?</Link></p>
      </div>
      <SafetyCaution compact />
    </main>
  );
}
