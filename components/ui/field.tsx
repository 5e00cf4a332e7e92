import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from "react";

const INPUT = "mt-1 block w-full rounded-md border border-ink-200 bg-white px-3 py-2 text-sm shadow-sm focus:border-copper-600";

export function Field({ label, hint, error, children }: { label: string; hint?: string; error?: string; children: ReactNode }) {
  return (
    <label className="block text-sm">
      <span className="font-semibold text-ink-800">{label}</span>
      {children}
      {hint && !error ? <span className="mt-1 block text-xs text-ink-600">{hint}</span> : null}
      {error ? <span className="mt-1 block text-xs font-semibold text-outside-700">{error}</span> : null}
    </label>
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
