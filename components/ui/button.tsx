import type { ButtonHTMLAttributes } from "react";

type Tone = "primary" | "quiet" | "danger";

const TONES: Record<Tone, string> = {
  primary: "bg-copper-600 text-white hover:bg-copper-700 disabled:bg-ink-400",
  quiet: "bg-white text-ink-800 ring-1 ring-ink-200 hover:bg-ink-100 disabled:text-ink-400",
  danger: "bg-outside-700 text-white hover:opacity-90 disabled:bg-ink-400",
};

export function Button({ tone = "primary", className = "", ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone }) {
  return (
    <button
      className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-semibold transition-colors disabled:cursor-not-allowed ${TONES[tone]} ${className}`}
      {...rest}
    />
  );
}
