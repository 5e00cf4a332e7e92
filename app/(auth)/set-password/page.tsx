import Link from "next/link";
import { Notice } from "@/components/ui/notice";
import { getPasswordLinkView } from "@/lib/dal/password-link";
import { SetPasswordForm } from "./_components/set-password-form";

export const metadata = { title: "Choose a password" };

export default async function SetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const found = await getPasswordLinkView(token);
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="mb-4 text-lg font-semibold">Choose a password</h1>
        {found && token ? (
          <>
            <p className="mb-4 text-sm text-ink-600">For {found.name} ({found.email}).</p>
            <SetPasswordForm token={token} />
          </>
        ) : (
          <Notice kind="problem" title="This link does not work">It has expired or was already used. <Link href="/forgot-password">Ask for a new one</Link>.</Notice>
        )}
      </div>
    </main>
  );
}
