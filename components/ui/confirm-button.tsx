"use client";

import { useState } from "react";

type Props = {
  /** The button's words before asking ("Revoke", "Retire the unit"). */
  label: string;
  /** What will happen, as a question ("Revoke key bench-3? The bench PC using it is refused at once."). */
  question: string;
  /** The words of the button that does it ("Yes, revoke"). */
  confirmLabel: string;
  /** Words of the button that backs out. */
  cancelLabel?: string;
  className?: string;
  disabled?: boolean;
  /** Name and value sent with the form when confirmed (a form with several submit buttons). */
  name?: string;
  value?: string;
};

const DANGER = "rounded-md bg-outside-700 px-3 py-1.5 text-sm font-semibold text-white hover:opacity-90 disabled:bg-ink-400";
const QUIET = "rounded-md bg-white px-3 py-1.5 text-sm font-semibold text-ink-800 ring-1 ring-ink-200 hover:bg-ink-100";

/**
 * A destructive submit button that asks first: the first click shows the question with a confirm
 * and a cancel button; only the confirm button submits the surrounding form. The server action
 * still checks who may do it: asking is a courtesy, not a guard.
 */
export function ConfirmButton({ label, question, confirmLabel, cancelLabel = "Cancel", className = "text-sm font-semibold text-outside-700", disabled, name, value }: Props) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return <button type="button" className={className} disabled={disabled} onClick={() => setAsking(true)}>{label}</button>;
  }
  return (
    <span role="alertdialog" aria-label={question} className="inline-flex flex-wrap items-center gap-2 rounded-md bg-outside-100 px-3 py-2 text-sm text-outside-700 ring-1 ring-outside-700/40">
      <span className="font-semibold">{question}</span>
      <button type="submit" className={DANGER} disabled={disabled} name={name} value={value}>{confirmLabel}</button>
      <button type="button" className={QUIET} onClick={() => setAsking(false)} autoFocus>{cancelLabel}</button>
    </span>
  );
}
