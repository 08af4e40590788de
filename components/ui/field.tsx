import { forwardRef, useId } from "react";

export const inputClass =
  "block w-full min-h-11 rounded-md border border-rule-strong bg-sheet px-3 py-2 text-base text-ink placeholder:text-ink-faint focus:border-accent focus:outline-none";

/** A labelled input with its hint and error, wired for screen readers. */
export const Field = forwardRef<
  HTMLInputElement,
  React.InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string }
>(function Field({ label, hint, error, id, className = "", ...props }, ref) {
  const auto = useId();
  const inputId = id ?? auto;
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={inputId} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <input
        ref={ref}
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${inputId}-error` : hint ? `${inputId}-hint` : undefined}
        className={inputClass}
        {...props}
      />
      {hint && !error && (
        <p id={`${inputId}-hint`} className="text-sm text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${inputId}-error`} role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
});

export const Select = forwardRef<
  HTMLSelectElement,
  React.SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string }
>(function Select({ label, error, id, className = "", children, ...props }, ref) {
  const auto = useId();
  const selectId = id ?? auto;
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={selectId} className="block text-sm font-medium text-ink-soft">
        {label}
      </label>
      <select ref={ref} id={selectId} aria-invalid={error ? true : undefined} className={inputClass} {...props}>
        {children}
      </select>
      {error && (
        <p role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
    </div>
  );
});
