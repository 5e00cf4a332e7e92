import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRole } from "@/lib/auth/guards";
import { getOutboxView } from "@/lib/dal/outbox";
import { getUndeliveredMailView } from "@/lib/dal/notification-prefs";
import { outboxEnabled } from "@/lib/server/outbox";

export const metadata = { title: "Outbox" };

export default async function MailboxPage() {
  await requireRole("admin");
  const undelivered = await getUndeliveredMailView();
  const waiting = (
    <section className="mb-8 space-y-2" aria-labelledby="undelivered">
      <h2 id="undelivered" className="font-semibold">Waiting or failed</h2>
      {undelivered.length === 0 ? <p className="text-sm text-ink-700">Every mail was sent.</p> : (
        <ul className="space-y-2">
          {undelivered.map((m) => (
            <li key={m.id} className="rounded-lg bg-white px-4 py-3 text-sm shadow-sm ring-1 ring-ink-200" data-testid="undelivered-mail">
              <span className="font-semibold">{m.status === "failed" ? "Not sent" : "Waiting"}</span>: {m.subject} — to {m.toAddress}, queued {m.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC,
              {" "}{m.attempts === 1 ? "1 attempt" : `${m.attempts} attempts`}.{m.lastError ? ` ${m.lastError}` : ""}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
  if (!outboxEnabled()) {
    return <>{waiting}<EmptyState title="No local outbox">MAIL_DIR is not set: mail goes to the configured SMTP server only.</EmptyState></>;
  }
  const mails = await getOutboxView();
  return (
    <>
      {waiting}
      <PageHeader title="Outbox" lead="Messages the app sent, as the local mail catcher stored them. For development and the demo only." />
      {mails.length === 0 ? <EmptyState title="Nothing sent yet">Invite someone or ask for a password reset to see a message here.</EmptyState> : (
        <ul className="space-y-3">
          {mails.map((m) => (
            <li key={m.id}>
              <details className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
                <summary className="cursor-pointer">
                  <span className="font-semibold">{m.subject}</span>
                  <span className="ml-2 text-sm text-ink-600">to {m.to.join(", ")} · {m.receivedAt.replace("T", " ").slice(0, 19)} UTC</span>
                </summary>
                <pre className="mt-3 whitespace-pre-wrap break-words text-sm">{m.text}</pre>
              </details>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
