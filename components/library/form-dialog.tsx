"use client";

import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";

// A modal for the library forms: the whole screen on a phone, a centred sheet on a laptop.
// The native <dialog> gives focus trapping, Escape to close and a backdrop for free.

export function FormDialog({ title, open, onClose, children }: { title: string; open: boolean; onClose: () => void; children: React.ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="library-dialog-title"
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-0 h-dvh max-h-none w-full max-w-none bg-sheet p-0 text-ink backdrop:bg-ink/40 sm:m-auto sm:h-auto sm:max-h-[90dvh] sm:max-w-xl sm:rounded-lg sm:border sm:border-rule"
    >
      {open && (
        <div className="flex min-h-full flex-col">
          <div className="sticky top-0 z-10 flex items-center justify-between gap-3 border-b border-rule bg-sheet px-4 py-2">
            <h2 id="library-dialog-title" className="text-xl">
              {title}
            </h2>
            <Button variant="quiet" onClick={onClose} aria-label="Close">
              Close
            </Button>
          </div>
          <div className="flex-1 px-4 py-4">{children}</div>
        </div>
      )}
    </dialog>
  );
}
