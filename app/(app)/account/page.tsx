import { PageHeader } from "@/components/shell/page-header";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { getMyNotificationPrefs } from "@/lib/dal/notification-prefs";
import { getMySessionsView } from "@/lib/dal/sessions";
import { NotificationPrefsForm } from "./_components/notification-prefs-form";
import { endOtherSessionsAction, signOutEverywhereAction } from "./actions";

export const metadata = { title: "Your sessions" };

export default async function AccountPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { live } = await getMySessionsView();
  const params = await searchParams;
  const ended = Number(params.ended);
  const mail = await getMyNotificationPrefs();
  const prefsNote = typeof params.prefs === "string" ? params.prefs : undefined;
  return (
    <div className="space-y-6">
      <PageHeader title="Your sessions" />
      {Number.isInteger(ended) && ended >= 0 ? <Notice kind="done">{ended === 1 ? "1 other session ended." : `${ended} other sessions ended.`}</Notice> : null}
      <p className="text-ink-700" data-testid="live-sessions">
        {live === 1 ? "You are signed in on this browser only." : `You are signed in in ${live} places, this browser included.`}
        {" "}A session ends after 8 hours, at sign-out, or when your password changes.
      </p>
      <div className="flex flex-wrap gap-3">
        <form action={endOtherSessionsAction}><Button type="submit" tone="quiet">End my other sessions</Button></form>
        <form action={signOutEverywhereAction}><Button type="submit" tone="danger">Sign out everywhere</Button></form>
      </div>
      {prefsNote ? <Notice kind={prefsNote === "saved" ? "done" : "problem"}>{prefsNote === "saved" ? "Your mail choices are saved." : prefsNote.slice(0, 200)}</Notice> : null}
      <NotificationPrefsForm prefs={mail.prefs} role={mail.role} />
    </div>
  );
}
