import type { ReactNode } from "react";

// A labelled form field with its error beside it, announced to screen readers.
export function Field({
  id,
  label,
  hint,
  error,
  children,
}: {
  id: string;
  label: string;
  hint?: string;
  error?: string;
  children: ReactNode;
}) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block font-semibold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {children}
      {error ? (
        <p id={`${id}-error`} role="alert" className="flex items-start gap-1 text-sm font-semibold text-signal">
          <span aria-hidden="true">✕</span>
          {error}
        </p>
      ) : null}
    </div>
  );
}

export const inputClass =
  "block min-h-touch w-full rounded-lg border-2 border-reed-700 bg-white px-3 text-base text-ink aria-[invalid=true]:border-signal";
export const buttonClass =
  "inline-flex min-h-touch items-center justify-center rounded-lg bg-reed-700 px-5 font-semibold text-paper hover:bg-reed-800 disabled:opacity-60";
export const secondaryButtonClass =
  "inline-flex min-h-touch items-center justify-center rounded-lg border-2 border-reed-700 px-5 font-semibold text-reed-800 hover:bg-reed-50 disabled:opacity-60";
