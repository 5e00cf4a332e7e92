import type { Instrument } from "@/db/schema";

// An instrument's calibration status on a given day (YYYY-MM-DD, UTC), as the register shows it.

export const DUE_SOON_DAYS = 30;
export const REMINDER_DAYS = 14;

export type CalibrationStatus = "in-date" | "due-soon" | "overdue" | "retired" | "no-due-date";

export const CALIBRATION_STATUS_LABELS: Record<CalibrationStatus, string> = {
  "in-date": "In date",
  "due-soon": `Due within ${DUE_SOON_DAYS} days`,
  overdue: "Overdue",
  retired: "Retired",
  "no-due-date": "No due date recorded",
};

/** YYYY-MM-DD of `day` plus `days` (UTC). */
export function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

export const utcDay = (at: Date): string => at.toISOString().slice(0, 10);

/**
 * Overdue once the due date has passed (the due date itself is still in date); due soon when the due
 * date is within the next DUE_SOON_DAYS days, today and the 30th day included.
 */
export function calibrationStatus(instrument: Pick<Instrument, "calibrationDue" | "retiredAt">, today: string): CalibrationStatus {
  if (instrument.retiredAt) return "retired";
  const due = instrument.calibrationDue;
  if (!due) return "no-due-date";
  if (due < today) return "overdue";
  if (due <= addDays(today, DUE_SOON_DAYS)) return "due-soon";
  return "in-date";
}

/** Whether a capture uploaded on `uploadedOn` was taken after the instrument's due date. */
export function wasOverdueOn(calibrationDue: string | null, uploadedOn: string): boolean {
  return calibrationDue !== null && calibrationDue < uploadedOn;
}
