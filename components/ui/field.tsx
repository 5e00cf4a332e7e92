import { cloneElement, useId, type InputHTMLAttributes, type ReactElement, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";

const INPUT = "mt-1 block w-full rounded-md border border-ink-200 bg-white px-3 py-2 text-sm shadow-sm focus:border-copper-600";

type Control = ReactElement<{ id?: string; "aria-describedby"?: string; "aria-invalid"?: boolean }>;

/** A labelled control; the label names the control alone, the hint or error describes it. */
export function Field({ label, hint, error, children }: { label: string; hint?: string; error?: string; children: Control }) {
  const id = useId();
  const noteId = `${id}-note`;
  const note = error ?? hint;
  return (
    <div className="block text-sm">
      <label htmlFor={id} className="font-semibold text-ink-800">{label}</label>
      {cloneElement(children, { id, "aria-describedby": note ? noteId : undefined, "aria-invalid": error ? true : undefined })}
      {note ? (
        <span id={noteId} className={`mt-1 block text-xs ${error ? "font-semibold text-outside-700" : "text-ink-600"}`}>{note}</span>
      ) : null}
    </div>
  );
}

export function TextInput(props: InputHTMLAttributes<HTMLInputElement>) {
  return <input className={INPUT} {...props} />;
}

export function Select(props: SelectHTMLAttributes<HTMLSelectElement>) {
  return <select className={INPUT} {...props} />;
}

export function TextArea(props: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={INPUT} rows={3} {...props} />;
}
