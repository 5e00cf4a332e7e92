import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { getClientTokensView } from "@/lib/dal/client-tokens";
import { TokenForm } from "../_components/token-form";
import { revokeTokenAction } from "./actions";

export const metadata = { title: "API tokens" };

export default async function TokensPage() {
  const view = await getClientTokensView();
  if (!view.isAdmin) return <EmptyState title="Only your administrator manages API tokens">Ask the lab to make one of your colleagues your organisation&apos;s administrator.</EmptyState>;
  return (
    <div className="space-y-6">
      <PageHeader title="API tokens" lead="Personal tokens let your systems fetch your released reports and their status (GET /api/v1/reports?serial=…). Only a hash is kept: a token is shown once." />
      <section className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200"><TokenForm /></section>
      <ul className="space-y-2">
        {view.tokens.map((t) => {
          const state = t.revokedAt ? `revoked ${t.revokedAt.toISOString().slice(0, 10)}` : t.expired ? `expired ${t.expiresAt.toISOString().slice(0, 10)}` : `valid until ${t.expiresAt.toISOString().slice(0, 10)}`;
          return (
            <li key={t.id} className="flex items-center justify-between rounded-lg bg-white px-4 py-3 text-sm shadow-sm ring-1 ring-ink-200">
              <span><span className="font-semibold">{t.label}</span> · ect_{t.prefix}… · {t.userName} · {state}{t.lastUsedAt ? ` · last used ${t.lastUsedAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : ""}</span>
              {!t.revokedAt ? (
                <form action={revokeTokenAction}><input type="hidden" name="tokenId" value={t.id} /><button className="text-sm font-semibold text-copper-700 underline">Revoke</button></form>
              ) : null}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
