import { Button } from "@/components/ui/button";
import type { ResolvedPrefs } from "@/lib/mail/preferences";
import { saveNotificationPrefsAction } from "../prefs-actions";

const ALERTS = [
  { value: "hourly", label: "A mail when a capture ends outside tolerance or inconclusive (at most one per unit per hour)" },
  { value: "daily-digest", label: "One digest a day of such captures" },
  { value: "off", label: "No capture alerts" },
] as const;

export function NotificationPrefsForm({ prefs, role }: { prefs: ResolvedPrefs; role: string }) {
  return (
    <form action={saveNotificationPrefsAction} className="space-y-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200" aria-labelledby="mail-prefs">
      <h2 id="mail-prefs" className="font-semibold">Mail you receive</h2>
      {role !== "manufacturer" ? (
        <fieldset className="space-y-1 text-sm">
          <legend className="font-semibold text-ink-800">Capture alerts</legend>
          {ALERTS.map((a) => (
            <label key={a.value} className="flex items-center gap-2"><input type="radio" name="captureAlerts" value={a.value} defaultChecked={prefs.captureAlerts === a.value} />{a.label}</label>
          ))}
        </fieldset>
      ) : <input type="hidden" name="captureAlerts" value="off" />}
      <label className="flex items-center gap-2 text-sm"><input type="checkbox" name="reportNews" defaultChecked={prefs.reportNews} />Reports released, superseded or withdrawn</label>
      {role !== "manufacturer" ? <label className="flex items-center gap-2 text-sm"><input type="checkbox" name="instrumentsDue" defaultChecked={prefs.instrumentsDue} />Instruments coming due for calibration</label> : null}
      <p className="text-xs text-ink-600">Invitations and password links are always sent.</p>
      <Button type="submit">Save mail choices</Button>
    </form>
  );
}
