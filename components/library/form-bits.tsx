"use client";

import { forwardRef, useId } from "react";
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/sheet";

// Form pieces the three library forms share.

/** Copies a 422's field messages onto the form; returns the message for anything else. */
export function applyServerError<T extends FieldValues>(e: unknown, setError: UseFormSetError<T>): string {
  if (e instanceof ApiError && e.status === 422 && e.fields) {
    for (const [k, message] of Object.entries(e.fields)) setError((k === "_" ? "root" : k) as Path<T>, { message });
    return "";
  }
  return e instanceof Error ? e.message : "Could not save. Try again.";
}

export const TextArea = forwardRef<HTMLTextAreaElement, React.TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string }>(
  function TextArea({ label, error, id, ...props }, ref) {
    const auto = useId();
    const areaId = id ?? auto;
    return (
      <div className="space-y-1">
        <label htmlFor={areaId} className="block text-sm font-medium text-ink-soft">
          {label}
        </label>
        <textarea
          ref={ref}
          id={areaId}
          rows={3}
          aria-invalid={error ? true : undefined}
          className="block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-base text-ink focus:border-accent focus:outline-none"
          {...props}
        />
        {error && (
          <p role="alert" className="text-sm text-danger">
            {error}
          </p>
        )}
      </div>
    );
  },
);

/** A checkbox with a 44 px touch target. */
export const CheckRow = forwardRef<HTMLInputElement, React.InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string }>(
  function CheckRow({ label, hint, ...props }, ref) {
    const id = useId();
    return (
      <div className="flex min-h-11 items-start gap-3">
        <input ref={ref} id={id} type="checkbox" className="mt-1 h-6 w-6 shrink-0 accent-accent" {...props} />
        <label htmlFor={id} className="cursor-pointer">
          <span className="block font-medium">{label}</span>
          {hint && <span className="block text-sm text-ink-soft">{hint}</span>}
        </label>
      </div>
    );
  },
);

/** Save, and for the owner on an existing item, Archive; plus the form-wide message. */
export function FormActions({
  saving,
  message,
  onArchive,
  archiving,
  what,
}: {
  saving: boolean;
  message: string;
  onArchive?: () => void;
  archiving?: boolean;
  what: string;
}) {
  return (
    <div className="space-y-3 border-t border-rule pt-4">
      {message && <Notice tone="danger">{message}</Notice>}
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" disabled={saving} className="flex-1 sm:flex-none">
          {saving ? "Saving…" : `Save ${what}`}
        </Button>
        {onArchive && (
          <Button
            variant="danger"
            disabled={archiving}
            onClick={() => {
              if (confirm(`Archive this ${what}? It leaves the lists; trials that used it keep it.`)) onArchive();
            }}
          >
            Archive
          </Button>
        )}
      </div>
    </div>
  );
}
